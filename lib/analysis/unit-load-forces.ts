import { solveSupernodalMany } from "./sparse/solve-many";
import type { SupernodalFactor } from "./sparse/supernodal";
import type { Topology } from "./topology";

/** One block of unit loads solved together (see unitLoadForces). */
export type UnitLoadBlock = {
  /** The block holds loads first .. first + width - 1 of the dofs asked for. */
  first: number;
  width: number;
  /** forces[e * width + c]: axial force N (kN, tension positive) in member e under 1 kN at the dof of load first + c. */
  forces: Float64Array;
};

/**
 * The force in every member under a unit load at each of `loadDofs` (global dofs 3 * node + direction), `block`
 * loads per pass over the factor: the certificate workload ("idle for any roof load", its benchmark). Works in
 * equation space straight through: the unit loads go into the solver's interleaved block and the member forces are
 * read from it, so no full-size load or displacement vectors are built, gathered or scattered per block, and the
 * block, the forces and the member end equations are allocated once. Each load's forces are those memberForces
 * gives for the displacements solveColumns returns, bit for bit (the same solve of the same block, the same
 * arithmetic per member). A load on a restrained dof gives zero forces (it goes straight into the support).
 * The yielded `forces` buffer is reused: read it before asking for the next block.
 */
export function* unitLoadForces(
  factored: () => SupernodalFactor,
  topology: Topology,
  equationOfDof: Int32Array,
  loadDofs: Int32Array,
  block: number,
): Generator<UnitLoadBlock, void> {
  const { memberI, memberJ, direction: c, axialStiffness: ks } = topology;
  const m = memberI.length;
  const neq = factored().n;
  const widest = Math.max(1, Math.min(block, loadDofs.length));
  // Row neq of the block stays zero: restrained member ends read it, as memberForces reads a zero displacement.
  const x = new Float64Array((neq + 1) * widest);
  const forces = new Float64Array(m * widest);
  const ends = new Int32Array(6 * m); // equations of the member's end dofs: i's x, y, z, then j's
  for (let e = 0; e < m; e++) {
    for (let s = 0; s < 3; s++) {
      const qi = equationOfDof[3 * memberI[e] + s];
      const qj = equationOfDof[3 * memberJ[e] + s];
      ends[6 * e + s] = qi < 0 ? neq : qi;
      ends[6 * e + 3 + s] = qj < 0 ? neq : qj;
    }
  }
  for (let first = 0; first < loadDofs.length; first += block) {
    const width = Math.min(block, loadDofs.length - first);
    x.fill(0, 0, (neq + 1) * width);
    for (let col = 0; col < width; col++) {
      const q = equationOfDof[loadDofs[first + col]];
      if (q >= 0) x[q * width + col] = 1;
    }
    solveSupernodalMany(factored(), x, width);
    for (let e = 0; e < m; e++) {
      const k = ks[e];
      const c0 = c[3 * e], c1 = c[3 * e + 1], c2 = c[3 * e + 2];
      const a0 = ends[6 * e] * width, a1 = ends[6 * e + 1] * width, a2 = ends[6 * e + 2] * width;
      const b0 = ends[6 * e + 3] * width, b1 = ends[6 * e + 4] * width, b2 = ends[6 * e + 5] * width;
      const out = e * width;
      for (let col = 0; col < width; col++) {
        forces[out + col] = k * (c0 * (x[b0 + col] - x[a0 + col]) + c1 * (x[b1 + col] - x[a1 + col]) + c2 * (x[b2 + col] - x[a2 + col]));
      }
    }
    yield { first, width, forces: forces.subarray(0, m * width) };
  }
}
