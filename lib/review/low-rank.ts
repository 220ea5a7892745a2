// Removing members from a factored structure without re-factoring: a Woodbury (low-rank) update.
//
// Removing member e changes the stiffness by −k_e g_e g_eᵀ (g_e: the member's unit direction placed at its two
// nodes, k_e = EA/L). With G the columns √k_e·g_e = b_e/√k_e (b_e the member force vector, N_e = b_e·u):
//   K' = K − G Gᵀ,  K'⁻¹ = K⁻¹ + Z M⁻¹ Zᵀ,  Z = K⁻¹G,  M = I − GᵀK⁻¹G   (Woodbury identity).
// M is r×r for r removed members and positive semi-definite; it is singular exactly when K' is, i.e. when the
// removal leaves a mechanism. Cost: r extra solves with the existing factor, then small dense algebra.
import type { PreparedStructure } from "@/lib/analysis";

/** A pivot of M below this marks a mechanism (M's diagonal lies in [0, 1]; exact mechanisms give ~1e-15). */
export const MECHANISM_TOLERANCE = 1e-8;

export type LowRankRemoval = {
  mechanism: boolean;
  /** Smallest Cholesky pivot of M (1 = the removal changes nothing, 0 = a mechanism). */
  smallestPivot: number;
  /** Displacements of the reduced structure from those of the intact one under the same loads. */
  update(u: Float64Array): Float64Array;
};

/** Prepares the low-rank update for removing the given member indices from a prepared, stable structure. */
export function lowRankRemoval(structure: PreparedStructure, memberIndices: number[]): LowRankRemoval {
  const r = memberIndices.length;
  const G = memberIndices.map((e) => {
    const b = structure.memberForceVector(e);
    const scale = 1 / Math.sqrt(structure.topology.axialStiffness[e]);
    for (let q = 0; q < b.length; q++) b[q] *= scale;
    return b;
  });
  const Z = G.map((g) => structure.solve(g));
  // Dense Cholesky of M = I − GᵀZ (lower triangle, row-major), watching the pivots.
  const L = new Float64Array(r * r);
  let smallestPivot = 1;
  for (let i = 0; i < r; i++) {
    for (let j = 0; j <= i; j++) {
      let value = (i === j ? 1 : 0) - 0.5 * (dot(G[i], Z[j]) + dot(G[j], Z[i]));
      for (let k = 0; k < j; k++) value -= L[i * r + k] * L[j * r + k];
      if (i === j) {
        smallestPivot = Math.min(smallestPivot, value);
        L[i * r + i] = Math.sqrt(Math.max(value, MECHANISM_TOLERANCE));
      } else {
        L[i * r + j] = value / L[j * r + j];
      }
    }
  }
  const mechanism = smallestPivot < MECHANISM_TOLERANCE;
  return {
    mechanism,
    smallestPivot,
    update(u) {
      if (mechanism) throw new Error("the removal leaves a mechanism: no displacements");
      const w = G.map((g) => dot(g, u));
      for (let i = 0; i < r; i++) {
        for (let k = 0; k < i; k++) w[i] -= L[i * r + k] * w[k];
        w[i] /= L[i * r + i];
      }
      for (let i = r - 1; i >= 0; i--) {
        for (let k = i + 1; k < r; k++) w[i] -= L[k * r + i] * w[k];
        w[i] /= L[i * r + i];
      }
      const out = Float64Array.from(u);
      for (let j = 0; j < r; j++) for (let q = 0; q < out.length; q++) out[q] += Z[j][q] * w[j];
      return out;
    },
  };
}

function dot(a: Float64Array, b: Float64Array) {
  let s = 0;
  for (let q = 0; q < a.length; q++) s += a[q] * b[q];
  return s;
}
