import { getRevisionWithResults } from "@/db/queries/models";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { revisionParamsSchema } from "@/lib/models/schemas";

/**
 * One revision with its model, analysis results and review. An analysed revision is immutable, so the browser may
 * keep the (large) answer; it is private to the signed-in user and revalidated by ETag after a day. One whose
 * analysis is still queued or failed is never cached (it changes when the job finishes).
 */
export const GET = projectRoute({ params: revisionParamsSchema, action: "project.read" }, async ({ params, request }) => {
  const revision = await getRevisionWithResults(params);
  if (!revision) throw new NotFoundError("No such revision.");
  if (!revision.analysis) return Response.json({ revision }, { headers: { "Cache-Control": "no-store" } });
  const etag = `"${revision.id}-${revision.analysis.id}"`;
  const headers = { ETag: etag, "Cache-Control": "private, max-age=86400", Vary: "Cookie" };
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  return Response.json({ revision }, { headers });
});
