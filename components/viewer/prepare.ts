// Packs a model once per revision into the typed arrays the layers draw from.
import { buildMemberEnds, buildNodeTable, modelBounds, modelSpan, type NodeTable } from "./filters";
import { typicalMemberLength } from "./geometry";
import type { MemberGroup, ViewerModel, ViewerNodalLoad } from "./types";

export interface PreparedModel {
  model: ViewerModel;
  memberIds: string[];
  memberIndex: Map<string, number>;
  nodes: NodeTable;
  ends: Int32Array;
  groups: Record<string, MemberGroup>;
  unitLength: number;
  span: number;
  centre: [number, number, number];
  /** Radius of the sphere around the centre that holds every node. */
  radius: number;
  minZ: number;
}

/** Packs node positions and member ends, and measures the model for glyph sizes and the camera. */
export function prepareModel(model: ViewerModel, groups: Record<string, MemberGroup>): PreparedModel {
  const nodes = buildNodeTable(model);
  const ends = buildMemberEnds(model, nodes);
  const p = nodes.positions;
  const bounds = modelBounds(p);
  const min = bounds?.min ?? [0, 0, 0];
  const max = bounds?.max ?? [0, 0, 0];
  const centre: [number, number, number] = [(min[0] + max[0]) / 2, (min[1] + max[1]) / 2, (min[2] + max[2]) / 2];
  const radius = bounds ? Math.max(1e-3, Math.hypot(max[0] - min[0], max[1] - min[1], max[2] - min[2]) / 2) : 1;
  return {
    model,
    memberIds: model.members.map((m) => m.id),
    memberIndex: new Map(model.members.map((m, k) => [m.id, k])),
    nodes,
    ends,
    groups,
    unitLength: typicalMemberLength(p, ends),
    span: modelSpan(p) || 1,
    centre,
    radius,
    minZ: min[2],
  };
}

/** Nodal loads of a load case, or the factored sum over a combination's cases. Self-weight is not a nodal load. */
export function nodalLoadsFor(model: ViewerModel, resultId: string): ViewerNodalLoad[] {
  const direct = model.loadCases.find((c) => c.id === resultId);
  if (direct) return direct.nodalLoads;
  const combination = model.combinations.find((c) => c.id === resultId);
  if (!combination) return [];
  const sum = new Map<string, ViewerNodalLoad>();
  for (const [caseId, factor] of Object.entries(combination.factors)) {
    for (const load of model.loadCases.find((c) => c.id === caseId)?.nodalLoads ?? []) {
      const acc = sum.get(load.node) ?? { node: load.node, fx: 0, fy: 0, fz: 0 };
      acc.fx += factor * load.fx;
      acc.fy += factor * load.fy;
      acc.fz += factor * load.fz;
      sum.set(load.node, acc);
    }
  }
  return [...sum.values()];
}

/**
 * How many load arrows any result of the model can need: one per load of a load case (which may list two loads on
 * one node), or one per node for a combination (which sums them per node).
 */
export function loadArrowCapacity(model: ViewerModel): number {
  return Math.max(model.nodes.length, ...model.loadCases.map((c) => c.nodalLoads.length));
}

/** Label of a result id: the load case's or combination's name, with its id. */
export function resultLabel(model: ViewerModel, resultId: string): string {
  const named = model.loadCases.find((c) => c.id === resultId) ?? model.combinations.find((c) => c.id === resultId);
  return named ? `${named.id} ${named.name}` : resultId;
}

/**
 * The result to compare the chosen one with when compare mode is entered: the next one in display order (the next
 * combination after a combination), else the one before; null when there is no other result.
 */
export function defaultCompareResult(ids: readonly string[], current: string | null): string | null {
  const others = ids.filter((id) => id !== current);
  if (others.length === 0) return null;
  const at = current === null ? -1 : ids.indexOf(current);
  if (at < 0) return others[0];
  return ids[at + 1] ?? ids[at - 1] ?? others[0];
}
