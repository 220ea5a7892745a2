import "server-only";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { and, eq, isNotNull, or } from "drizzle-orm";
import type { Transaction } from "@/db/client";
import { recordAuditEvent } from "@/db/queries/audit";
import { appendClashEntry, updateClashSummary } from "@/db/queries/clashes";
import { clashes, mepRuns, modelRevisions, type ClashRow } from "@/db/schema";
import type { TrussModel } from "@/lib/analysis/model";
import { carryDecision, type MemberShape } from "@/lib/clash/carry";
import type { Run } from "@/lib/mep/schemas";
import { notifyClashStep } from "./mail";

/** A member's section and end coordinates in a model, or null when the model has no such member. */
export function memberShape(model: TrussModel, memberId: string): MemberShape | null {
  const member = model.members.find((m) => m.id === memberId);
  if (!member) return null;
  const node = (id: string): [number, number, number] => {
    const n = model.nodes.find((p) => p.id === id);
    return n ? [n.x, n.y, n.z] : [Number.NaN, Number.NaN, Number.NaN];
  };
  return { section: member.section, ends: [node(member.i), node(member.j)] };
}

/**
 * Carries every proposed or decided (or assigned) clash of the previous revision onto a new one, inside the
 * transaction that stores the new revision, after its clashes are detected: the decision is copied where the member
 * and run are unchanged (its results are re-checked when the analysis is stored: recheckCarriedDecisions), and
 * closed with the reason where the member or run changed or vanished. Closures are appended to the history and
 * mailed to the decider (else the proposer) and the assignee.
 */
export async function carryClashDecisions(tx: Transaction, input: { projectId: string; fromRevisionId: string; toRevision: { id: string; model: TrussModel }; actorId: string | null }): Promise<{ carried: number; closed: number }> {
  const { projectId, fromRevisionId, toRevision } = input;
  const prior = await tx
    .select()
    .from(clashes)
    .where(and(eq(clashes.revisionId, fromRevisionId), or(isNotNull(clashes.outcome), isNotNull(clashes.assigneeId))));
  const summary = { carried: 0, closed: 0 };
  if (prior.length === 0) return summary;
  const [[from], [to], runsBefore, runsAfter, current] = await Promise.all([
    tx.select({ model: modelRevisions.model }).from(modelRevisions).where(eq(modelRevisions.id, fromRevisionId)),
    tx.select({ number: modelRevisions.number }).from(modelRevisions).where(eq(modelRevisions.id, toRevision.id)),
    tx.select().from(mepRuns).where(eq(mepRuns.revisionId, fromRevisionId)),
    tx.select().from(mepRuns).where(eq(mepRuns.revisionId, toRevision.id)),
    tx.select().from(clashes).where(eq(clashes.revisionId, toRevision.id)),
  ]);
  const asRun = (row: (typeof runsBefore)[number]): Run => ({ id: row.runId, system: row.system, profile: row.profile, insulation: row.insulation, clearance: row.clearance, weightPerMetre: row.weightPerMetre, points: row.points });
  const runBefore = new Map(runsBefore.map((r) => [r.runId, asRun(r)]));
  const runAfter = new Map(runsAfter.map((r) => [r.runId, asRun(r)]));
  const byKey = new Map(current.map((c) => [c.clashKey, c]));

  for (const old of prior) {
    const memberBefore = memberShape(from.model, old.memberId);
    const oldRun = runBefore.get(old.runId);
    if (!memberBefore || !oldRun) continue;
    const verdict = carryDecision({
      memberId: old.memberId,
      runId: old.runId,
      revisionNumber: to.number,
      member: { before: memberBefore, after: memberShape(toRevision.model, old.memberId) },
      run: { before: oldRun, after: runAfter.get(old.runId) ?? null },
    });
    const found = byKey.get(old.clashKey);
    if (verdict.action === "close" || !found) {
      const reason = verdict.action === "close" ? `The decision does not carry: ${verdict.reason}.` : `No longer found on revision ${to.number}.`;
      const clashId = found?.id ?? (await insertClosedCopy(tx, old, toRevision.id, reason));
      const entryId = await appendClashEntry(tx, { clashId, kind: "closure", outcome: old.outcome, reason, decidedBy: null, role: null, revisionId: toRevision.id, caution: STANDING_CAUTION });
      await notifyClashStep({ db: tx, projectId, clashId, entryId, step: "closure", outcome: old.outcome, details: [reason], actorId: input.actorId, recipientIds: [old.decidedBy ?? old.proposedBy, old.assigneeId] });
      summary.closed += 1;
      continue;
    }
    const { outcome, note, conditions, proposedBy, proposedAt, decidedBy, decidedAt, assigneeId, dueOn, recheckReason } = old;
    await updateClashSummary(tx, found.id, { outcome, note, conditions, proposedBy, proposedAt, decidedBy, decidedAt, assigneeId, dueOn, recheckReason });
    summary.carried += 1;
  }
  await recordAuditEvent({ db: tx, projectId, actorId: input.actorId, action: "clashes.carry", subjectType: "model_revision", subjectId: toRevision.id, details: { from: fromRevisionId, ...summary } });
  return summary;
}

/** A clash whose member or run vanished has no row on the new revision: a closed copy keeps it on the record there. */
async function insertClosedCopy(tx: Transaction, old: ClashRow, revisionId: string, reason: string): Promise<string> {
  const { projectId, clashKey, memberId, runId, segmentIndex, kind, gap, depth, requiredClearance, pointX, pointY, pointZ, outcome, note, conditions } = old;
  const [row] = await tx
    .insert(clashes)
    .values({ projectId, revisionId, clashKey, memberId, runId, segmentIndex, kind, gap, depth, requiredClearance, pointX, pointY, pointZ, outcome, note, conditions, status: "closed", closedReason: reason })
    .returning({ id: clashes.id });
  return row.id;
}
