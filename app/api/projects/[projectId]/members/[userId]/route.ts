import { removeMember } from "@/lib/commands/remove-member";
import { memberParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";

/** Removes a member from the team (owners only; never the last owner). Audited; their live connections are closed. */
export const DELETE = projectRoute({ params: memberParamsSchema, action: "team.manage" }, async ({ params, user }) => {
  await removeMember({ ...params, actorId: user.id });
  return new Response(null, { status: 204 });
});
