import type { TrussModel } from "./model";

/** Node and member arrays of a validated model, in model order, ready for the numeric steps. */
export type Topology = {
  nodeIds: string[];
  memberIds: string[];
  nodeIndex: Map<string, number>;
  coords: Float64Array; // 3 per node
  memberI: Int32Array;
  memberJ: Int32Array;
  /** Unit vector from end i to end j, 3 per member. */
  direction: Float64Array;
  length: Float64Array;
  /** E A / L in kN/m. */
  axialStiffness: Float64Array;
  /** 1 where a translation is restrained, 3 per node (ux, uy, uz). */
  restrained: Uint8Array;
  /** Node adjacency (CSR): neighbours of node a are adj[adjStart[a] .. adjStart[a+1]), joined by adjMember. */
  adjStart: Int32Array;
  adj: Int32Array;
  adjMember: Int32Array;
};

/** Builds index arrays, member geometry and node adjacency from a validated model. */
export function buildTopology(model: TrussModel): Topology {
  const n = model.nodes.length;
  const m = model.members.length;
  const nodeIndex = new Map<string, number>();
  const coords = new Float64Array(3 * n);
  model.nodes.forEach((node, k) => {
    nodeIndex.set(node.id, k);
    coords[3 * k] = node.x;
    coords[3 * k + 1] = node.y;
    coords[3 * k + 2] = node.z;
  });
  const materials = new Map(model.materials.map((mat) => [mat.id, mat]));
  const sectionStiffness = new Map(model.sections.map((s) => [s.id, s.area * (materials.get(s.material)?.E ?? 0)]));

  const memberI = new Int32Array(m);
  const memberJ = new Int32Array(m);
  const direction = new Float64Array(3 * m);
  const length = new Float64Array(m);
  const axialStiffness = new Float64Array(m);
  const degree = new Int32Array(n + 1);
  model.members.forEach((member, e) => {
    const a = nodeIndex.get(member.i)!;
    const b = nodeIndex.get(member.j)!;
    memberI[e] = a;
    memberJ[e] = b;
    const dx = coords[3 * b] - coords[3 * a];
    const dy = coords[3 * b + 1] - coords[3 * a + 1];
    const dz = coords[3 * b + 2] - coords[3 * a + 2];
    const len = Math.hypot(dx, dy, dz);
    length[e] = len;
    direction[3 * e] = dx / len;
    direction[3 * e + 1] = dy / len;
    direction[3 * e + 2] = dz / len;
    axialStiffness[e] = (sectionStiffness.get(member.section) ?? 0) / len;
    degree[a]++;
    degree[b]++;
  });

  const adjStart = new Int32Array(n + 1);
  for (let a = 0; a < n; a++) adjStart[a + 1] = adjStart[a] + degree[a];
  const fill = adjStart.slice(0, n);
  const adj = new Int32Array(2 * m);
  const adjMember = new Int32Array(2 * m);
  for (let e = 0; e < m; e++) {
    const a = memberI[e];
    const b = memberJ[e];
    adj[fill[a]] = b;
    adjMember[fill[a]++] = e;
    adj[fill[b]] = a;
    adjMember[fill[b]++] = e;
  }

  const restrained = new Uint8Array(3 * n);
  for (const s of model.supports) {
    const k = nodeIndex.get(s.node)!;
    if (s.ux) restrained[3 * k] = 1;
    if (s.uy) restrained[3 * k + 1] = 1;
    if (s.uz) restrained[3 * k + 2] = 1;
  }

  return {
    nodeIds: model.nodes.map((node) => node.id),
    memberIds: model.members.map((member) => member.id),
    nodeIndex,
    coords,
    memberI,
    memberJ,
    direction,
    length,
    axialStiffness,
    restrained,
    adjStart,
    adj,
    adjMember,
  };
}
