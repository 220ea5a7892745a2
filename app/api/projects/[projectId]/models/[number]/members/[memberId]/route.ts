import { getMemberColumns } from "@/db/queries/result-columns";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { memberDetailParamsSchema } from "@/lib/models/columns-schemas";
import { presentMemberDetail } from "@/lib/models/member-detail";

/**
 * One member's full detail for the member panel (lib/models/member-detail.ts): its force and zero flag in every
 * result, envelope, governing results and review with the arithmetic, with the standing caution. Immutable like the
 * stored analysis it reads; the strong ETag names the run.
 */
export const GET = projectRoute({ params: memberDetailParamsSchema, action: "project.read" }, async ({ params, request }) => {
  const stored = await getMemberColumns(params);
  if (!stored || !stored.member) throw new NotFoundError("This revision has no analysed member by that id.");
  const etag = `"${stored.runId}.${Buffer.from(params.memberId).toString("base64url")}"`;
  const headers = { ETag: etag, "Cache-Control": "private, max-age=31536000, immutable", Vary: "Cookie" };
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  return Response.json(presentMemberDetail({ ...stored, member: stored.member }), { headers });
});
