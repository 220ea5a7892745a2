import { listPinsByProject } from "@/db/queries/pins";
import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseParams, parseWith } from "@/lib/http/parse";
import { pinFilterSchema } from "@/lib/realtime/events";

type Context = RouteContext<"/api/projects/[projectId]/pins">;

/** The project's pins (for the page load), filtered by ?state=, ?discipline= and ?authorId=. */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  const filter = parseWith(pinFilterSchema, Object.fromEntries(new URL(request.url).searchParams));
  return Response.json({ pins: await listPinsByProject({ projectId, filter }) });
});
