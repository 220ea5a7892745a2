import { listMembersByProject } from "@/db/queries/memberships";
import { changeMemberRole } from "@/lib/commands/change-member-role";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { changeRoleSchema } from "@/lib/team/schemas";

/** The project's team with roles. */
export const GET = projectRoute({ params: projectParamsSchema, action: "project.read" }, async ({ params }) =>
  Response.json({ members: await listMembersByProject(params) }),
);

/** Changes one member's role (owners only; the team panel calls this too); audited, live connections re-authorised. */
export const PATCH = projectRoute({ params: projectParamsSchema, body: changeRoleSchema, action: "team.manage" }, async ({ params, body, user }) => {
  const member = await changeMemberRole({ projectId: params.projectId, userId: body.userId, role: body.role, actorId: user.id });
  return Response.json({ member });
});
