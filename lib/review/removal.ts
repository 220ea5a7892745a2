// Removal what-if: take members out, optionally add a load case, and re-analyse with the intact factor.
import { describeInstability, loadVectorForCase, prepareStructure, zeroForceMask, type Combination, type Instability, type LoadCase, type TrussModel } from "@/lib/analysis";
import { buildTopology } from "@/lib/analysis/topology";
import { STANDING_CAUTION } from "./caution";
import type { ReviewContext } from "./context";
import { axialUtilisation } from "./design-checks/member-check";
import { lowRankRemoval } from "./low-rank";
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
 * A compression member that lost a brace: a removed member, not in line with it, framed into one of its end
 * joints. It is re-checked with its buckling length doubled (Lc = 2·K·L), i.e. as if that joint were held only by
 * the next joint along the member's line. A screening assumption, not a stability analysis of the joint.
 */
export type LostBrace = {
  member: string;
  joints: string[];
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
  const { model, structure, memberIndex, inputs, options } = context;
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
    // Rare path: factor the reduced model to say which joints are free.
    const instability = prepareStructure(reduced).instability;
    return { removed: request.remove, mechanism: true, instability, instabilityText: describeInstability(instability), caution: STANDING_CAUTION };
  }

  // Loads of the reduced model (removed members no longer weigh anything), solved with the intact factor.
  const reducedTopology = buildTopology(reduced);
  const intactWithAdded: TrussModel = { ...reduced, members: model.members };
  const before = new Map(context.forces);
  const after = new Map<string, Float64Array>();
  for (const loadCase of reduced.loadCases) {
    const u = update.update(structure.solve(loadVectorForCase(reduced, loadCase.id, reducedTopology)));
    after.set(loadCase.id, structure.memberForces(u));
    if (!before.has(loadCase.id)) before.set(loadCase.id, structure.memberForces(structure.solve(loadVectorForCase(intactWithAdded, loadCase.id, structure.topology))));
  }
  for (const combination of reduced.combinations) {
    after.set(combination.id, combine(combination, after, model.members.length));
    if (!before.has(combination.id)) before.set(combination.id, combine(combination, before, model.members.length));
  }
  for (const forces of after.values()) for (const e of removedIdx) forces[e] = 0;

  const maxListed = request.maxListed ?? 50;
  const changes = [...after.keys()].map((id) => compareForces(id, before.get(id)!, after.get(id)!, removedMask, model, maxListed));

  const designIds = reduced.combinations.length > 0 ? reduced.combinations.map((c) => c.id) : reduced.loadCases.map((c) => c.id);
  const utilBefore = governingUtilisations(options.standard, inputs, designIds.map((id) => before.get(id)!), removedMask);
  const utilAfter = governingUtilisations(options.standard, inputs, designIds.map((id) => after.get(id)!), removedMask);
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
    lostBraces: lostBraces(context, removedIdx, removedMask, designIds, after),
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
  let largest = 0;
  for (let e = 0; e < before.length; e++) if (!removed[e]) largest = Math.max(largest, Math.abs(before[e]), Math.abs(after[e]));
  // Same tolerance as the zero-force rule of design.md: smaller differences are rounding.
  const tolerance = Math.max(1e-6 * largest, 1e-9);
  const zeroBefore = zeroForceMask(before.map((v, e) => (removed[e] ? 0 : v)));
  const zeroAfter = zeroForceMask(after);
  const all: ForceChange[] = [];
  const newlyZero: string[] = [];
  const noLongerZero: string[] = [];
  for (let e = 0; e < before.length; e++) {
    if (removed[e]) continue;
    const delta = after[e] - before[e];
    const id = model.members[e].id;
    if (Math.abs(delta) > tolerance) all.push({ member: id, before: before[e], after: after[e], delta });
    if (zeroAfter[e] && !zeroBefore[e]) newlyZero.push(id);
    if (!zeroAfter[e] && zeroBefore[e]) noLongerZero.push(id);
  }
  all.sort((p, q) => Math.abs(q.delta) - Math.abs(p.delta));
  return { result, changedCount: all.length, changes: all.slice(0, maxListed), newlyZero, noLongerZero };
}

function lostBraces(context: ReviewContext, removedIdx: number[], removed: Uint8Array, designIds: string[], after: Map<string, Float64Array>): LostBrace[] {
  const { structure, inputs, model, options } = context;
  const { adjStart, adjMember, direction, memberI, memberJ, nodeIds } = structure.topology;
  const braced = new Map<number, { joints: Set<string>; removed: Set<string> }>();
  for (const r of removedIdx) {
    for (const a of [memberI[r], memberJ[r]]) {
      if (fullyRestrained(structure.topology.restrained, a)) continue; // a support holds the joint itself
      for (let p = adjStart[a]; p < adjStart[a + 1]; p++) {
        const m = adjMember[p];
        if (removed[m]) continue;
        const cos = direction[3 * m] * direction[3 * r] + direction[3 * m + 1] * direction[3 * r + 1] + direction[3 * m + 2] * direction[3 * r + 2];
        if (Math.abs(cos) > 1 - 1e-9) continue; // in line: it never held the joint across the member
        const entry = braced.get(m) ?? { joints: new Set(), removed: new Set() };
        entry.joints.add(nodeIds[a]);
        entry.removed.add(model.members[r].id);
        braced.set(m, entry);
      }
    }
  }
  const zeroAfter = new Map(designIds.map((id) => [id, zeroForceMask(after.get(id)!)]));
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
      out.push({ member: model.members[m].id, joints: [...entry.joints], removedMembers: [...entry.removed], utilisationAfter: worst.usual, utilisationWithoutBrace: worst.doubled, result: worst.result });
    }
  }
  return out.sort((p, q) => q.utilisationWithoutBrace - p.utilisationWithoutBrace);
}

/** True when all three translations of node a are restrained. */
export function fullyRestrained(restrained: Uint8Array, a: number): boolean {
  return restrained[3 * a] === 1 && restrained[3 * a + 1] === 1 && restrained[3 * a + 2] === 1;
}
