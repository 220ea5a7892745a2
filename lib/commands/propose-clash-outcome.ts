import "server-only";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { recordAuditEvent } from "@/db/queries/audit";
import { appendClashEntry, updateClashSummary } from "@/db/queries/clashes";
import { CLASH_OUTCOME_LABELS, type ProposeOutcomeInput } from "@/lib/clash/outcomes";
import { ConflictError } from "@/lib/http/errors";
import { notifyClashStep, structuralEngineerIds } from "./mail";
import { runCommand } from "./command";
import { lockClashForStep, type ClashActor } from "./clash-context";

/**
 * Records a proposal on a clash (MEP or structural engineer). A proposal never replaces a standing decision: while
 * one stands the proposal is refused, and only the structural engineer can supersede the decision first. Mailed as
 * a proposal to the assignee and the structural engineers who decide it.
 */
export async function proposeClashOutcome({ projectId, clashId, actor, input }: { projectId: string; clashId: string; actor: ClashActor; input: ProposeOutcomeInput }): Promise<{ entryId: string }> {
  return runCommand(async ({ tx, live }) => {
    const { clash, analysisRunId, revision } = await lockClashForStep(tx, projectId, clashId);
    if (clash.status === "closed") throw new ConflictError(`This clash is closed: ${clash.closedReason ?? "its member or run changed"}.`);
    if (clash.decidedAt && clash.outcome) {
      throw new ConflictError(
        `This clash is decided (${CLASH_OUTCOME_LABELS[clash.outcome].toLowerCase()}). A proposal cannot replace a decision; the structural engineer can supersede it, with a reason.`,
      );
    }
    const entryId = await appendClashEntry(tx, { clashId, kind: "proposal", outcome: input.outcome, note: input.note, decidedBy: actor.userId, role: actor.role, revisionId: clash.revisionId, analysisRunId, caution: STANDING_CAUTION });
    const now = new Date();
    await updateClashSummary(tx, clashId, { outcome: input.outcome, note: input.note, conditions: null, proposedBy: actor.userId, proposedAt: now, decidedBy: null, decidedAt: null });
    await recordAuditEvent({ db: tx, projectId, actorId: actor.userId, action: "clash.propose", subjectType: "clash", subjectId: clashId, details: { entryId, outcome: input.outcome, note: input.note } });
    await notifyClashStep({
      db: tx,
      projectId,
      clashId,
      entryId,
      step: "proposal",
      outcome: input.outcome,
      details: input.note ? [`Note: ${input.note}`] : [],
      actorId: actor.userId,
      recipientIds: [clash.assigneeId, ...(await structuralEngineerIds({ db: tx, projectId }))],
    });
    await live({ projectId, kind: "clash", subjectId: clashId, revision });
    return { entryId };
  });
}
