import { listMembersByProject, updateMemberRole } from "@/db/queries/memberships";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { changeRoleSchema } from "@/lib/team/schemas";

/** The project's team with roles. */
export const GET = projectRoute({ params: projectParamsSchema, action: "project.read" }, async ({ params }) =>
  Response.json({ members: await listMembersByProject(params) }),
);

/** Changes one member's role (owners only); the change is audited. */
export const PATCH = projectRoute({ params: projectParamsSchema, body: changeRoleSchema, action: "team.manage" }, async ({ params, body, user }) => {
  const member = await updateMemberRole({ projectId: params.projectId, userId: body.userId, role: body.role, actorId: user.id });
  return Response.json({ member });
});
