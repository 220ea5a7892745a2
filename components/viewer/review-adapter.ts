// The per-member numbers the colourings need, taken from the review stored with the revision.
import type { StoredReview } from "@/lib/models/analyse";
import type { ViewerMemberReview } from "./types";

/** Verdict and utilisation per member id, or undefined when the revision has no review. */
export function memberReviewMap(review: StoredReview | null | undefined): Record<string, ViewerMemberReview> | undefined {
  if (!review) return undefined;
  const out: Record<string, ViewerMemberReview> = {};
  for (const [id, member] of Object.entries(review.members)) out[id] = { verdict: member.verdict, utilisation: member.utilisation };
  return out;
}
