// Removal what-if: take members out, optionally add a load case, and re-analyse with the intact factor.
import { describeModes, instabilityFromModes, mechanismModes, type MechanismMode } from "@/lib/analysis";
import { loadVectorForCase, prepareStructure, zeroForceMask, type Combination, type Instability, type LoadCase, type TrussModel } from "@/lib/analysis";
import { buildTopology } from "@/lib/analysis/topology";
import { STANDING_CAUTION } from "./caution";
import type { ReviewContext } from "./context";
import { axialUtilisation } from "./design-checks/member-check";
import { lowRankRemoval } from "./low-rank";
import { BRACE_STIFFNESS_FACTOR, flexibilityBlock, weakestAcross } from "./restraint";
import { governingUtilisations } from "./member-design";

export type RemovalRequest = {
  remove: string[];
  /** An extra load case to analyse with and without the removal (e.g. hung services). */
  addLoadCase?: LoadCase;
  /** Extra combinations, which may use the added load case; they join the design check. */
  addCombinations?: Combination[];
  /** How many of the largest changes to list per result (all are counted); 50 unless told. */
  maxListed?: number;
};

export type ForceChange = { member: string; before: number; after: number; delta: number };
export type ResultChanges = {
  result: string;
  changedCount: number;
  changes: ForceChange[];
  newlyZero: string[];
  noLongerZero: string[];
};
export type UtilisationChange = { member: string; before: number; after: number };
/**
 * A compression member that lost a brace, judged by stability: at one of its end joints, where a removed member
 * framed in, the lateral stiffness across it from the reduced structure fell below the 4P/L a brace needs
 * (restraint.ts) while the intact roof met it. It is re-checked with its buckling length doubled (Lc = 2·K·L), as
 * if that joint were held only by the next joint along the member's line.
 */
export type LostBrace = {
  member: string;
  joints: string[];
  /** Per joint: the direction it loses its hold in and the stiffnesses (kN/m) before, after and needed. */
  restraints: { joint: string; direction: [number, number, number]; stiffnessBefore: number; stiffnessAfter: number; required: number }[];
  removedMembers: string[];
  /** Governing compression utilisation after the removal, with the usual and with the doubled buckling length. */
  utilisationAfter: number;
  utilisationWithoutBrace: number;
  result: string;
};

export type RemovalOutcome =
  | {
      removed: string[];
      mechanism: true;
      instability: Instability[];
      instabilityText: string[];
      /** How the roof would move without the removed members: every moving joint and its direction. */
      modes: MechanismMode[];
      caution: string;
    }
  | {
      removed: string[];
      mechanism: false;
      changes: ResultChanges[];
      utilisation: { maxBefore: number; maxAfter: number; changes: UtilisationChange[]; overCapacity: string[] };
      lostBraces: LostBrace[];
      caution: string;
    };

/** Removes members (and optionally adds a load case), then reports mechanism, force and utilisation changes. */
export function removalWhatIf(context: ReviewContext, request: RemovalRequest): RemovalOutcome {
  const { model, structure, memberIndex, inputs } = context;
  const removedIdx = request.remove.map((id) => {
    const e = memberIndex.get(id);
    if (e === undefined) throw new Error(`no member "${id}"`);
    return e;
  });
  const removedMask = new Uint8Array(model.members.length);
  for (const e of removedIdx) removedMask[e] = 1;
  const reduced: TrussModel = {
    ...model,
    members: model.members.filter((_, e) => !removedMask[e]),
    loadCases: request.addLoadCase ? [...model.loadCases, request.addLoadCase] : model.loadCases,
    combinations: [...model.combinations, ...(request.addCombinations ?? [])],
  };
  const update = lowRankRemoval(structure, removedIdx);
  if (update.mechanism) {
    // Rare path: factor the reduced model and find its mechanism modes (every joint that moves, and how).
    const modes = mechanismModes(prepareStructure(reduced));
    return { removed: request.remove, mechanism: true, instability: instabilityFromModes(modes), instabilityText: describeModes(modes), modes, caution: STANDING_CAUTION };
  }

  // The intact displacements come from the analysis; the removed members' self-weight no longer acts, so
  // their weight (loadVectorForCase on just those members) is taken off every self-weight case: one solve.
  let lostWeight: Float64Array | null = null;
  const without = (u: Float64Array, selfWeight: boolean) => {
    if (!selfWeight) return u;
    if (!lostWeight) {
      const weightModel: TrussModel = { ...model, members: model.members.filter((_, e) => removedMask[e]), loadCases: [{ id: "weight", name: "", category: "dead", selfWeight: true, nodalLoads: [] }] };
      lostWeight = structure.solve(loadVectorForCase(weightModel, "weight", buildTopology(weightModel)));
    }
    const lost = lostWeight;
    return u.map((v, q) => v - lost[q]);
  };
  const before = new Map(context.forces);
  const after = new Map<string, Float64Array>();
  for (const loadCase of reduced.loadCases) {
    let intact = context.displacements.get(loadCase.id);
    if (!intact) {
      const withAdded: TrussModel = { ...model, loadCases: [loadCase] };
      intact = structure.solve(loadVectorForCase(withAdded, loadCase.id, structure.topology));
      before.set(loadCase.id, structure.memberForces(intact));
    }
    after.set(loadCase.id, structure.memberForces(update.update(without(intact, loadCase.selfWeight))));
  }
  for (const combination of reduced.combinations) {
    after.set(combination.id, combine(combination, after, model.members.length));
    if (!before.has(combination.id)) before.set(combination.id, combine(combination, before, model.members.length));
  }
  for (const forces of after.values()) for (const e of removedIdx) forces[e] = 0;

  const maxListed = request.maxListed ?? 50;
  const changes = [...after.keys()].map((id) => compareForces(id, before.get(id)!, after.get(id)!, removedMask, model, maxListed));

  const designIds = reduced.combinations.length > 0 ? reduced.combinations.map((c) => c.id) : reduced.loadCases.map((c) => c.id);
  const sameDesign = designIds.length === context.designResults.length && designIds.every((id, k) => id === context.designResults[k]);
  const utilBefore = sameDesign ? context.utilisation : governingUtilisations(context.resistances, designIds.map((id) => before.get(id)!));
  const utilAfter = governingUtilisations(context.resistances, designIds.map((id) => after.get(id)!), removedMask);
  const utilChanges: UtilisationChange[] = [];
  let maxBefore = 0;
  let maxAfter = 0;
  const overCapacity: string[] = [];
  for (let e = 0; e < inputs.length; e++) {
    if (removedMask[e]) continue;
    maxBefore = Math.max(maxBefore, utilBefore[e]);
    maxAfter = Math.max(maxAfter, utilAfter[e]);
    if (utilAfter[e] > 1) overCapacity.push(model.members[e].id);
    if (Math.abs(utilAfter[e] - utilBefore[e]) > 1e-6) utilChanges.push({ member: model.members[e].id, before: utilBefore[e], after: utilAfter[e] });
  }
  utilChanges.sort((p, q) => Math.abs(q.after - q.before) - Math.abs(p.after - p.before));

  return {
    removed: request.remove,
    mechanism: false,
    changes,
    utilisation: { maxBefore, maxAfter, changes: utilChanges.slice(0, maxListed), overCapacity },
    lostBraces: lostBraces(context, removedIdx, removedMask, designIds, after, update.update),
    caution: STANDING_CAUTION,
  };
}

function combine(combination: Combination, caseForces: Map<string, Float64Array>, m: number): Float64Array {
  const out = new Float64Array(m);
  for (const [caseId, factor] of Object.entries(combination.factors)) {
    const f = caseForces.get(caseId)!;
    for (let e = 0; e < m; e++) out[e] += factor * f[e];
  }
  return out;
}

function compareForces(result: string, before: Float64Array, after: Float64Array, removed: Uint8Array, model: TrussModel, maxListed: number): ResultChanges {
  const m = before.length;
  const kept = new Float64Array(m);
  let largest = 0;
  for (let e = 0; e < m; e++) {
    if (removed[e]) continue;
    kept[e] = before[e];
    largest = Math.max(largest, Math.abs(before[e]), Math.abs(after[e]));
  }
  // Same tolerance as the zero-force rule of design.md: smaller differences are rounding.
  const tolerance = Math.max(1e-6 * largest, 1e-9);
  const zeroBefore = zeroForceMask(kept);
  const zeroAfter = zeroForceMask(after);
  const size = new Float64Array(m);
  let changedCount = 0;
  const newlyZero: string[] = [];
  const noLongerZero: string[] = [];
  for (let e = 0; e < m; e++) {
    if (removed[e]) continue;
    const delta = Math.abs(after[e] - before[e]);
    if (delta > tolerance) {
      size[changedCount++] = delta;
    }
    if (zeroAfter[e] && !zeroBefore[e]) newlyZero.push(model.members[e].id);
    if (!zeroAfter[e] && zeroBefore[e]) noLongerZero.push(model.members[e].id);
  }
  // The listed changes are the largest ones: find the cut-off with a native numeric sort, then collect.
  const listed = Math.min(maxListed, changedCount);
  const cutoff = listed === 0 ? Infinity : size.subarray(0, changedCount).sort()[changedCount - listed];
  const changes: ForceChange[] = [];
  for (let e = 0; e < m && changes.length < listed; e++) {
    if (removed[e]) continue;
    const delta = after[e] - before[e];
    if (Math.abs(delta) > tolerance && Math.abs(delta) >= cutoff) changes.push({ member: model.members[e].id, before: before[e], after: after[e], delta });
  }
  changes.sort((p, q) => Math.abs(q.delta) - Math.abs(p.delta));
  return { result, changedCount, changes, newlyZero, noLongerZero };
}

function lostBraces(
  context: ReviewContext,
  removedIdx: number[],
  removed: Uint8Array,
  designIds: string[],
  after: Map<string, Float64Array>,
  reduce: (u: Float64Array) => Float64Array,
): LostBrace[] {
  const { structure, inputs, model, options } = context;
  const { adjStart, adjMember, direction, memberI, memberJ, nodeIds } = structure.topology;
  const dofs = 3 * nodeIds.length;
  const zeroAfter = new Map(designIds.map((id) => [id, zeroForceMask(after.get(id)!)]));
  // largest compression after the removal over the design results (kN, positive)
  const compressionAfter = (m: number) => {
    let p = 0;
    for (const id of designIds) if (!zeroAfter.get(id)![m]) p = Math.max(p, -after.get(id)![m]);
    return p;
  };
  const braced = new Map<number, { joints: Set<string>; removed: Set<string>; restraints: LostBrace["restraints"] }>();
  const seenJoint = new Set<number>();
  for (const r of removedIdx) {
    for (const a of [memberI[r], memberJ[r]]) {
      if (fullyRestrained(structure.topology.restrained, a) || seenJoint.has(a)) continue; // a support holds the joint itself
      seenJoint.add(a);
      const members: number[] = [];
      for (let p = adjStart[a]; p < adjStart[a + 1]; p++) {
        const m = adjMember[p];
        if (removed[m] || compressionAfter(m) <= 0) continue;
        const cos = direction[3 * m] * direction[3 * r] + direction[3 * m + 1] * direction[3 * r + 1] + direction[3 * m + 2] * direction[3 * r + 2];
        if (Math.abs(cos) > 1 - 1e-9) continue; // in line: it never held the joint across the member
        members.push(m);
      }
      if (members.length === 0) continue;
      // the joint's flexibility, intact and reduced: three unit loads through the intact factor and the low-rank update
      const units = [0, 1, 2].map((s) => {
        const f = new Float64Array(dofs);
        f[3 * a + s] = 1;
        return f;
      });
      const intact = structure.solveMany(units);
      const F = flexibilityBlock(intact, a);
      const Fr = flexibilityBlock(intact.map(reduce), a);
      for (const m of members) {
        const c = direction.subarray(3 * m, 3 * m + 3);
        const required = (BRACE_STIFFNESS_FACTOR * compressionAfter(m)) / inputs[m].length;
        const before = weakestAcross(F, c);
        const afterHold = weakestAcross(Fr, c);
        if (!(before.stiffness >= required && afterHold.stiffness < required)) continue;
        const entry = braced.get(m) ?? { joints: new Set(), removed: new Set(), restraints: [] };
        entry.joints.add(nodeIds[a]);
        entry.removed.add(model.members[r].id);
        entry.restraints.push({ joint: nodeIds[a], direction: afterHold.direction, stiffnessBefore: before.stiffness, stiffnessAfter: afterHold.stiffness, required });
        braced.set(m, entry);
      }
    }
  }
  const out: LostBrace[] = [];
  for (const [m, entry] of braced) {
    const input = inputs[m];
    const doubled = { ...input, effectiveLengthFactor: 2 * input.effectiveLengthFactor };
    let worst: { result: string; usual: number; doubled: number } | null = null;
    for (const id of designIds) {
      const force = after.get(id)![m];
      if (force >= 0 || zeroAfter.get(id)![m]) continue;
      const u2 = axialUtilisation(options.standard, doubled, force);
      if (!worst || u2 > worst.doubled) worst = { result: id, usual: axialUtilisation(options.standard, input, force), doubled: u2 };
    }
    if (worst) {
      out.push({
        member: model.members[m].id,
        joints: [...entry.joints],
        restraints: entry.restraints,
        removedMembers: [...entry.removed],
        utilisationAfter: worst.usual,
        utilisationWithoutBrace: worst.doubled,
        result: worst.result,
      });
    }
  }
  return out.sort((p, q) => q.utilisationWithoutBrace - p.utilisationWithoutBrace);
}

/** True when all three translations of node a are restrained. */
export function fullyRestrained(restrained: Uint8Array, a: number): boolean {
  return restrained[3 * a] === 1 && restrained[3 * a + 1] === 1 && restrained[3 * a + 2] === 1;
}
