import { approximateMinimumDegree } from "./amd";
import { nestedDissection } from "./nested-dissection";

export type NodeOrdering = { order: Int32Array; method: "minimum degree" | "nested dissection"; predictedNnzL: number };

/**
 * Entries of L below the diagonal when the node graph is eliminated in `order` and node v carries
 * `weight[v]` equations (its free dofs, one dense block per node pair): the elimination tree and the row
 * subtrees of T. A. Davis, "Direct Methods for Sparse Linear Systems", SIAM 2006, §4.1, on the node graph.
 */
export function predictedFill(n: number, adjStart: Int32Array, adj: Int32Array, order: Int32Array, weight: Uint8Array): number {
  const position = new Int32Array(n);
  for (let p = 0; p < n; p++) position[order[p]] = p;
  const parent = new Int32Array(n).fill(-1);
  const flag = new Int32Array(n);
  const below = new Float64Array(n); // equations in rows below node p's block column
  for (let k = 0; k < n; k++) {
    const v = order[k];
    flag[k] = k;
    for (let q = adjStart[v]; q < adjStart[v + 1]; q++) {
      for (let i = position[adj[q]]; i < k && flag[i] !== k; i = parent[i]) {
        if (parent[i] === -1) parent[i] = k;
        below[i] += weight[v];
        flag[i] = k;
      }
    }
  }
  let nnz = 0;
  for (let p = 0; p < n; p++) {
    const w = weight[order[p]];
    nnz += w * below[p] + (w * (w - 1)) / 2;
  }
  return nnz;
}

/**
 * Fill-reducing node ordering: minimum degree and geometric nested dissection, whichever predicts the smaller
 * L (as CHOLMOD chooses among its orderings); minimum degree on a tie, so small models keep it.
 */
export function fillReducingOrder(n: number, adjStart: Int32Array, adj: Int32Array, coords: Float64Array, weight: Uint8Array): NodeOrdering {
  const amd = approximateMinimumDegree(n, adjStart, adj);
  const amdFill = predictedFill(n, adjStart, adj, amd, weight);
  const nd = nestedDissection(n, adjStart, adj, coords);
  const ndFill = predictedFill(n, adjStart, adj, nd, weight);
  return ndFill < amdFill
    ? { order: nd, method: "nested dissection", predictedNnzL: ndFill }
    : { order: amd, method: "minimum degree", predictedNnzL: amdFill };
}
