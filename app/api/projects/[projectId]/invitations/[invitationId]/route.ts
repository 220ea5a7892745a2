import { cancelInvitation } from "@/lib/commands/cancel-invitation";
import { invitationParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";

/** Cancels a pending invitation (owners only); its join link stops working. Audited. */
export const DELETE = projectRoute({ params: invitationParamsSchema, action: "team.manage" }, async ({ params, user }) => {
  await cancelInvitation({ ...params, actorId: user.id });
  return new Response(null, { status: 204 });
});
