import { loadVectorForCase } from "./loads";
import type { TrussModel } from "./model";
import { describeModes, mechanismModes, nearMechanism, type MechanismMode } from "./mechanism";
import { planSpan } from "./plan-span";
import { prepareStructure, type Direction, type Instability, type PreparedStructure } from "./prepare";

export type CaseResult = {
  memberForces: Record<string, number>;
  reactions: Record<string, { fx: number; fy: number; fz: number }>;
  displacements: Record<string, { ux: number; uy: number; uz: number }>;
  zeroForceMembers: string[];
  equilibriumResidual: number;
};

export type EnvelopeEntry = { maxTension: number; maxCompression: number; zeroInAll: boolean };

/** Extra information, kept under one key so the design.md result keys stay exact. */
export type AnalysisInfo = {
  /** Maxwell count m + r against 3j: information only, the factorisation decides stability. */
  countCheck: { members: number; reactionComponents: number; joints: number; difference: number; reading: string };
  /**
   * What the envelope's largest tension and compression range over: combinations, or load cases when the model
   * has none. zeroInAll always ranges over every load case and every combination.
   */
  envelopeOver: "combinations" | "loadCases";
  /** Load cases that appear in no combination (only when the model has combinations): not in the envelope. */
  loadCasesInNoCombination: string[];
  /** Result ids giving each member's largest tension and compression (null when it never has that sign). */
  governing: Record<string, { maxTension: string | null; maxCompression: string | null }>;
  /** Members below the threshold (kN) yet not zero-force, per result; only when a threshold was given. */
  lowForce?: { threshold: number; members: Record<string, string[]>; lowInAll: string[] };
  /** The mechanism in plain words, one line per mode. */
  instabilityText?: string[];
  /** How the structure can move when unstable: every moving joint and its direction (mechanism.ts). */
  mechanismModes?: MechanismMode[];
  /** Nearly a mechanism (a joint held only by a nearly weightless member), or displacements beyond span/50. */
  warnings: string[];
  /** The near-mechanism motion behind the first warning, when there is one. */
  nearMechanism?: MechanismMode;
  solver: { dofs: number; equations: number; nonzerosK: number; nonzerosL: number };
};

/**
 * The analysis result of design.md. `maxCompression` is signed (<= 0 kN, tension positive throughout);
 * `maxTension` is >= 0; a result where the member is zero-force counts as 0 for both. When the structure is unstable, results, envelope and zeroInAll are empty.
 */
export type AnalysisResult = {
  status: "ok" | "unstable";
  instability?: Instability[];
  results: Record<string, CaseResult>;
  envelope: Record<string, EnvelopeEntry>;
  zeroInAll: string[];
  info: AnalysisInfo;
};

export type AnalyzeOptions = { lowForceThreshold?: number };

/** A member is zero-force when |N| <= 1e-6 x the largest |N| of that result, or <= 1e-9 kN (design.md). */
export function zeroForceMask(forces: Float64Array): Uint8Array {
  let largest = 0;
  for (let e = 0; e < forces.length; e++) largest = Math.max(largest, Math.abs(forces[e]));
  const limit = Math.max(1e-6 * largest, 1e-9);
  const mask = new Uint8Array(forces.length);
  for (let e = 0; e < forces.length; e++) mask[e] = Math.abs(forces[e]) <= limit ? 1 : 0;
  return mask;
}

const directionWords = { ux: "x", uy: "y", uz: "z" } as const;

/** Plain-words description of each free node of a mechanism. */
export function describeInstability(instability: Instability[]): string[] {
  return instability.map(
    ({ node, directions }) =>
      `Node ${node} is free to move along ${directions.map((d) => directionWords[d]).join(", ").replace(/, (?=[^,]*$)/, " and ")}: no member or support holds it in ` +
      `${directions.length > 1 ? "those directions" : "that direction"} (a mechanism). Add a member or a support there.`,
  );
}

/**
 * The design.md instability list from the mechanism modes: every moving joint with the axes along which it moves
 * (components of at least 10 % of its motion), not the one pivot that happened to be flagged.
 */
export function instabilityFromModes(modes: MechanismMode[]): Instability[] {
  const byNode = new Map<string, Set<Direction>>();
  for (const mode of modes) {
    for (const joint of mode.joints) {
      const set = byNode.get(joint.node) ?? new Set<Direction>();
      joint.direction.forEach((v, s) => Math.abs(v) >= 0.1 && set.add((["ux", "uy", "uz"] as const)[s]));
      byNode.set(joint.node, set);
    }
  }
  return [...byNode.entries()].map(([node, set]) => ({ node, directions: [...set].sort() }));
}

/** Small-displacement theory: warn where a displacement exceeds span/50 (common practice, from memory). */
export const LARGE_DISPLACEMENT_FRACTION = 1 / 50;

function largeDisplacementWarnings(model: TrussModel, results: Record<string, CaseResult>): string[] {
  const span = planSpan(model);
  const limit = span * LARGE_DISPLACEMENT_FRACTION;
  const out: string[] = [];
  for (const [id, r] of Object.entries(results)) {
    let worst = 0;
    let where = "";
    for (const [node, d] of Object.entries(r.displacements)) {
      const size = Math.hypot(d.ux, d.uy, d.uz);
      if (size > worst) {
        worst = size;
        where = node;
      }
    }
    if (worst > limit) {
      out.push(`${id}: node ${where} moves ${worst.toPrecision(3)} m, more than span/50 = ${limit.toPrecision(3)} m: small-displacement theory no longer holds, so these results are not reliable.`);
    }
  }
  return out;
}

function countCheck(model: TrussModel): AnalysisInfo["countCheck"] {
  const reactionComponents = model.supports.reduce((sum, s) => sum + Number(s.ux) + Number(s.uy) + Number(s.uz), 0);
  const members = model.members.length;
  const joints = model.nodes.length;
  const difference = members + reactionComponents - 3 * joints;
  const reading =
    difference < 0
      ? "m + r < 3j: too few members and reaction components, so the truss is a mechanism"
      : difference === 0
        ? "m + r = 3j: statically determinate if geometrically stable"
        : `m + r > 3j: statically indeterminate to degree ${difference} if geometrically stable`;
  return { members, reactionComponents, joints, difference, reading };
}

function caseResult(s: PreparedStructure, u: Float64Array, f: Float64Array): { result: CaseResult; forces: Float64Array } {
  const { nodeIds, memberIds, topology } = s;
  const forces = s.memberForces(u);
  const internal = s.internalForces(u);
  const memberForces: CaseResult["memberForces"] = {};
  const zero = zeroForceMask(forces);
  const zeroForceMembers: string[] = [];
  memberIds.forEach((id, e) => {
    memberForces[id] = forces[e];
    if (zero[e]) zeroForceMembers.push(id);
  });
  const displacements: CaseResult["displacements"] = {};
  const reactions: CaseResult["reactions"] = {};
  let residual = 0;
  const r = topology.restrained;
  for (let q = 0; q < internal.length; q++) {
    internal[q] -= f[q]; // now the nodal imbalance: the reaction where restrained, the residual elsewhere
    if (!r[q]) residual = Math.max(residual, Math.abs(internal[q]));
  }
  nodeIds.forEach((id, k) => {
    const q = 3 * k;
    displacements[id] = { ux: u[q], uy: u[q + 1], uz: u[q + 2] };
    if (r[q] || r[q + 1] || r[q + 2]) {
      reactions[id] = { fx: r[q] ? internal[q] : 0, fy: r[q + 1] ? internal[q + 1] : 0, fz: r[q + 2] ? internal[q + 2] : 0 };
    }
  });
  return { result: { memberForces, reactions, displacements, zeroForceMembers, equilibriumResidual: residual }, forces };
}

/** Analyses every load case and combination of a validated model with one factorisation. */
export function analyzeModel(model: TrussModel, options: AnalyzeOptions = {}): AnalysisResult {
  const structure = prepareStructure(model);
  const info: AnalysisInfo = {
    countCheck: countCheck(model),
    envelopeOver: model.combinations.length > 0 ? "combinations" : "loadCases",
    loadCasesInNoCombination:
      model.combinations.length > 0 ? model.loadCases.filter((c) => !model.combinations.some((k) => (k.factors[c.id] ?? 0) !== 0)).map((c) => c.id) : [],
    governing: {},
    warnings: [],
    solver: structure.stats,
  };
  if (structure.status === "unstable") {
    const modes = mechanismModes(structure);
    info.mechanismModes = modes;
    info.instabilityText = describeModes(modes);
    return { status: "unstable", instability: instabilityFromModes(modes), results: {}, envelope: {}, zeroInAll: [], info };
  }
  const near = nearMechanism(structure);
  if (near) {
    info.nearMechanism = near;
    info.warnings.push(...describeModes([near]));
  }

  const results: Record<string, CaseResult> = {};
  const forcesById = new Map<string, Float64Array>();
  const caseVectors = new Map<string, { u: Float64Array; f: Float64Array }>();
  const loadVectors = model.loadCases.map((c) => loadVectorForCase(model, c.id, structure.topology));
  const displacementVectors = structure.solveMany(loadVectors);
  structure.release(); // every solve is done: the results below need the memory more than the factor
  for (const [k, loadCase] of model.loadCases.entries()) {
    const f = loadVectors[k];
    const u = displacementVectors[k];
    caseVectors.set(loadCase.id, { u, f });
    const { result, forces } = caseResult(structure, u, f);
    results[loadCase.id] = result;
    forcesById.set(loadCase.id, forces);
  }
  const dofs = 3 * structure.nodeIds.length;
  for (const combo of model.combinations) {
    const u = new Float64Array(dofs);
    const f = new Float64Array(dofs);
    for (const [caseId, factor] of Object.entries(combo.factors)) {
      const v = caseVectors.get(caseId)!;
      for (let q = 0; q < dofs; q++) {
        u[q] += factor * v.u[q];
        f[q] += factor * v.f[q];
      }
    }
    const { result, forces } = caseResult(structure, u, f);
    results[combo.id] = result;
    forcesById.set(combo.id, forces);
  }

  const envelopeIds = info.envelopeOver === "combinations" ? model.combinations.map((c) => c.id) : model.loadCases.map((c) => c.id);
  const envelope: Record<string, EnvelopeEntry> = {};
  const zeroInAll: string[] = [];
  const masks = envelopeIds.map((id) => zeroForceMask(forcesById.get(id)!));
  const envelopeForces = envelopeIds.map((id) => forcesById.get(id)!);
  // zero in all: every load case and every combination (a member can work in a case and cancel in the combinations)
  const allMasks = [...forcesById.values()].map((forces) => zeroForceMask(forces));
  structure.memberIds.forEach((memberId, e) => {
    let maxTension = 0;
    let maxCompression = 0;
    let tensionId: string | null = null;
    let compressionId: string | null = null;
    let zeroEverywhere = true;
    envelopeIds.forEach((id, k) => {
      if (masks[k][e]) return; // rounding noise of a zero-force result must not count as tension or compression
      const value = envelopeForces[k][e];
      if (value > maxTension) {
        maxTension = value;
        tensionId = id;
      }
      if (value < maxCompression) {
        maxCompression = value;
        compressionId = id;
      }
    });
    for (const mask of allMasks) if (!mask[e]) zeroEverywhere = false;
    // with no results at all nothing is known, so no member is called zero in all
    if (allMasks.length === 0) zeroEverywhere = false;
    envelope[memberId] = { maxTension, maxCompression, zeroInAll: zeroEverywhere };
    info.governing[memberId] = { maxTension: tensionId, maxCompression: compressionId };
    if (zeroEverywhere) zeroInAll.push(memberId);
  });

  if (options.lowForceThreshold !== undefined) {
    const threshold = options.lowForceThreshold;
    const members: Record<string, string[]> = {};
    for (const [id, result] of Object.entries(results)) {
      const zero = new Set(result.zeroForceMembers);
      members[id] = structure.memberIds.filter((m) => !zero.has(m) && Math.abs(result.memberForces[m]) <= threshold);
    }
    const lowInAll = structure.memberIds.filter(
      (m) => !envelope[m].zeroInAll && envelope[m].maxTension <= threshold && -envelope[m].maxCompression <= threshold,
    );
    info.lowForce = { threshold, members, lowInAll };
  }

  info.warnings.push(...largeDisplacementWarnings(model, results));
  return { status: "ok", results, envelope, zeroInAll, info };
}
