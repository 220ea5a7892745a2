import { getMemberColumns } from "@/db/queries/result-columns";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { memberDetailParamsSchema } from "@/lib/models/columns-schemas";
import { memberResultsFrom } from "@/lib/models/result-columns";
import { STANDING_CAUTION } from "@/lib/review/caution";

/**
 * One member's full detail for the member panel: its force and zero flag in every result, envelope, governing
 * results and its review (verdict, checks with their arithmetic), with the standing caution.
 */
export const GET = projectRoute({ params: memberDetailParamsSchema, action: "project.read" }, async ({ params }) => {
  const stored = await getMemberColumns(params);
  if (!stored || !stored.member) throw new NotFoundError("This revision has no analysed member by that id.");
  const etag = `"${stored.runId}.${Buffer.from(params.memberId).toString("base64url")}"`;
  return Response.json(
    {
      member: { ...stored.member, index: stored.index },
      results: memberResultsFrom(stored.index, stored.results),
      envelope: stored.envelope,
      envelopeOver: stored.envelopeOver,
      governing: stored.governing,
      review: stored.review,
      standard: stored.standard,
      caution: STANDING_CAUTION,
    },
    { headers: { ETag: etag, "Cache-Control": "private, max-age=31536000, immutable", Vary: "Cookie" } },
  );
});
