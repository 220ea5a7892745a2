import { getProjectForMember } from "@/db/queries/projects";
import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { NotFoundError, handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseParams } from "@/lib/http/parse";

/** One project, with the caller's role and abilities. */
export const GET = handleRoute(async (request: Request, context: RouteContext<"/api/projects/[projectId]">) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  const membership = await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  const project = await getProjectForMember({ projectId, role: membership.role });
  if (!project) throw new NotFoundError();
  return Response.json({ project });
});
