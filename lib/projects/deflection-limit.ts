// The project's serviceability deflection limit, span/N: the default and the range a project may set. Kept apart
// from the check (lib/review/deflection.ts) so the database schema and the settings form can read it without the analysis.

/**
 * Default N in span/N: span/250 for a roof (common practice, from memory; EN 1990 A1.4 leaves the values to the
 * project and its National Annex). Each project may change it (project settings).
 */
export const DEFAULT_DEFLECTION_LIMIT = 250;

/**
 * The N a project may set. Common practice (from memory) for roofs and floors lies between span/150 and span/500;
 * the bounds leave room either side and refuse typing slips (span/25, span/25000).
 */
export const DEFLECTION_LIMIT_BOUNDS = { min: 100, max: 1000 } as const;
