// The force state of one member in one result (a load case or combination): the one definition the viewer, the
// report, the exports and the clash table use. Zero-force is what the analysis classified (design.md, the result's
// zeroForceMembers); otherwise the sign decides, tension positive.

export const FORCE_STATES = ["tension", "compression", "zero-force"] as const;
export type ForceState = (typeof FORCE_STATES)[number];

export const FORCE_STATE_LABELS: Record<ForceState, string> = {
  tension: "Tension",
  compression: "Compression",
  "zero-force": "Zero-force",
};

/** The force state of a member with axial force `force` (kN) that the analysis did or did not classify zero-force. */
export function forceStateOf(force: number, isZeroForce: boolean): ForceState {
  if (isZeroForce) return "zero-force";
  return force > 0 ? "tension" : "compression";
}

/** The force state of a member in a result. */
export function forceStateIn(result: { memberForces: Record<string, number>; zeroForceMembers: readonly string[] }, memberId: string): ForceState {
  return forceStateOf(result.memberForces[memberId] ?? 0, result.zeroForceMembers.includes(memberId));
}
