import { listMembersByProject, updateMemberRole } from "@/db/queries/memberships";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseJson, parseParams } from "@/lib/http/parse";
import { changeRoleSchema } from "@/lib/team/schemas";

type Context = RouteContext<"/api/projects/[projectId]/members">;

/** The project's team with roles. */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  return Response.json({ members: await listMembersByProject({ projectId }) });
});

/** Changes one member's role (owners only); the change is audited. */
export const PATCH = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "team.manage");
  const input = await parseJson(request, changeRoleSchema);
  const member = await updateMemberRole({ projectId, userId: input.userId, role: input.role, actorId: user.id });
  return Response.json({ member });
});
