import { z } from "zod";

// The stored member review (analysis_runs.review, written by lib/models/analyse.ts) carries each member's verdict;
// this reads only that part, and a missing review (unstable model) gives no verdicts.
const VERDICTS = ["load-bearing", "stabilising", "bracing", "idle"] as const;
const reviewSchema = z.object({ members: z.record(z.string(), z.object({ verdict: z.enum(VERDICTS) })) });

/** memberId → verdict (load-bearing / stabilising / bracing / idle) from a stored review, empty when absent. */
export function memberVerdicts(review: unknown): Record<string, string> {
  const parsed = reviewSchema.safeParse(review);
  return parsed.success ? Object.fromEntries(Object.entries(parsed.data.members).map(([id, m]) => [id, m.verdict])) : {};
}
