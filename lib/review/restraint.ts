// Is a joint still held across a compression member? The lateral stiffness of the joint from the (reduced)
// structure against the stiffness a brace needs.
//
// The joint's flexibility block F (3×3 of K⁻¹) comes from three unit-load solves; across the member (unit
// direction c) the weakest restraint is 1/λmax of F projected on the plane normal to c. A brace at a joint of a
// member with compression P needs k ≥ 4P/L: Winter's ideal stiffness 2P/L for a brace between two lengths L,
// doubled so the brace deflection stays within the initial out-of-straightness (Winter 1958; the factor 2 is the
// one used in the AISC 360 Appendix 6 commentary — from memory).

/** Required brace stiffness factor: k_req = BRACE_STIFFNESS_FACTOR · |P| / L. */
export const BRACE_STIFFNESS_FACTOR = 4;

export type LateralRestraint = { stiffness: number; direction: [number, number, number] };

/** Weakest restraint of a joint with flexibility block F (row-major 3×3, m/kN) across a member of direction c. */
export function weakestAcross(F: ArrayLike<number>, c: ArrayLike<number>): LateralRestraint {
  // an orthonormal pair normal to c
  const helper = Math.abs(c[0]) < 0.9 ? [1, 0, 0] : [0, 1, 0];
  const p1 = cross(c, helper);
  normalise(p1);
  const p2 = cross(c, p1);
  normalise(p2);
  const q = (u: number[], v: number[]) => {
    let s = 0;
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) s += u[i] * F[3 * i + j] * v[j];
    return s;
  };
  const a = q(p1, p1);
  const b = 0.5 * (q(p1, p2) + q(p2, p1));
  const d = q(p2, p2);
  // largest eigenvalue of [[a, b], [b, d]] and its vector
  const mean = 0.5 * (a + d);
  const radius = Math.hypot(0.5 * (a - d), b);
  const lambda = mean + radius;
  const angle = 0.5 * Math.atan2(2 * b, a - d);
  const dir = [0, 1, 2].map((s) => Math.cos(angle) * p1[s] + Math.sin(angle) * p2[s]) as [number, number, number];
  return { stiffness: lambda > 0 ? 1 / lambda : Infinity, direction: dir };
}

/** Flexibility block of joint a from the three unit-load displacement vectors (column s: unit load along axis s). */
export function flexibilityBlock(columns: Float64Array[], a: number): Float64Array {
  const F = new Float64Array(9);
  for (let s = 0; s < 3; s++) for (let t = 0; t < 3; t++) F[3 * t + s] = columns[s][3 * a + t];
  return F;
}

function cross(u: ArrayLike<number>, v: ArrayLike<number>): number[] {
  return [u[1] * v[2] - u[2] * v[1], u[2] * v[0] - u[0] * v[2], u[0] * v[1] - u[1] * v[0]];
}

function normalise(v: number[]) {
  const n = Math.hypot(v[0], v[1], v[2]);
  for (let s = 0; s < 3; s++) v[s] /= n;
}
