import type { EnvelopeEntry } from "@/lib/analysis/analyze";
import type { Run } from "@/lib/mep/schemas";
import { memberEnvelopeState, type EnvelopeState } from "./envelope-state";

/** The fields of a stored clash the table needs (see db/queries/clashes.ts ClashView). */
export interface StoredClash {
  id: string;
  clashKey: string;
  memberId: string;
  runId: string;
  segmentIndex: number;
  kind: "hard" | "clearance";
  status: "active" | "cleared" | "closed";
  gap: number;
  depth: number;
  requiredClearance: number;
  point: { x: number; y: number; z: number };
  outcome: string | null;
  note: string;
  conditions: string | null;
  proposedBy: string | null;
  proposedAt: string | null;
  decidedBy: string | null;
  decidedAt: string | null;
  proposerId: string | null;
  assigneeId: string | null;
  assignee: string | null;
  dueOn: string | null;
  recheckReason: string | null;
  closedReason: string | null;
}

/** One row of the clash table: the clash plus the run's system and the member's forces, state and verdict. */
export type ClashTableRow<C extends StoredClash = StoredClash> = C & {
  system: string | null;
  envelopeState: EnvelopeState | null;
  maxTension: number | null;
  maxCompression: number | null;
  verdict: string | null;
};

/** Joins clashes with their run's system and the member's envelope over all combinations. */
export function clashTableRows<C extends StoredClash>({ clashes, runs, envelope, verdicts, lowForceThreshold }: { clashes: C[]; runs: Pick<Run, "id" | "system">[]; envelope: Record<string, EnvelopeEntry> | null; verdicts: Record<string, string>; lowForceThreshold: number }): ClashTableRow<C>[] {
  const systems = new Map(runs.map((r) => [r.id, r.system]));
  return clashes.map((clash) => {
    const entry = envelope?.[clash.memberId];
    return {
      ...clash,
      system: systems.get(clash.runId) ?? null,
      envelopeState: memberEnvelopeState(entry, lowForceThreshold),
      maxTension: entry?.maxTension ?? null,
      maxCompression: entry?.maxCompression ?? null,
      verdict: verdicts[clash.memberId] ?? null,
    };
  });
}
