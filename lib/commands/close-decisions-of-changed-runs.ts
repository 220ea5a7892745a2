import "server-only";
import type { Transaction } from "@/db/client";
import { appendClashEntry, listDecidedClashes, updateClashSummary } from "@/db/queries/clashes";
import { listRuns } from "@/db/queries/mep";
import { runChangeReason } from "@/lib/clash/carry";
import type { Run } from "@/lib/mep/schemas";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { notifyClashStep } from "./mail";

/**
 * A step of the commands that edit, replace or remove runs (in their transaction, after clash detection): a proposal
 * or decision was made about the run as it was, so where its run was moved, resized or removed it no longer holds
 * (issue 16: "runs that changed or vanished close the clash with a stated reason"). The clash keeps its id (and its
 * thread); its summary drops the decision, a clash still found stays open for a new one, one no longer found is
 * closed with the reason; the closure is appended to its history and the decider (else the proposer) and the
 * assignee are mailed. Answers how many decisions were closed.
 */
export async function closeDecisionsOfChangedRuns(tx: Transaction, input: { projectId: string; revision: { id: string; number: number }; runsBefore: Run[]; actorId: string | null }): Promise<number> {
  const { projectId, revision, actorId } = input;
  const decided = await listDecidedClashes(tx, { revisionId: revision.id });
  if (decided.length === 0) return 0;
  const before = new Map(input.runsBefore.map((r) => [r.id, r]));
  const after = new Map((await listRuns({ db: tx, revisionId: revision.id })).map((r) => [r.id, r]));
  let closed = 0;
  for (const clash of decided) {
    const was = before.get(clash.runId);
    const change = was ? runChangeReason(clash.runId, was, after.get(clash.runId) ?? null, revision.number) : null;
    if (!change) continue;
    const reason = `The decision no longer holds: ${change}.`;
    const stillFound = clash.status === "active";
    await updateClashSummary(tx, clash.id, {
      outcome: null,
      note: "",
      conditions: null,
      proposedBy: null,
      proposedAt: null,
      decidedBy: null,
      decidedAt: null,
      recheckReason: null,
      ...(stillFound ? {} : { status: "closed" as const, closedReason: reason }),
    });
    const entryId = await appendClashEntry(tx, { clashId: clash.id, kind: "closure", outcome: clash.outcome, reason, decidedBy: null, role: null, revisionId: revision.id, caution: STANDING_CAUTION });
    await notifyClashStep({ db: tx, projectId, clashId: clash.id, entryId, step: "closure", outcome: clash.outcome, details: [reason], actorId, recipientIds: [clash.decidedBy ?? clash.proposedBy, clash.assigneeId] });
    closed += 1;
  }
  return closed;
}
