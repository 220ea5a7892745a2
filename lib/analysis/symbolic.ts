import { assembleStiffness, type AssembledStiffness } from "./assemble";
import { symbolicLdl } from "./sparse/ldl";
import { fillReducingOrder } from "./sparse/ordering";
import { supernodes, type SupernodeStructure } from "./sparse/supernodal";
import type { Topology } from "./topology";

/**
 * The part of a factorisation that depends only on the pattern of K_ff: node ordering and supernode row
 * structure. A structure with the same nodes and restraints whose members join only node pairs already
 * joined here (a later revision with changed sections or loads, a removal what-if) has a pattern inside this
 * one, so its numeric factorisation can reuse it: the entries it lacks are factored as zeros.
 */
export type SymbolicAnalysis = {
  nodeIds: string[];
  restrained: Uint8Array;
  adjStart: Int32Array;
  adj: Int32Array;
  nodeOrder: Int32Array;
  structure: SupernodeStructure;
  nnzL: number;
};

/** Equations per node (its unrestrained translations): the block size the ordering weighs fill by. */
export function freeDofsPerNode(topology: Topology): Uint8Array {
  const { restrained } = topology;
  const weight = new Uint8Array(topology.nodeIds.length);
  for (let a = 0; a < weight.length; a++) weight[a] = 3 - restrained[3 * a] - restrained[3 * a + 1] - restrained[3 * a + 2];
  return weight;
}

/** Orders the nodes and finds the supernodes for this topology's pattern; also returns the assembled K_ff. */
export function analyzePattern(topology: Topology): { symbolic: SymbolicAnalysis; assembled: AssembledStiffness; orderingMs: number } {
  const start = globalThis.performance.now();
  const n = topology.nodeIds.length;
  const nodeOrder = fillReducingOrder(n, topology.adjStart, topology.adj, topology.coords, freeDofsPerNode(topology)).order;
  const orderingMs = globalThis.performance.now() - start;
  const assembled = assembleStiffness(topology, nodeOrder);
  const symbolic = symbolicLdl(assembled.matrix);
  const { nodeIds, restrained, adjStart, adj } = topology;
  return {
    symbolic: { nodeIds, restrained, adjStart, adj, nodeOrder, structure: supernodes(assembled.matrix, symbolic), nnzL: symbolic.nnzL },
    assembled,
    orderingMs,
  };
}

/** Whether `topology`'s pattern lies inside the one `symbolic` was made for (same nodes, restraints, links). */
export function canReuse(symbolic: SymbolicAnalysis, topology: Topology): boolean {
  const n = topology.nodeIds.length;
  if (symbolic.nodeIds.length !== n || symbolic.nodeIds.some((id, k) => id !== topology.nodeIds[k])) return false;
  if (symbolic.restrained.some((r, q) => r !== topology.restrained[q])) return false;
  const mark = new Int32Array(n).fill(-1);
  for (let a = 0; a < n; a++) {
    for (let q = symbolic.adjStart[a]; q < symbolic.adjStart[a + 1]; q++) mark[symbolic.adj[q]] = a;
    for (let q = topology.adjStart[a]; q < topology.adjStart[a + 1]; q++) if (mark[topology.adj[q]] !== a) return false;
  }
  return true;
}
