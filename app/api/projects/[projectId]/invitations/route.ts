import { createInvitation, joinLink, listPendingInvitations } from "@/db/queries/invitations";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseJson, parseParams } from "@/lib/http/parse";
import { inviteSchema } from "@/lib/team/schemas";

type Context = RouteContext<"/api/projects/[projectId]/invitations">;

/** Pending invitations (owners only). */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "team.manage");
  return Response.json({ invitations: await listPendingInvitations({ projectId }) });
});

/** Invites someone by e-mail with a role (owners only); answers with the join link. */
export const POST = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "team.manage");
  const input = await parseJson(request, inviteSchema);
  const { invitation, token } = await createInvitation({ projectId, email: input.email, role: input.role, invitedBy: user.id });
  return Response.json({ invitation, joinLink: joinLink(token) }, { status: 201 });
});
