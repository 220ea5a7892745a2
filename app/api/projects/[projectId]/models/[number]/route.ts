import { getRevisionWithResults } from "@/db/queries/models";
import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute, NotFoundError } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/parse";
import { revisionParamsSchema } from "@/lib/models/schemas";

type Context = RouteContext<"/api/projects/[projectId]/models/[number]">;

/**
 * One revision with its model, analysis results and review. Revisions are immutable, so the browser may keep the
 * (large) answer; it is private to the signed-in user and revalidated by ETag after a day.
 */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId, number } = parseParams(revisionParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  const revision = await getRevisionWithResults({ projectId, number });
  if (!revision) throw new NotFoundError("No such revision.");
  const etag = `"${revision.id}-${revision.analysis?.id ?? "none"}"`;
  const headers = { ETag: etag, "Cache-Control": "private, max-age=86400", Vary: "Cookie" };
  if (request.headers.get("if-none-match") === etag) return new Response(null, { status: 304, headers });
  return Response.json({ revision }, { headers });
});
