import { z } from "zod";

// Member verdicts as read from the stored review (analysis_runs.review.members[id].verdict, written by
// lib/models/analyse.ts); anything that is not one of the four verdicts is dropped rather than shown.
const VERDICTS = ["load-bearing", "stabilising", "bracing", "idle"] as const;
const verdictMapSchema = z.record(z.string(), z.unknown());
const verdictSchema = z.enum(VERDICTS);

/** memberId → verdict (load-bearing / stabilising / bracing / idle), empty when the review has none. */
export function memberVerdicts(raw: unknown): Record<string, string> {
  const parsed = verdictMapSchema.safeParse(raw);
  if (!parsed.success) return {};
  return Object.fromEntries(Object.entries(parsed.data).filter((entry): entry is [string, (typeof VERDICTS)[number]] => verdictSchema.safeParse(entry[1]).success));
}
