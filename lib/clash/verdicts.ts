import { z } from "zod";
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
