// Mechanism modes: how an unstable truss actually moves, every joint that moves and its direction of motion.
//
// The factor flags an unknown k whose pivot is tiny and factors the rest as if k were held. Then
// v = e_k − K_oo⁻¹ K_ok (one solve with the k-th column of K) satisfies (K v)_o = 0 exactly and (K v)_k = the tiny
// Schur pivot: v is a null vector of K, the motion the mechanism allows, found from the factor alone. Its Rayleigh
// quotient vᵀKv / vᵀv against the members' stiffness tells a true mechanism (rounding, ~1e-16) from a nearly
// singular one (a joint kinked by a hair, stiffness ~ angle²).
import type { PreparedStructure } from "./prepare";

/** Rayleigh quotient over the largest member stiffness below which a mode is a true mechanism (rounding level). */
export const EXACT_MECHANISM = 1e-13;
/** A kept pivot below this fraction of its node's stiffness marks a joint held only by a nearly weightless member. */
export const NEAR_MECHANISM_PIVOT = 1e-6;
/** Joints moving less than this fraction of the largest motion are left out of a mode's description. */
const MOVING = 0.02;

export type MovingJoint = { node: string; share: number; direction: [number, number, number] };
export type MechanismMode = {
  kind: "mechanism" | "nearly a mechanism";
  /** vᵀKv / (vᵀv · largest member stiffness): 0 for a true mechanism. */
  stiffnessRatio: number;
  /** Every joint that moves (share = its motion over the largest), largest first. */
  joints: MovingJoint[];
  /** Full 3n motion, largest component 1 (for drawing). */
  shape: number[];
};

const axisWords = ["x", "y", "z"];

export function describeDirection([x, y, z]: [number, number, number]): string {
  const parts = [x, y, z]
    .map((v, s) => ({ v, s }))
    .filter(({ v }) => Math.abs(v) >= 0.05)
    .sort((a, b) => Math.abs(b.v) - Math.abs(a.v))
    .map(({ v, s }) => `${v < 0 ? "−" : "+"}${Math.abs(v).toFixed(2)} ${axisWords[s]}`);
  return parts.join(", ");
}

/** One line per mode in plain words. */
export function describeModes(modes: MechanismMode[]): string[] {
  return modes.map((mode, k) => {
    const listed = mode.joints.slice(0, 12).map((j) => `${j.node} (${describeDirection(j.direction)}${j.share < 0.995 ? `, ${(100 * j.share).toFixed(0)} %` : ""})`);
    const more = mode.joints.length > listed.length ? ` and ${mode.joints.length - listed.length} more` : "";
    const head = mode.kind === "mechanism" ? `Mechanism ${k + 1}: these joints move together with nothing resisting` : `Nearly a mechanism ${k + 1}: these joints move with almost nothing resisting (stiffness ratio ${mode.stiffnessRatio.toExponential(1)}; small-displacement results would not hold)`;
    return `${head}: ${listed.join("; ")}${more}. Add members or supports that resist this motion.`;
  });
}

function rayleigh(structure: PreparedStructure, v: Float64Array, scale: number): number {
  const kv = structure.internalForces(v);
  const r = structure.topology.restrained;
  let num = 0;
  let den = 0;
  for (let q = 0; q < v.length; q++) {
    if (r[q]) continue;
    num += v[q] * kv[q];
    den += v[q] * v[q];
  }
  return den === 0 ? 0 : num / den / scale;
}

/** Every joint of a motion v (full 3n) that moves, largest first, and the motion scaled to a largest component of 1. */
export function movingJoints(nodeIds: string[], v: Float64Array): { joints: MovingJoint[]; shape: number[] } {
  const n = nodeIds.length;
  let largest = 0;
  for (let k = 0; k < n; k++) largest = Math.max(largest, Math.hypot(v[3 * k], v[3 * k + 1], v[3 * k + 2]));
  let peak = 0;
  for (const x of v) peak = Math.max(peak, Math.abs(x));
  const joints: MovingJoint[] = [];
  for (let k = 0; k < n; k++) {
    const size = Math.hypot(v[3 * k], v[3 * k + 1], v[3 * k + 2]);
    if (size < MOVING * largest) continue;
    joints.push({ node: nodeIds[k], share: size / largest, direction: [v[3 * k] / size, v[3 * k + 1] / size, v[3 * k + 2] / size] });
  }
  joints.sort((a, b) => b.share - a.share);
  return { joints, shape: Array.from(v, (x) => (peak === 0 ? 0 : x / peak)) };
}

function modeOf(structure: PreparedStructure, v: Float64Array, scale: number): MechanismMode {
  const { joints, shape } = movingJoints(structure.nodeIds, v);
  const ratio = rayleigh(structure, v, scale);
  return { kind: ratio < EXACT_MECHANISM ? "mechanism" : "nearly a mechanism", stiffnessRatio: Math.max(0, ratio), joints, shape };
}

function largestMemberStiffness(structure: PreparedStructure): number {
  let scale = 0;
  for (const k of structure.topology.axialStiffness) scale = Math.max(scale, k);
  return scale;
}

/** The mechanism modes of an unstable structure (orthonormal basis of the motions its flagged pivots allow). */
export function mechanismModes(structure: PreparedStructure): MechanismMode[] {
  const n = structure.nodeIds.length;
  const flagged = structure.instability.flatMap(({ node, directions }) => {
    const k = structure.topology.nodeIndex.get(node)!;
    return directions.map((d) => 3 * k + ["ux", "uy", "uz"].indexOf(d));
  });
  const units = flagged.map((dof) => {
    const e = new Float64Array(3 * n);
    e[dof] = 1;
    return structure.internalForces(e); // column dof of K
  });
  const solved = structure.solveMany(units);
  const basis: Float64Array[] = [];
  flagged.forEach((dof, k) => {
    const v = solved[k].map((x) => -x);
    v[dof] += 1;
    // Gram–Schmidt against the modes already found: flagged pivots of one mechanism give dependent vectors
    for (const b of basis) {
      let dot = 0;
      for (let q = 0; q < v.length; q++) dot += v[q] * b[q];
      for (let q = 0; q < v.length; q++) v[q] -= dot * b[q];
    }
    let norm = 0;
    for (const x of v) norm += x * x;
    norm = Math.sqrt(norm);
    if (norm < 1e-8) return;
    basis.push(v.map((x) => x / norm));
  });
  const scale = largestMemberStiffness(structure);
  return basis.map((v) => modeOf(structure, v, scale));
}

/**
 * For a stable structure whose smallest kept pivot is tiny (a joint held by a nearly weightless member): the
 * near-mechanism motion by one inverse-iteration step from that dof; null when no pivot is that small.
 */
export function nearMechanism(structure: PreparedStructure): MechanismMode | null {
  const p = structure.smallestPivot;
  if (!p || p.ratio >= NEAR_MECHANISM_PIVOT) return null;
  const e = new Float64Array(3 * structure.nodeIds.length);
  e[p.dof] = 1;
  const v = structure.solve(e);
  let norm = 0;
  for (const x of v) norm += x * x;
  const mode = modeOf(structure, v.map((x) => x / Math.sqrt(norm)), largestMemberStiffness(structure));
  return { ...mode, kind: "nearly a mechanism" };
}
