// Which results a revision offers and which one the viewer opens with. Pure: the viewer orders its result picker
// with it, and the viewer page names the opening result's columns before any script runs (preloaded beside the
// geometry and the overview).

type ResultNames = { loadCases: readonly { id: string }[]; combinations: readonly { id: string }[] };

/** Result ids in display order: load cases first, then combinations, keeping only those with stored results. */
export function resultIds(model: ResultNames, stored: readonly string[]): string[] {
  const available = new Set(stored);
  return [...model.loadCases.map((c) => c.id), ...model.combinations.map((c) => c.id)].filter((id) => available.has(id));
}

/** The result the viewer opens with: the first combination with stored results, else the first result; null when none. */
export function openingResultId(model: ResultNames, stored: readonly string[]): string | null {
  const ids = resultIds(model, stored);
  const combinations = new Set(model.combinations.map((c) => c.id));
  return ids.find((id) => combinations.has(id)) ?? ids[0] ?? null;
}
