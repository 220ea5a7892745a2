import "server-only";
import { STANDING_CAUTION } from "@/lib/review/caution";
import type { Transaction } from "@/db/client";
import { appendClashEntry, judgedOnRevisions, listDecidedClashes, updateClashSummary } from "@/db/queries/clashes";
import { getMemberResults, getRevisionModelById, type MemberResults } from "@/db/queries/member-snapshots";
import { listRuns } from "@/db/queries/mep";
import { getRevisionForAnalysis } from "@/db/queries/models";
import type { ClashRow } from "@/db/schema";
import type { TrussModel } from "@/lib/analysis/model";
import { recheckReasons, type MemberSnapshot } from "@/lib/clash/carry";
import { clashOpeningCheck, openingCheckReason } from "@/lib/clash/opening-recheck";
import type { Run } from "@/lib/mep/schemas";
import type { DesignStandard } from "@/lib/review/design-checks/types";
import { notifyClashStep } from "./mail";

const resultNames = (model: TrussModel) => Object.fromEntries([...model.loadCases, ...model.combinations].map((r) => [r.id, r.name]));
const sentence = (text: string) => `${text[0].toUpperCase()}${text.slice(1)}.`;

function snapshot(results: MemberResults | undefined): MemberSnapshot {
  return { section: "", ends: [], results: results?.results ?? {}, verdict: results?.verdict ?? null, utilisation: results?.utilisation ?? null };
}

/** What an opening check is computed from, in one revision. */
type Judged = { model: TrussModel; standard: DesignStandard; results: MemberResults["results"] };

/** For an accepted opening: why its opening check (the run's hole at the clash point) needs another look, or null. */
function openingReason(clash: ClashRow, run: Run | undefined, then: Judged, now: Judged): string | null {
  if (clash.outcome !== "opening_accepted" || !run) return null;
  const point = { x: clash.pointX, y: clash.pointY, z: clash.pointZ };
  const check = (j: Judged) => clashOpeningCheck({ model: j.model, standard: j.standard, memberId: clash.memberId, run, point, results: j.results });
  const [before, after] = [check(then), check(now)];
  return before && after ? openingCheckReason(before, after) : null;
}

/**
 * Re-checks the carried decisions of a revision against its newly stored analysis, inside the transaction that
 * stores it: each proposed or decided clash judged on an earlier revision is compared with the results it was
 * judged on; where forces, verdict or utilisation changed beyond the tolerances, or (for an accepted opening) the
 * opening check of the run's hole at the clash point, it is marked "needs another look" with the reason in words,
 * the step appended to its history and the decider mailed.
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
  // Models and the design standard, read only when an accepted opening is among the clashes (its opening check).
  const openings = decided.some((c) => c.outcome === "opening_accepted");
  const analysed = new Map<string, Awaited<ReturnType<typeof getRevisionForAnalysis>>>();
  const analysedOf = async (id: string) => {
    if (!analysed.has(id)) analysed.set(id, await getRevisionForAnalysis({ revisionId: id, db: tx }));
    return analysed.get(id) ?? null;
  };
  const runs = new Map(openings ? (await listRuns({ db: tx, revisionId })).map((r) => [r.id, r]) : []);
  let flagged = 0;
  for (const clash of decided) {
    const earlier = judgedOn.get(clash.clashKey);
    if (!earlier || earlier === revisionId) continue;
    if (!before.has(earlier)) before.set(earlier, await getMemberResults({ db: tx, revisionId: earlier, memberIds }));
    const then = before.get(earlier)!.get(clash.memberId);
    if (!then) continue;
    const current = now.get(clash.memberId);
    const reasons = now.size === 0 ? [`revision ${revision.number} has no results to check it against (the model is unstable)`] : recheckReasons(clash.memberId, snapshot(then), snapshot(current), names);
    if (current && clash.outcome === "opening_accepted") {
      const [a, b] = [await analysedOf(earlier), await analysedOf(revisionId)];
      const opening = a && b ? openingReason(clash, runs.get(clash.runId), { ...a, results: then.results }, { ...b, results: current.results }) : null;
      if (opening) reasons.push(opening);
    }
    if (reasons.length === 0) continue;
    const reason = sentence(reasons.join("; "));
    await updateClashSummary(tx, clash.id, { recheckReason: reason });
    const entryId = await appendClashEntry(tx, { clashId: clash.id, kind: "recheck", outcome: clash.outcome, reason, decidedBy: null, role: null, revisionId, analysisRunId, caution: STANDING_CAUTION });
    await notifyClashStep({ db: tx, projectId, clashId: clash.id, entryId, step: "recheck", outcome: clash.outcome, details: [reason], actorId: null, recipientIds: [clash.decidedBy ?? clash.proposedBy, clash.assigneeId] });
    flagged += 1;
  }
  return flagged;
}
