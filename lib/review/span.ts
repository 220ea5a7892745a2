// Spans of a few 3D directions: which directions a joint's members and supports can balance.

/** A basis vector is kept when its residual exceeds this (unit vectors): below it, "lies in the plane". */
export const IN_PLANE_TOLERANCE = 1e-12;

export const AXES = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];

/** Orthonormal basis of a span of up to three directions. */
export class Span {
  basis: number[][] = [];
  add(v: ArrayLike<number>) {
    const r = this.residual(v);
    const norm = Math.hypot(r[0], r[1], r[2]);
    const scale = Math.hypot(v[0], v[1], v[2]);
    if (this.basis.length < 3 && norm > IN_PLANE_TOLERANCE * scale) this.basis.push(r.map((x) => x / norm));
  }
  residual(v: ArrayLike<number>): number[] {
    const r = [v[0], v[1], v[2]];
    for (const q of this.basis) {
      const dot = r[0] * q[0] + r[1] * q[1] + r[2] * q[2];
      for (let s = 0; s < 3; s++) r[s] -= dot * q[s];
    }
    return r;
  }
}


/**
 * Rank of the directions that hold node a (its members but `skip`, and its restrained axes). Below 3 the node
 * is certainly free to move (a mechanism); 3 is necessary but not sufficient for stability.
 */
export function holdingRank(topology: { adjStart: Int32Array; adjMember: Int32Array; direction: Float64Array; restrained: Uint8Array }, a: number, skip: number): number {
  const span = new Span();
  for (let p = topology.adjStart[a]; p < topology.adjStart[a + 1]; p++) {
    const m = topology.adjMember[p];
    if (m !== skip) span.add(topology.direction.subarray(3 * m, 3 * m + 3));
  }
  for (let s = 0; s < 3; s++) if (topology.restrained[3 * a + s]) span.add(AXES[s]);
  return span.basis.length;
}
