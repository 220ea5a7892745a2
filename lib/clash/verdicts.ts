import { z } from "zod";
import type { AnalysedPattern } from "@/lib/review/analysed-patterns";
import { MEMBER_VERDICTS, type MemberVerdictKind } from "@/lib/vocabulary/member-verdict";

// Member verdicts as read from the stored review (analysis_runs.review.members[id].verdict, written by
// lib/models/analyse.ts); anything that is not one of the four verdicts is dropped rather than shown.
const verdictMapSchema = z.record(z.string(), z.unknown());
const verdictSchema = z.enum(MEMBER_VERDICTS);

/** memberId → verdict (load-bearing / stabilising / bracing / idle), empty when the review has none. */
export function memberVerdicts(raw: unknown): Record<string, string> {
  const parsed = verdictMapSchema.safeParse(raw);
  if (!parsed.success) return {};
  return Object.fromEntries(Object.entries(parsed.data).filter((entry): entry is [string, MemberVerdictKind] => verdictSchema.safeParse(entry[1]).success));
}

const patternsSchema = z.array(z.object({ id: z.string(), name: z.string() }));

/** The load patterns the verdicts rest on (shown beside "idle"); null when the review does not list them. */
export function analysedPatternsFrom(raw: unknown): AnalysedPattern[] | null {
  const parsed = patternsSchema.safeParse(raw);
  return parsed.success ? parsed.data.map(({ id, name }) => ({ id, name })) : null;
}
