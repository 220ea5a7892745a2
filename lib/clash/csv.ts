// The clash CSV export (issue 16): one row per clash with where its decision stands, for the team's own lists.
// papaparse writes it; text cells that a spreadsheet would run as a formula are escaped (lib/report/csv.ts).
import Papa from "papaparse";
import { UNPARSE } from "../report/csv";
import { CLASH_OUTCOME_LABELS, type ClashOutcome } from "./outcomes";

export const CLASH_COLUMNS = ["clash", "member", "run", "segment", "kind", "status", "depth_mm", "outcome", "stage", "proposed_by", "decided_by", "conditions_or_reason", "needs_another_look", "closed_because", "assignee", "due"] as const;

export type ClashCsvRow = {
  clashKey: string;
  memberId: string;
  runId: string;
  segmentIndex: number;
  kind: string;
  status: string;
  depth: number;
  outcome: ClashOutcome | null;
  decidedAt: string | null;
  proposedBy: string | null;
  decidedBy: string | null;
  conditions: string | null;
  note: string;
  recheckReason: string | null;
  closedReason: string | null;
  assignee: string | null;
  dueOn: string | null;
};

/** The clashes of a revision as CSV text. */
export function clashesCsv(rows: ClashCsvRow[]): string {
  const data = rows.map((c) => [
    c.clashKey,
    c.memberId,
    c.runId,
    c.segmentIndex + 1,
    c.kind,
    c.status,
    Math.round(c.depth * 1000),
    c.outcome ? CLASH_OUTCOME_LABELS[c.outcome] : "",
    c.outcome ? (c.decidedAt ? "decided" : "proposed") : "undecided",
    c.proposedBy ?? "",
    c.decidedBy ?? "",
    c.conditions ?? (c.outcome === "opening_refused" ? c.note : ""),
    c.recheckReason ?? "",
    c.closedReason ?? "",
    c.assignee ?? "",
    c.dueOn ?? "",
  ]);
  return Papa.unparse({ fields: [...CLASH_COLUMNS], data }, UNPARSE) + "\n";
}
