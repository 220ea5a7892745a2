import "server-only";
import { STANDING_CAUTION } from "@/lib/review/caution";
import type { Transaction } from "@/db/client";
import { appendClashEntry, judgedOnRevisions, listDecidedClashes, updateClashSummary } from "@/db/queries/clashes";
import { getMemberResults, getRevisionModelById, type MemberResults } from "@/db/queries/member-snapshots";
import type { TrussModel } from "@/lib/analysis/model";
import { recheckReasons, type MemberSnapshot } from "@/lib/clash/carry";
import { notifyClashStep } from "./mail";

const resultNames = (model: TrussModel) => Object.fromEntries([...model.loadCases, ...model.combinations].map((r) => [r.id, r.name]));
const sentence = (text: string) => `${text[0].toUpperCase()}${text.slice(1)}.`;

function snapshot(results: MemberResults | undefined): MemberSnapshot {
  return { section: "", ends: [], results: results?.results ?? {}, verdict: results?.verdict ?? null, utilisation: results?.utilisation ?? null };
}

/**
 * Re-checks the carried decisions of a revision against its newly stored analysis, inside the transaction that
 * stores it: each proposed or decided clash judged on an earlier revision is compared with the results it was
 * judged on; where forces, verdict or utilisation changed beyond the tolerances it is marked "needs another look"
 * with the reason in words, the step appended to its history and the decider mailed.
 */
export async function recheckCarriedDecisions(tx: Transaction, input: { projectId: string; revisionId: string }): Promise<number> {
  const { projectId, revisionId } = input;
  const decided = await listDecidedClashes(tx, { revisionId });
  if (decided.length === 0) return 0;
  const judgedOn = await judgedOnRevisions(tx, { projectId, clashKeys: decided.map((c) => c.clashKey) });
  const memberIds = [...new Set(decided.map((c) => c.memberId))];
  const now = await getMemberResults({ db: tx, revisionId, memberIds });
  const analysisRunId = now.values().next().value?.analysisRunId ?? null;
  const revision = await getRevisionModelById(tx, revisionId);
  if (!revision) return 0;
  const names = resultNames(revision.model);
  const before = new Map<string, Map<string, MemberResults>>();
  let flagged = 0;
  for (const clash of decided) {
    const earlier = judgedOn.get(clash.clashKey);
    if (!earlier || earlier === revisionId) continue;
    if (!before.has(earlier)) before.set(earlier, await getMemberResults({ db: tx, revisionId: earlier, memberIds }));
    const then = before.get(earlier)!.get(clash.memberId);
    if (!then) continue;
    const reasons = now.size === 0 ? [`revision ${revision.number} has no results to check it against (the model is unstable)`] : recheckReasons(clash.memberId, snapshot(then), snapshot(now.get(clash.memberId)), names);
    if (reasons.length === 0) continue;
    const reason = sentence(reasons.join("; "));
    await updateClashSummary(tx, clash.id, { recheckReason: reason });
    const entryId = await appendClashEntry(tx, { clashId: clash.id, kind: "recheck", outcome: clash.outcome, reason, decidedBy: null, role: null, revisionId, analysisRunId, caution: STANDING_CAUTION });
    await notifyClashStep({ db: tx, projectId, clashId: clash.id, entryId, step: "recheck", outcome: clash.outcome, details: [reason], actorId: null, recipientIds: [clash.decidedBy ?? clash.proposedBy, clash.assigneeId] });
    flagged += 1;
  }
  return flagged;
}
