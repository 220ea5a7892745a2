// How members' force states change between two results (pure); the force state itself is lib/vocabulary/force-state.ts.
import type { CaseResult } from "../analysis/analyze";
import { forceStateIn, type ForceState } from "../vocabulary/force-state";

export type StateChange = { memberId: string; a: { state: ForceState; force: number }; b: { state: ForceState; force: number } };

/** The members whose state differs between results a and b, in the model's member order. */
export function stateChanges(memberIds: string[], a: CaseResult, b: CaseResult): StateChange[] {
  const changes: StateChange[] = [];
  for (const memberId of memberIds) {
    const stateA = forceStateIn(a, memberId);
    const stateB = forceStateIn(b, memberId);
    if (stateA !== stateB) {
      changes.push({ memberId, a: { state: stateA, force: a.memberForces[memberId] ?? 0 }, b: { state: stateB, force: b.memberForces[memberId] ?? 0 } });
    }
  }
  return changes;
}
