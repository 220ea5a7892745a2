// Overall stability: linear buckling of the whole truss under one result's member forces.
//
// (K + α K_G) φ = 0, with K_G from the result's member forces N (tension positive): member e adds
// G_e = (N_e / L_e)(I − c cᵀ) to both end blocks and −G_e to the block joining them (a bar turned by a small
// angle under axial force N). Written as A φ = μ K φ with A = −K_G and μ = 1/α, K⁻¹A is symmetric in the K inner
// product, so subspace iteration on our factor of K (shift-invert about α = 0) with a Rayleigh–Ritz step converges
// to the largest |μ|, i.e. the smallest |α|. A negative α is buckling under the reversed load (tension members
// turned into compression); the critical factor of the roof is the smallest positive α. When the dominant part of
// the spectrum is negative, the iteration is repeated on K⁻¹(A + σK) with σ = −μ_min, which shifts every negative μ
// into [0, σ) and makes the positive ones dominant.
//
// Pin-jointed members are straight bars here: this is the buckling of the joints as a whole (snap-through, sway,
// loss of a joint's lateral hold), not of a member between its ends (each member's own flexural buckling is the
// member check of EN 1993-1-1 6.3.1 / AISC E3).
import { generalizedSymmetricEigen } from "./dense-eigen";
import { movingJoints, type MovingJoint } from "./mechanism";
import type { PreparedStructure } from "./prepare";
import type { Topology } from "./topology";

/** EN 1993-1-1 5.2.1(3), eq. (5.1): first-order analysis may be used when αcr ≥ 10 (elastic analysis). */
export const ALPHA_CR_LIMIT = 10;

export type BucklingMode = {
  /** The factor on this result's loads at which the truss buckles in this mode (linear buckling). */
  alphaCr: number;
  /** Every joint that moves in the mode, largest first, with its direction. */
  joints: MovingJoint[];
  /** Full 3n mode shape (model node order), largest component 1 (for drawing). */
  shape: number[];
};

export type BucklingAnalysis = {
  /** The lowest positive critical factors found, ascending; empty when no load factor buckles the truss. */
  modes: BucklingMode[];
  /** Whether the reported factors settled to the tolerance within the iteration limit. */
  converged: boolean;
  iterations: number;
  /** Relative change of the reported factors between the last two iterations (the stated tolerance). */
  tolerance: number;
};

export type BucklingOptions = {
  /** How many of the lowest factors to find (3 unless told). */
  modes?: number;
  /** Relative change of the Ritz values between iterations below which they count as settled (1e-10). */
  tolerance?: number;
  /** Per pass (1000 unless told). */
  maxIterations?: number;
};

/** A x = −K_G x for every column of x (full 3n each), zero at restrained dofs. */
export function geometricProduct(topology: Topology, forces: Float64Array, x: Float64Array, columns: number): Float64Array {
  const { memberI, memberJ, direction: c, length, restrained } = topology;
  const dofs = restrained.length;
  const out = new Float64Array(dofs * columns);
  for (let e = 0; e < forces.length; e++) {
    const g = forces[e] / length[e];
    if (g === 0) continue;
    const a = 3 * memberI[e];
    const b = 3 * memberJ[e];
    const cx = c[3 * e];
    const cy = c[3 * e + 1];
    const cz = c[3 * e + 2];
    for (let col = 0; col < columns; col++) {
      const o = col * dofs;
      const dx = x[o + b] - x[o + a];
      const dy = x[o + b + 1] - x[o + a + 1];
      const dz = x[o + b + 2] - x[o + a + 2];
      const along = cx * dx + cy * dy + cz * dz;
      // G d, d = x_j − x_i; (A x)_i = +G d, (A x)_j = −G d
      const tx = g * (dx - along * cx);
      const ty = g * (dy - along * cy);
      const tz = g * (dz - along * cz);
      out[o + a] += tx;
      out[o + a + 1] += ty;
      out[o + a + 2] += tz;
      out[o + b] -= tx;
      out[o + b + 1] -= ty;
      out[o + b + 2] -= tz;
    }
  }
  for (let col = 0; col < columns; col++) for (let q = 0; q < dofs; q++) if (restrained[q]) out[col * dofs + q] = 0;
  return out;
}

function stiffnessProduct(structure: PreparedStructure, x: Float64Array, columns: number): Float64Array {
  const r = structure.topology.restrained;
  const dofs = r.length;
  const out = new Float64Array(dofs * columns);
  for (let col = 0; col < columns; col++) {
    const kx = structure.internalForces(x.subarray(col * dofs, (col + 1) * dofs));
    for (let q = 0; q < dofs; q++) out[col * dofs + q] = r[q] ? 0 : kx[q];
  }
  return out;
}

/** Orthonormal columns (modified Gram–Schmidt, twice); dependent columns are dropped. Returns the kept count. */
function orthonormalise(y: Float64Array, dofs: number, columns: number): number {
  let largest = 0;
  for (let col = 0; col < columns; col++) {
    let s = 0;
    for (let q = 0; q < dofs; q++) s += y[col * dofs + q] ** 2;
    largest = Math.max(largest, Math.sqrt(s));
  }
  if (largest === 0) return 0;
  let kept = 0;
  for (let col = 0; col < columns; col++) {
    const v = y.subarray(col * dofs, (col + 1) * dofs);
    let before = 0;
    for (let q = 0; q < dofs; q++) before += v[q] * v[q];
    before = Math.sqrt(before);
    for (let pass = 0; pass < 2; pass++) {
      for (let k = 0; k < kept; k++) {
        const b = y.subarray(k * dofs, (k + 1) * dofs);
        let dot = 0;
        for (let q = 0; q < dofs; q++) dot += v[q] * b[q];
        for (let q = 0; q < dofs; q++) v[q] -= dot * b[q];
      }
    }
    let norm = 0;
    for (let q = 0; q < dofs; q++) norm += v[q] * v[q];
    norm = Math.sqrt(norm);
    if (norm <= 1e-10 * largest || norm <= 1e-8 * before) continue;
    const target = y.subarray(kept * dofs, (kept + 1) * dofs);
    for (let q = 0; q < dofs; q++) target[q] = v[q] / norm;
    kept++;
  }
  return kept;
}

function dotColumns(x: Float64Array, y: Float64Array, dofs: number, i: number, j: number): number {
  let s = 0;
  for (let q = 0; q < dofs; q++) s += x[i * dofs + q] * y[j * dofs + q];
  return s;
}

type Pass = { values: number[]; x: Float64Array; columns: number; invariant: boolean; converged: boolean; iterations: number; change: number };

/**
 * Which Ritz values (positions in the sorted list) must settle: the `wanted` largest positive ones among all but the
 * last two (the trailing Ritz values converge slowest and stand guard), else the first (to learn the spectrum). When the
 * block spans all of A's range (fewer independent columns than asked for), the subspace is invariant and all count.
 */
function watchedRitz(values: number[], wanted: number, sigma: number, invariant: boolean): number[] {
  const reach = invariant ? values.length : sigma === 0 ? Math.max(1, values.length - 2) : Math.min(wanted, values.length);
  const positive: number[] = [];
  for (let k = 0; k < reach && positive.length < wanted; k++) if (values[k] > 0) positive.push(k);
  return positive.length > 0 ? positive : [0];
}

/** Subspace iteration on K⁻¹(A + σK) with Rayleigh–Ritz on the unshifted pencil (A, K). */
function iterate(structure: PreparedStructure, forces: Float64Array, start: Float64Array, columns: number, sigma: number, wanted: number, tolerance: number, maxIterations: number): Pass {
  const dofs = structure.topology.restrained.length;
  let x = start;
  const requested = columns;
  const free = structure.topology.restrained.reduce((count, fixed) => count + (fixed ? 0 : 1), 0);
  let previous: number[] = [];
  let values: number[] = [];
  let change = Infinity;
  for (let iteration = 1; iteration <= maxIterations; iteration++) {
    const y = structure.solveColumns(geometricProduct(structure.topology, forces, x, columns), columns);
    if (sigma !== 0) for (let q = 0; q < y.length; q++) y[q] += sigma * x[q];
    const r = orthonormalise(y, dofs, columns);
    if (r === 0) return { values: [], x: y, columns: 0, invariant: true, converged: true, iterations: iteration, change: 0 };
    const invariant = r < requested || r === free; // a block as large as the free dofs spans everything
    const ky = stiffnessProduct(structure, y, r);
    const ay = geometricProduct(structure.topology, forces, y, r);
    const kr = new Float64Array(r * r);
    const ar = new Float64Array(r * r);
    for (let i = 0; i < r; i++) {
      for (let j = 0; j <= i; j++) {
        kr[i * r + j] = kr[j * r + i] = 0.5 * (dotColumns(y, ky, dofs, i, j) + dotColumns(y, ky, dofs, j, i));
        ar[i * r + j] = ar[j * r + i] = 0.5 * (dotColumns(y, ay, dofs, i, j) + dotColumns(y, ay, dofs, j, i));
      }
    }
    const { values: mu, vectors: q } = generalizedSymmetricEigen(ar, kr, r);
    const order = Array.from(mu.keys()).sort((i, j) => (sigma === 0 ? Math.abs(mu[j]) - Math.abs(mu[i]) : mu[j] - mu[i]));
    const next = new Float64Array(dofs * r);
    order.forEach((k, col) => {
      for (let i = 0; i < r; i++) {
        const w = q[i * r + k];
        if (w === 0) continue;
        for (let dof = 0; dof < dofs; dof++) next[col * dofs + dof] += w * y[i * dofs + dof];
      }
    });
    x = next;
    columns = r;
    values = order.map((k) => mu[k]);
    const scale = Math.max(...values.map(Math.abs));
    change = 0;
    for (const k of watchedRitz(values, wanted, sigma, invariant)) change = Math.max(change, previous.length > k ? Math.abs(values[k] - previous[k]) / scale : Infinity);
    if (scale === 0) return { values: [], x, columns, invariant, converged: true, iterations: iteration, change: 0 };
    if (change <= tolerance) return { values, x, columns, invariant, converged: true, iterations: iteration, change };
    previous = values;
  }
  return { values, x, columns, invariant: false, converged: false, iterations: maxIterations, change };
}

/**
 * The lowest critical load factors αcr of a stable, factored structure under the member forces of one result
 * (kN, model member order), with their modes. The structure's factor must not have been released.
 */
export function bucklingModes(structure: PreparedStructure, forces: Float64Array, options: BucklingOptions = {}): BucklingAnalysis {
  const wanted = options.modes ?? 3;
  const tolerance = options.tolerance ?? 1e-10;
  const maxIterations = options.maxIterations ?? 1000;
  const { restrained } = structure.topology;
  const dofs = restrained.length;
  const free = restrained.reduce((count, r) => count + (r ? 0 : 1), 0);
  const columns = Math.min(free, Math.max(2 * wanted, wanted + 6));
  if (columns === 0) return { modes: [], converged: true, iterations: 0, tolerance: 0 };

  // deterministic start (mulberry-style hash of the dof): failures reproduce and every mode has a component
  const start = new Float64Array(dofs * columns);
  for (let col = 0; col < columns; col++) {
    for (let q = 0; q < dofs; q++) {
      if (restrained[q]) continue;
      let h = Math.imul((q + 1) ^ 0x9e3779b9, 0x85ebca6b) ^ Math.imul(col + 7, 0xc2b2ae35);
      h ^= h >>> 13;
      h = Math.imul(h, 0x27d4eb2f);
      h ^= h >>> 16;
      start[col * dofs + q] = (h >>> 0) / 4294967296 - 0.5;
    }
  }

  const first = iterate(structure, forces, start, columns, 0, wanted, tolerance, maxIterations);
  let pass = first;
  let iterations = pass.iterations;
  // no positive value among the reliable Ritz values: the negative spectrum dominates, shift it below the positive one
  if (pass.values.length > 0 && watchedRitz(pass.values, wanted, 0, pass.invariant).every((k) => !(pass.values[k] > 0))) {
    const sigma = -Math.min(...pass.values);
    const restart = new Float64Array(dofs * columns);
    restart.set(pass.x.subarray(0, Math.min(pass.x.length, restart.length)));
    restart.set(start.subarray(pass.x.length), pass.x.length);
    pass = iterate(structure, forces, restart, columns, sigma, wanted, tolerance, maxIterations);
    iterations += pass.iterations;
  }
  const scale = Math.max(0, ...pass.values.map(Math.abs));
  const modes: BucklingMode[] = [];
  const reported = new Set(watchedRitz(pass.values, wanted, pass === first ? 0 : 1, pass.invariant));
  pass.values.forEach((mu, col) => {
    if (!reported.has(col) || !(mu > 1e-12 * scale)) return;
    const { joints, shape } = movingJoints(structure.nodeIds, pass.x.subarray(col * dofs, (col + 1) * dofs));
    modes.push({ alphaCr: 1 / mu, joints, shape });
  });
  modes.sort((a, b) => a.alphaCr - b.alphaCr);
  return { modes, converged: pass.converged, iterations, tolerance: pass.change };
}
