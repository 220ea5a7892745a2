import "server-only";
import { recordAuditEvent } from "@/db/queries/audit";
import { setClashAssignment } from "@/db/queries/clashes";
import { getMembership } from "@/db/queries/memberships";
import type { AssignClashInput } from "@/lib/clash/outcomes";
import { ValidationError } from "@/lib/http/errors";
import { runCommand } from "./command";
import { lockClashForStep, type ClashActor } from "./clash-context";

/** Sets who works on a clash and by when; the assignee must be on the project's team. */
export async function assignClash({ projectId, clashId, actor, input }: { projectId: string; clashId: string; actor: ClashActor; input: AssignClashInput }): Promise<void> {
  await runCommand(async ({ tx, live }) => {
    const { revision } = await lockClashForStep(tx, projectId, clashId);
    if (input.assigneeId && !(await getMembership({ projectId, userId: input.assigneeId, db: tx }))) {
      throw new ValidationError([{ path: "assigneeId", message: "The assignee is not on this project's team." }]);
    }
    await setClashAssignment(tx, { clashId, assigneeId: input.assigneeId, dueOn: input.dueOn });
    await recordAuditEvent({ db: tx, projectId, actorId: actor.userId, action: "clash.assign", subjectType: "clash", subjectId: clashId, details: { ...input } });
    await live({ projectId, kind: "clash", subjectId: clashId, revision });
  });
}
