// The verdict the member review gives each member (lib/review/verdicts.ts): the one definition the review, the
// viewer's colouring and the clash table use.

export const MEMBER_VERDICTS = ["load-bearing", "stabilising", "bracing", "idle"] as const;
export type MemberVerdictKind = (typeof MEMBER_VERDICTS)[number];

export function isMemberVerdict(value: unknown): value is MemberVerdictKind {
  return typeof value === "string" && (MEMBER_VERDICTS as readonly string[]).includes(value);
}
