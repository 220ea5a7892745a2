import { cancelInvitation } from "@/db/queries/invitations";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { invitationParamsSchema } from "@/lib/http/params";
import { parseParams } from "@/lib/http/parse";

type Context = RouteContext<"/api/projects/[projectId]/invitations/[invitationId]">;

/** Cancels a pending invitation (owners only); its join link stops working. Audited. */
export const DELETE = handleRoute(async (request: Request, context: Context) => {
  const { projectId, invitationId } = parseParams(invitationParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "team.manage");
  await cancelInvitation({ projectId, invitationId, actorId: user.id });
  return new Response(null, { status: 204 });
});
