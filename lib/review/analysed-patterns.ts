// "Idle" depends on the loads analysed: the load cases a review rests on, kept on every stored review and shown
// beside every idle verdict (member panel, clash panel). Pure and small, so client components may import it.

/** A load case the analysis solved. */
export type AnalysedPattern = { id: string; name: string };

/** The patterns of a stored review; reviews stored before the review kept them had them under `anyLoad`. */
export function analysedPatterns(review: { analysedPatterns?: AnalysedPattern[]; anyLoad?: { patterns?: AnalysedPattern[] } }): AnalysedPattern[] | null {
  return review.analysedPatterns ?? review.anyLoad?.patterns ?? null;
}

/** The sentence shown beside an "idle" verdict. */
export function idlePatternsText(patterns: AnalysedPattern[] | null): string {
  if (!patterns) return "“Idle” holds for the load patterns analysed; this review was stored before it listed them.";
  return `“Idle” holds for the load patterns analysed: ${patterns.map((p) => `${p.id} (${p.name})`).join("; ") || "none"}.`;
}
