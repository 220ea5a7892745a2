import { listPendingInvitations } from "@/db/queries/invitations";
import { createInvitation } from "@/lib/commands/create-invitation";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { joinLink } from "@/lib/team/invitation-link";
import { inviteSchema } from "@/lib/team/schemas";

/** Pending invitations (owners only). */
export const GET = projectRoute({ params: projectParamsSchema, action: "team.manage" }, async ({ params }) =>
  Response.json({ invitations: await listPendingInvitations(params) }),
);

/** Invites someone by e-mail with a role (owners only); answers with the join link. */
export const POST = projectRoute({ params: projectParamsSchema, body: inviteSchema, action: "team.manage" }, async ({ params, body, user }) => {
  const { invitation, token } = await createInvitation({ projectId: params.projectId, email: body.email, role: body.role, invitedBy: user.id });
  return Response.json({ invitation, joinLink: joinLink(token) }, { status: 201 });
});
