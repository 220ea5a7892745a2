// Member force states per result, and how they change between two results (pure).
import type { CaseResult } from "../analysis/analyze";

export type MemberState = "tension" | "compression" | "zero-force";

/** The member's state in a result: zero-force as the analysis classified it (design.md), else by sign. */
export function memberState(result: CaseResult, memberId: string): MemberState {
  if (result.zeroForceMembers.includes(memberId)) return "zero-force";
  return (result.memberForces[memberId] ?? 0) > 0 ? "tension" : "compression";
}

export type StateChange = { memberId: string; a: { state: MemberState; force: number }; b: { state: MemberState; force: number } };

/** The members whose state differs between results a and b, in the model's member order. */
export function stateChanges(memberIds: string[], a: CaseResult, b: CaseResult): StateChange[] {
  const changes: StateChange[] = [];
  for (const memberId of memberIds) {
    const stateA = memberState(a, memberId);
    const stateB = memberState(b, memberId);
    if (stateA !== stateB) {
      changes.push({ memberId, a: { state: stateA, force: a.memberForces[memberId] ?? 0 }, b: { state: stateB, force: b.memberForces[memberId] ?? 0 } });
    }
  }
  return changes;
}
