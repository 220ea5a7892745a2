import "server-only";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { recordAuditEvent } from "@/db/queries/audit";
import { appendClashEntry, updateClashSummary } from "@/db/queries/clashes";
import { CLASH_OUTCOME_LABELS, type DecideClashInput } from "@/lib/clash/outcomes";
import { ConflictError, ForbiddenError } from "@/lib/http/errors";
import { notifyClashStep } from "./mail";
import { clashDecisionRefusal } from "@/lib/permissions";
import { runCommand } from "./command";
import { lockClashForStep, type ClashActor } from "./clash-context";

/**
 * The structural engineer decides the open proposal of a clash: accepts an opening with conditions or refuses it
 * with a reason, or confirms another proposed outcome. The proposer of an opening may not decide it (rule book).
 * Appended to the history; mailed as a decision to the proposer and the assignee.
 */
export async function decideClash({ projectId, clashId, actor, input }: { projectId: string; clashId: string; actor: ClashActor; input: DecideClashInput }): Promise<{ entryId: string }> {
  return runCommand(async ({ tx, live }) => {
    const { clash, analysisRunId, revision } = await lockClashForStep(tx, projectId, clashId);
    if (clash.status === "closed") throw new ConflictError(`This clash is closed: ${clash.closedReason ?? "its member or run changed"}.`);
    if (clash.decidedAt) throw new ConflictError("This clash is already decided; supersede the decision, with a reason, to decide it again.");
    if (!clash.outcome) throw new ConflictError("Nothing is proposed on this clash yet; a proposal comes first.");
    const refusal = clashDecisionRefusal(actor, { outcome: clash.outcome, proposerId: clash.proposedBy });
    if (refusal) throw new ForbiddenError(refusal);
    const answersOpening = input.outcome === "opening_accepted" || input.outcome === "opening_refused";
    if (answersOpening !== (clash.outcome === "opening_proposed") || (!answersOpening && input.outcome !== clash.outcome)) {
      throw new ConflictError(`The proposal is "${CLASH_OUTCOME_LABELS[clash.outcome]}"; decide that proposal (an opening is accepted or refused, any other outcome confirmed).`);
    }
    const conditions = input.outcome === "opening_accepted" ? input.conditions : null;
    const reason = input.outcome === "opening_refused" ? input.reason : null;
    const note = "note" in input ? input.note : "";
    const entryId = await appendClashEntry(tx, { clashId, kind: "decision", outcome: input.outcome, note, conditions, reason, decidedBy: actor.userId, role: actor.role, revisionId: clash.revisionId, analysisRunId, caution: STANDING_CAUTION });
    await updateClashSummary(tx, clashId, { outcome: input.outcome, note: reason ?? (note || clash.note), conditions, decidedBy: actor.userId, decidedAt: new Date(), recheckReason: null });
    await recordAuditEvent({ db: tx, projectId, actorId: actor.userId, action: "clash.decide", subjectType: "clash", subjectId: clashId, details: { entryId, outcome: input.outcome, conditions, reason, note } });
    const details = [conditions ? `Conditions: ${conditions}` : "", reason ? `Reason: ${reason}` : "", note ? `Note: ${note}` : ""].filter(Boolean);
    await notifyClashStep({ db: tx, projectId, clashId, entryId, step: "decision", outcome: input.outcome, details, actorId: actor.userId, recipientIds: [clash.proposedBy, clash.assigneeId] });
    await live({ projectId, kind: "clash", subjectId: clashId, revision });
    return { entryId };
  });
}
