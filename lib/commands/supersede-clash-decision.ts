import "server-only";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { recordAuditEvent } from "@/db/queries/audit";
import { appendClashEntry, latestDecisionEntry, updateClashSummary } from "@/db/queries/clashes";
import type { SupersedeDecisionInput } from "@/lib/clash/outcomes";
import { ConflictError } from "@/lib/http/errors";
import { notifyClashStep } from "./mail";
import { runCommand } from "./command";
import { lockClashForStep, type ClashActor } from "./clash-context";

/**
 * The structural engineer supersedes the standing decision of a clash, with a reason: the history keeps the
 * decision and the supersession side by side, and the clash is open for proposals again. Mailed to the previous
 * decider, the proposer and the assignee.
 */
export async function supersedeClashDecision({ projectId, clashId, actor, input }: { projectId: string; clashId: string; actor: ClashActor; input: SupersedeDecisionInput }): Promise<{ entryId: string }> {
  return runCommand(async ({ tx, live }) => {
    const { clash, analysisRunId, revision } = await lockClashForStep(tx, projectId, clashId);
    if (!clash.decidedAt || !clash.outcome) throw new ConflictError("There is no standing decision on this clash to supersede.");
    const superseded = await latestDecisionEntry(tx, { projectId, clashKey: clash.clashKey });
    const entryId = await appendClashEntry(tx, {
      clashId,
      kind: "supersession",
      outcome: clash.outcome,
      reason: input.reason,
      supersedesId: superseded?.id ?? null,
      decidedBy: actor.userId,
      role: actor.role,
      revisionId: clash.revisionId,
      analysisRunId,
      caution: STANDING_CAUTION,
    });
    await updateClashSummary(tx, clashId, { outcome: null, note: "", conditions: null, proposedBy: null, proposedAt: null, decidedBy: null, decidedAt: null, recheckReason: null });
    await recordAuditEvent({ db: tx, projectId, actorId: actor.userId, action: "clash.supersede", subjectType: "clash", subjectId: clashId, details: { entryId, superseded: superseded?.id ?? null, outcome: clash.outcome, reason: input.reason } });
    await notifyClashStep({ db: tx, projectId, clashId, entryId, step: "supersession", outcome: clash.outcome, details: [`Reason: ${input.reason}`], actorId: actor.userId, recipientIds: [clash.decidedBy, clash.proposedBy, clash.assigneeId] });
    await live({ projectId, kind: "clash", subjectId: clashId, revision });
    return { entryId };
  });
}
