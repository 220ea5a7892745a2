// What changed between two revisions of a roof (issue 16): members added, removed or resized; per result, the
// members whose force state changed; members whose verdict changed; clashes added, resolved or needing another
// look. Pure: the caller passes both revisions' models, stored analyses and clashes.
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import type { StoredReview } from "@/lib/models/analyse";
import { stateChanges, type StateChange } from "@/lib/report/states";
import type { MemberVerdictKind } from "@/lib/vocabulary/member-verdict";

export type ComparedRevision = {
  number: number;
  model: TrussModel;
  /** The stored analysis, or null while it has none; an unstable one has no results to compare. */
  result: AnalysisResult | null;
  review: StoredReview | null;
  clashes: ComparedClash[];
};

export type ComparedClash = {
  clashKey: string;
  memberId: string;
  runId: string;
  status: "active" | "cleared" | "closed";
  recheckReason: string | null;
  closedReason: string | null;
};

export type ResultComparison = { id: string; name: string; changes: StateChange[] };

export type RevisionComparison = {
  from: number;
  to: number;
  members: {
    added: string[];
    removed: string[];
    resized: { memberId: string; from: string; to: string }[];
  };
  /** Results (load cases and combinations) present in both analyses, each with its force-state changes. */
  results: ResultComparison[];
  /** Results only one of the revisions has (renamed or added cases), named so nobody assumes they were compared. */
  resultsNotCompared: string[];
  verdicts: { memberId: string; from: MemberVerdictKind; to: MemberVerdictKind }[];
  clashes: {
    added: ComparedClash[];
    resolved: (ComparedClash & { why: string })[];
    needsAnotherLook: ComparedClash[];
  };
  /** Why part of the comparison is missing (an unanalysed or unstable revision), in words. */
  notes: string[];
};

/** Compares revision `a` (older, usually) with revision `b`. */
export function compareRevisions(a: ComparedRevision, b: ComparedRevision): RevisionComparison {
  const membersA = new Map(a.model.members.map((m) => [m.id, m]));
  const membersB = new Map(b.model.members.map((m) => [m.id, m]));
  const added = b.model.members.filter((m) => !membersA.has(m.id)).map((m) => m.id);
  const removed = a.model.members.filter((m) => !membersB.has(m.id)).map((m) => m.id);
  const resized = b.model.members.flatMap((m) => {
    const before = membersA.get(m.id);
    return before && before.section !== m.section ? [{ memberId: m.id, from: before.section, to: m.section }] : [];
  });
  const common = b.model.members.filter((m) => membersA.has(m.id)).map((m) => m.id);

  const notes: string[] = [];
  const usable = (r: ComparedRevision) => {
    if (!r.result) notes.push(`Revision ${r.number} has not been analysed yet, so its forces cannot be compared.`);
    else if (r.result.status !== "ok") notes.push(`Revision ${r.number} is unstable, so it has no forces to compare.`);
    return r.result?.status === "ok" ? r.result : null;
  };
  const resultA = usable(a);
  const resultB = usable(b);
  const results: ResultComparison[] = [];
  const resultsNotCompared: string[] = [];
  if (resultA && resultB) {
    const names = new Map([...b.model.loadCases, ...b.model.combinations].map((c) => [c.id, c.name]));
    const ids = [...b.model.combinations, ...b.model.loadCases].map((c) => c.id);
    for (const id of ids) {
      if (resultA.results[id] && resultB.results[id]) results.push({ id, name: names.get(id) ?? id, changes: stateChanges(common, resultA.results[id], resultB.results[id]) });
      else resultsNotCompared.push(id);
    }
    for (const id of Object.keys(resultA.results)) if (!resultB.results[id]) resultsNotCompared.push(id);
  }

  const verdicts =
    a.review && b.review
      ? common.flatMap((id) => {
          const from = a.review!.members[id]?.verdict;
          const to = b.review!.members[id]?.verdict;
          return from && to && from !== to ? [{ memberId: id, from, to }] : [];
        })
      : [];

  const activeA = new Map(a.clashes.filter((c) => c.status === "active").map((c) => [c.clashKey, c]));
  const byKeyB = new Map(b.clashes.map((c) => [c.clashKey, c]));
  const clashAdded = b.clashes.filter((c) => c.status === "active" && !activeA.has(c.clashKey));
  const resolved = [...activeA.values()].flatMap((c) => {
    const later = byKeyB.get(c.clashKey);
    if (later?.status === "active") return [];
    const why = !later
      ? `not found on revision ${b.number}`
      : later.status === "closed"
        ? (later.closedReason ?? `closed on revision ${b.number}`)
        : `no longer found by the detection on revision ${b.number}`;
    return [{ ...(later ?? c), why }];
  });
  const needsAnotherLook = b.clashes.filter((c) => c.status !== "closed" && c.recheckReason);

  return {
    from: a.number,
    to: b.number,
    members: { added, removed, resized },
    results,
    resultsNotCompared,
    verdicts,
    clashes: { added: clashAdded, resolved, needsAnotherLook },
    notes,
  };
}
