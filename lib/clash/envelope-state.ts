import type { EnvelopeEntry } from "@/lib/analysis/analyze";

/**
 * A member's envelope state: how it is loaded across every combination, for filtering clashes (glossary: zero-force,
 * low-force). Not the force state of one result (lib/vocabulary/force-state.ts), nor the review's verdict.
 */
export const ENVELOPE_STATES = ["zero_in_all", "low_force", "load_bearing"] as const;
export type EnvelopeState = (typeof ENVELOPE_STATES)[number];

export const ENVELOPE_STATE_LABELS: Record<EnvelopeState, string> = {
  zero_in_all: "Zero in all",
  low_force: "Low-force",
  load_bearing: "Load-bearing",
};

/**
 * zero_in_all when the analysis found the member zero-force in every combination; low_force when its largest
 * |N| over all combinations is below the user's threshold (kN); load_bearing otherwise. Null without results.
 */
export function memberEnvelopeState(entry: EnvelopeEntry | undefined, thresholdKn: number): EnvelopeState | null {
  if (!entry) return null;
  if (entry.zeroInAll) return "zero_in_all";
  const largest = Math.max(Math.abs(entry.maxTension), Math.abs(entry.maxCompression));
  return largest < thresholdKn ? "low_force" : "load_bearing";
}
