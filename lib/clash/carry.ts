// Carrying a clash's decision to a newer revision (issue 16): pure comparison of what the decision relied on — the
// member (geometry and section) and the run when the revision is stored, the member's results once its analysis is
// stored — between the revision it was judged on and the new one. Reasons are written in words for the deciders.
import type { Run } from "../mep/schemas";

/** What a decision about a member relied on, in one revision. */
export type MemberSnapshot = {
  /** Section id and end coordinates (m): a change means a different member, so the decision cannot carry. */
  section: string;
  ends: [number, number, number][];
  /** Axial force (kN, tension positive) and zero-force flag in each load case and combination, by result id. */
  results: Record<string, { force: number; zero: boolean }>;
  verdict: string | null;
  utilisation: number | null;
};

/** Result ids to the names people know them by ("Wind uplift"). */
export type ResultNames = Record<string, string>;

export type CarryVerdict = { action: "keep" } | { action: "close"; reason: string };

/** A change in utilisation smaller than this is noise for a coordination decision (common practice, our choice). */
export const UTILISATION_TOLERANCE = 0.05;
/** Envelope force changes below max(1 kN, 10 %) are not worth another look (our choice, stated on screen). */
const FORCE_TOLERANCE_KN = 1;
const FORCE_TOLERANCE_RATIO = 0.1;
const GEOMETRY_TOLERANCE_M = 1e-6;

const kN = (n: number) => `${Math.abs(n).toFixed(1)} kN ${n >= 0 ? "tension" : "compression"}`;

function sameGeometry(a: Pick<MemberSnapshot, "ends">, b: Pick<MemberSnapshot, "ends">): boolean {
  return a.ends.length === b.ends.length && a.ends.every((p, i) => p.every((v, k) => Math.abs(v - b.ends[i][k]) <= GEOMETRY_TOLERANCE_M));
}

/** Runs are compared on everything that decides where they are and how much room they need. */
export function sameRun(a: Run, b: Run): boolean {
  const shape = (r: Run) => JSON.stringify([r.profile, r.insulation, r.clearance, r.points.map((p) => [p.x, p.y, p.z])]);
  return shape(a) === shape(b);
}

function worst(results: MemberSnapshot["results"], ids: string[]): { id: string; force: number } | null {
  let best: { id: string; force: number } | null = null;
  for (const id of ids) {
    const force = results[id]?.force ?? 0;
    if (!best || Math.abs(force) > Math.abs(best.force)) best = { id, force };
  }
  return best;
}

function envelope(s: MemberSnapshot): { tension: number; compression: number } {
  const forces = Object.values(s.results).map((r) => (r.zero ? 0 : r.force));
  return { tension: Math.max(0, ...forces), compression: Math.min(0, ...forces) };
}

function moved(before: number, after: number): boolean {
  return Math.abs(after - before) > Math.max(FORCE_TOLERANCE_KN, FORCE_TOLERANCE_RATIO * Math.max(Math.abs(before), Math.abs(after)));
}

/** The reasons, in words, why a decision on this member needs another look; empty when its results hold. */
export function recheckReasons(memberId: string, before: MemberSnapshot, after: MemberSnapshot, names: ResultNames): string[] {
  const name = (id: string) => names[id] ?? id;
  const reasons: string[] = [];
  const ids = Object.keys(after.results);
  const zeroBefore = Object.keys(before.results).filter((id) => before.results[id].zero);
  const wasZeroEverywhere = zeroBefore.length > 0 && zeroBefore.length === Object.keys(before.results).length;
  const nowWorking = zeroBefore.filter((id) => after.results[id] && !after.results[id].zero);
  const newlyWorking = ids.filter((id) => !before.results[id] && !after.results[id].zero);
  if (nowWorking.length > 0 || (wasZeroEverywhere && newlyWorking.length > 0)) {
    const w = worst(after.results, [...nowWorking, ...newlyWorking])!;
    reasons.push(`${memberId} was zero in ${wasZeroEverywhere ? "every combination" : nowWorking.map(name).join(", ")}; now carries ${kN(w.force)} in ${name(w.id)}`);
  } else {
    const e0 = envelope(before);
    const e1 = envelope(after);
    if (moved(e0.tension, e1.tension)) reasons.push(`${memberId} maximum tension changed from ${e0.tension.toFixed(1)} kN to ${e1.tension.toFixed(1)} kN`);
    if (moved(e0.compression, e1.compression)) reasons.push(`${memberId} maximum compression changed from ${Math.abs(e0.compression).toFixed(1)} kN to ${Math.abs(e1.compression).toFixed(1)} kN`);
  }
  if (before.verdict !== after.verdict) reasons.push(`its verdict was ${before.verdict ?? "not reviewed"}; now ${after.verdict ?? "not reviewed"}`);
  if (before.utilisation !== null && after.utilisation !== null && Math.abs(after.utilisation - before.utilisation) > UTILISATION_TOLERANCE) {
    reasons.push(`utilisation went from ${before.utilisation.toFixed(2)} to ${after.utilisation.toFixed(2)}`);
  }
  return reasons;
}

/** What the member of a decision is, in one revision: section id and end coordinates (m). */
export type MemberShape = Pick<MemberSnapshot, "section" | "ends">;

/**
 * Whether a clash's decision can be carried to a new revision: closed when the member or run changed or vanished
 * (the decision was about something else), else kept — its results are re-checked once the new revision's analysis
 * is stored (recheckReasons).
 */
export function carryDecision(input: { memberId: string; runId: string; revisionNumber: number; member: { before: MemberShape; after: MemberShape | null }; run: { before: Run; after: Run | null } }): CarryVerdict {
  const { memberId, runId, revisionNumber: n, member, run } = input;
  if (!member.after) return { action: "close", reason: `member ${memberId} is not in revision ${n}` };
  const runChanged = runChangeReason(runId, run.before, run.after, n);
  if (!run.after && runChanged) return { action: "close", reason: runChanged };
  if (member.before.section !== member.after.section) return { action: "close", reason: `member ${memberId} changed section in revision ${n} (${member.before.section} → ${member.after.section})` };
  if (!sameGeometry(member.before, member.after)) return { action: "close", reason: `member ${memberId} moved in revision ${n}` };
  if (runChanged) return { action: "close", reason: runChanged };
  return { action: "keep" };
}

/**
 * Why a decision about a run no longer holds once the run is edited or removed on revision `n` (moved, resized or
 * gone: the decision was about the run as it was), or null when what decides its place and size is unchanged.
 */
export function runChangeReason(runId: string, before: Run, after: Run | null, n: number): string | null {
  if (!after) return `run ${runId} is not on revision ${n}`;
  return sameRun(before, after) ? null : `run ${runId} was moved or resized in revision ${n}`;
}
