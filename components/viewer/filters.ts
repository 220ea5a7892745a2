// Pure member filters and node-position transforms. The mesh layer hides a member by giving its instance zero
// scale, so filtering never rebuilds geometry either.
import { STATE_CODE } from "./colouring";
import type { FilterableGroup, MemberGroup, ViewerModel } from "./types";

export interface SectionBox { min: [number, number, number]; max: [number, number, number] }

export interface MemberFilters {
  groups: Record<FilterableGroup, boolean>;
  hideZeroForce: boolean;
  sectionBox: SectionBox | null;
}

export const defaultFilters: MemberFilters = {
  groups: { top_chord: true, bottom_chord: true, diagonal: true },
  hideZeroForce: false,
  sectionBox: null,
};

/** Node coordinates packed as [x0, y0, z0, x1, …] in model node order, plus an id → index map. */
export interface NodeTable { ids: string[]; index: Map<string, number>; positions: Float32Array }

/** Packs node coordinates for fast per-member lookups. */
export function buildNodeTable(model: Pick<ViewerModel, "nodes">): NodeTable {
  const positions = new Float32Array(model.nodes.length * 3);
  const index = new Map<string, number>();
  model.nodes.forEach((node, k) => {
    index.set(node.id, k);
    positions[k * 3] = node.x;
    positions[k * 3 + 1] = node.y;
    positions[k * 3 + 2] = node.z;
  });
  return { ids: model.nodes.map((n) => n.id), index, positions };
}

/** Member end node indices packed as [i0, j0, i1, j1, …]. */
export function buildMemberEnds(model: Pick<ViewerModel, "members">, nodes: NodeTable): Int32Array {
  const ends = new Int32Array(model.members.length * 2);
  model.members.forEach((member, k) => {
    ends[k * 2] = nodes.index.get(member.i) ?? -1;
    ends[k * 2 + 1] = nodes.index.get(member.j) ?? -1;
  });
  return ends;
}

/**
 * Node positions moved by the displacements times `scale` (scale 0 gives the undeformed shape). Displacements are
 * the result columns' [ux0, uy0, uz0, ux1, …] in model node order, the same order as the positions.
 */
export function deflectedPositions(nodes: NodeTable, displacements: Float32Array, scale: number): Float32Array {
  const out = Float32Array.from(nodes.positions);
  if (scale === 0) return out;
  for (let a = 0; a < out.length; a += 1) out[a] += displacements[a] * scale;
  return out;
}

/** Node positions moved along a mode (model node ids with 3 values each, largest 1) so its peak is a tenth of the span. */
export function modePositions(nodes: NodeTable, nodeIds: readonly string[], shape: readonly number[]): Float32Array {
  const out = Float32Array.from(nodes.positions);
  const scale = 0.1 * modelSpan(nodes.positions);
  nodeIds.forEach((id, k) => {
    const n = nodes.index.get(id);
    if (n === undefined) return;
    for (let s = 0; s < 3; s++) out[n * 3 + s] += (shape[3 * k + s] ?? 0) * scale;
  });
  return out;
}

/** A deflection scale that makes the largest displacement a tenth of the model's span (1 when nothing moves). */
export function autoDeflectionScale(nodes: NodeTable, displacements: Float32Array): number {
  let maxDisp = 0;
  for (let a = 0; a < displacements.length; a += 3) maxDisp = Math.max(maxDisp, Math.hypot(displacements[a], displacements[a + 1], displacements[a + 2]));
  if (maxDisp === 0) return 1;
  const span = modelSpan(nodes.positions);
  return Math.round((span * 0.1) / maxDisp);
}

/** The node cloud's box (smallest and largest x, y, z); null for a model without nodes. */
export function modelBounds(positions: Float32Array): SectionBox | null {
  if (positions.length === 0) return null;
  const min: [number, number, number] = [Infinity, Infinity, Infinity];
  const max: [number, number, number] = [-Infinity, -Infinity, -Infinity];
  for (let k = 0; k < positions.length; k += 3) {
    for (let a = 0; a < 3; a += 1) {
      min[a] = Math.min(min[a], positions[k + a]);
      max[a] = Math.max(max[a], positions[k + a]);
    }
  }
  return { min, max };
}

/** Largest extent of the node cloud along x, y or z. */
export function modelSpan(positions: Float32Array): number {
  const bounds = modelBounds(positions);
  return bounds ? Math.max(...bounds.max.map((m, a) => m - bounds.min[a])) : 0;
}

/** Half a millimetre: a box typed to the centimetre holds a node on its face though coordinates are 32-bit floats. */
const BOX_SLACK = 5e-4;

function insideBox(box: SectionBox, x: number, y: number, z: number): boolean {
  const { min, max } = box;
  const e = BOX_SLACK;
  return x >= min[0] - e && x <= max[0] + e && y >= min[1] - e && y <= max[1] + e && z >= min[2] - e && z <= max[2] + e;
}

/** 1 for each node inside the section box (node order); null when there is no box (every node is drawn). */
export function nodesInBox(positions: Float32Array, box: SectionBox | null): Uint8Array | null {
  if (!box) return null;
  const mask = new Uint8Array(positions.length / 3);
  for (let k = 0; k < mask.length; k += 1) mask[k] = insideBox(box, positions[k * 3], positions[k * 3 + 1], positions[k * 3 + 2]) ? 1 : 0;
  return mask;
}

/**
 * The model's bounding box rounded outwards to the centimetre, for the section box fields: node coordinates are
 * stored as 32-bit floats (1.8 reads back as 1.7999999523…), and a field should say 1.80 and still hold that node.
 */
export function roundedModelBox(positions: Float32Array): SectionBox {
  const bounds = modelBounds(positions);
  if (!bounds) return { min: [0, 0, 0], max: [0, 0, 0] };
  // The 1e-4 slack keeps a float32 that is a hair off a round value on that value, not the next centimetre out.
  const down = (v: number) => Math.floor(v * 100 + 1e-4) / 100;
  const up = (v: number) => Math.ceil(v * 100 - 1e-4) / 100;
  return { min: [down(bounds.min[0]), down(bounds.min[1]), down(bounds.min[2])], max: [up(bounds.max[0]), up(bounds.max[1]), up(bounds.max[2])] };
}

export interface VisibilityInput {
  memberIds: readonly string[];
  ends: Int32Array;
  positions: Float32Array;
  /** Group per member id (top/bottom chord, diagonal); a member with no group is always shown by group. */
  groups: Record<string, MemberGroup>;
  states: Uint8Array;
  filters: MemberFilters;
}

/** 1 for each member that passes every filter (group, zero-force, section box by the member's midpoint). */
export function visibleMask(input: VisibilityInput): Uint8Array {
  const { memberIds, ends, positions, groups, states, filters } = input;
  const mask = new Uint8Array(memberIds.length);
  for (let k = 0; k < memberIds.length; k += 1) {
    const group = groups[memberIds[k]];
    if (group && group !== "other" && !filters.groups[group]) continue;
    if (filters.hideZeroForce && states[k] === STATE_CODE["zero-force"]) continue;
    if (filters.sectionBox) {
      const a = ends[k * 2] * 3;
      const b = ends[k * 2 + 1] * 3;
      const mx = (positions[a] + positions[b]) / 2;
      const my = (positions[a + 1] + positions[b + 1]) / 2;
      const mz = (positions[a + 2] + positions[b + 2]) / 2;
      if (!insideBox(filters.sectionBox, mx, my, mz)) continue;
    }
    mask[k] = 1;
  }
  return mask;
}
