import { getRevisionWithResults } from "@/db/queries/models";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";
import { revisionParamsSchema } from "@/lib/models/schemas";
import { authorize } from "@/lib/permissions";

/**
 * One revision with its model, analysis results and review, and whether the caller may start the whole-roof
 * any-load check. An analysed revision is immutable, so the browser may keep the (large) answer; it is private to
 * the signed-in user and revalidated by ETag after a day. One whose analysis is still queued or failed is never
 * cached (it changes when the job finishes); a stable one whose review still lacks "idle for any roof load" is
 * revalidated every time (its whole-roof job may store it).
 */
export const GET = projectRoute({ params: revisionParamsSchema, action: "project.read" }, async ({ params, request, membership }) => {
  const revision = await getRevisionWithResults(params);
  if (!revision) throw new NotFoundError("No such revision.");
  const abilities = { runAnalysis: authorize(membership, "analysis.run") };
  if (!revision.analysis) return Response.json({ revision, abilities }, { headers: { "Cache-Control": "no-store" } });
  const pending = revision.analysis.status === "ok" && !revision.analysis.review?.anyLoad;
  const job = revision.anyLoadJob;
  const etag = `"${revision.id}-${revision.analysis.id}${pending ? `-${job ? `${job.id}-${job.state}` : "none"}-${abilities.runAnalysis ? 1 : 0}` : ""}"`;
  const headers = { ETag: etag, "Cache-Control": pending ? "private, no-cache" : "private, max-age=86400", Vary: "Cookie" };
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  return Response.json({ revision, abilities }, { headers });
});
