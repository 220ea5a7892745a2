"use server";

import { z } from "zod";
import { updateMemberRole } from "@/db/queries/memberships";
import { serverAction } from "@/lib/http/action";
import { changeRoleSchema } from "@/lib/team/schemas";

const changeMemberRoleAction = serverAction(
  { schema: changeRoleSchema.extend({ projectId: z.uuid() }), action: "team.manage" },
  (input, { user }) => updateMemberRole({ projectId: input.projectId, userId: input.userId, role: input.role, actorId: user.id }),
);

/** Owners change a member's role from the team panel (same rules as PATCH /api/projects/[id]/members). */
export async function changeMemberRole(input: { projectId: string; userId: string; role: string }) {
  return changeMemberRoleAction(input);
}
