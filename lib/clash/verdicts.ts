import { z } from "zod";

// The stored member review (analysis_runs.review) carries each member's verdict; this reads only that part and
// tolerates a review without verdicts (unstable model, or an analysis stored before verdicts existed).
const VERDICTS = ["load-bearing", "stabilising", "bracing", "idle"] as const;
const verdictEntry = z.union([z.enum(VERDICTS), z.object({ verdict: z.enum(VERDICTS) }).transform((v) => v.verdict)]);
const reviewSchema = z.object({ verdicts: z.record(z.string(), verdictEntry) });

/** memberId → verdict (load-bearing / stabilising / bracing / idle) from a stored review, empty when absent. */
export function memberVerdicts(review: unknown): Record<string, string> {
  const parsed = reviewSchema.safeParse(review);
  return parsed.success ? parsed.data.verdicts : {};
}
