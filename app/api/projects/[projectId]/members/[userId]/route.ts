import { removeMember } from "@/db/queries/memberships";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { memberParamsSchema } from "@/lib/http/params";
import { parseParams } from "@/lib/http/parse";

type Context = RouteContext<"/api/projects/[projectId]/members/[userId]">;

/** Removes a member from the team (owners only; never the last owner). Audited. */
export const DELETE = handleRoute(async (request: Request, context: Context) => {
  const { projectId, userId } = parseParams(memberParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "team.manage");
  await removeMember({ projectId, userId, actorId: user.id });
  return new Response(null, { status: 204 });
});
