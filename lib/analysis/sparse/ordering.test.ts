import { describe, expect, it } from "vitest";
import { assembleStiffness } from "../assemble";
import { generateRoof } from "../generator";
import { freeDofsPerNode } from "../symbolic";
import { seededRandom } from "@/tests/support/fixtures/analysis-models";
import { buildTopology } from "../topology";
import { approximateMinimumDegree } from "./amd";
import { symbolicLdl } from "./ldl";
import { nestedDissection } from "./nested-dissection";
import { BOTH_ORDERINGS_UP_TO, dissectionFillBound, fillReducingOrder, predictedFill } from "./ordering";

/** 5-point k x k grid graph with unit spacing, vertex v labelled label(v). */
function grid(k: number, label: (v: number) => number = (v) => v) {
  const n = k * k;
  const lists: number[][] = Array.from({ length: n }, () => []);
  const coords = new Float64Array(3 * n);
  for (let y = 0; y < k; y++) {
    for (let x = 0; x < k; x++) {
      const v = label(y * k + x);
      coords[3 * v] = x;
      coords[3 * v + 1] = y;
      const link = (u: number) => {
        lists[v].push(u);
        lists[u].push(v);
      };
      if (x + 1 < k) link(label(y * k + x + 1));
      if (y + 1 < k) link(label((y + 1) * k + x));
    }
  }
  const adjStart = new Int32Array(n + 1);
  lists.forEach((l, v) => (adjStart[v + 1] = adjStart[v] + l.length));
  return { n, adjStart, adj: Int32Array.from(lists.flat()), coords, weight: new Uint8Array(n).fill(1) };
}

const isPermutation = (order: Int32Array, n: number) => [...order].sort((a, b) => a - b).every((v, k) => v === k) && order.length === n;

describe("nested dissection", () => {
  it("returns a permutation, also for disconnected graphs and coincident nodes", () => {
    const g = grid(20);
    expect(isPermutation(nestedDissection(g.n, g.adjStart, g.adj, g.coords, 8), g.n)).toBe(true);
    // two 10 x 10 grids side by side with no link, and every node at the origin
    const two = grid(10);
    const n = 2 * two.n;
    const adjStart = Int32Array.from([...two.adjStart, ...two.adjStart.slice(1).map((p) => p + two.adj.length)]);
    const adj = Int32Array.from([...two.adj, ...two.adj.map((v) => v + two.n)]);
    expect(isPermutation(nestedDissection(n, adjStart, adj, new Float64Array(3 * n), 8), n)).toBe(true);
    expect(isPermutation(nestedDissection(n, adjStart, adj, Float64Array.from({ length: 3 * n }, (_, k) => k % 7), 8), n)).toBe(true);
  });

  it("keeps the fill of a k x k grid within George's n log2 n bound", () => {
    // A. George, "Nested dissection of a regular finite element mesh", SIAM J. Numer. Anal. 10 (1973): nested
    // dissection of a k x k grid with k = 2^l - 1 gives nnz(L) = 31/4 n log2 n + O(n); for the 5-point graph
    // (a subgraph of his 9-point mesh) the same bound holds. At k = 127 the banded order (about k entries per
    // column, 2.0 M) exceeds the bound (1.75 M), so a dissection that degenerated into strips would fail here.
    const g = grid(127);
    const fill = predictedFill(g.n, g.adjStart, g.adj, nestedDissection(g.n, g.adjStart, g.adj, g.coords), g.weight);
    expect(dissectionFillBound(g.n, g.weight)).toBe((31 / 4) * g.n * Math.log2(g.n));
    expect(fill).toBeLessThan(dissectionFillBound(g.n, g.weight));
  });

  it("does not depend on how the nodes are numbered", () => {
    const random = seededRandom(3);
    const perm = [...Array(40 * 40).keys()].sort(() => random() - 0.5);
    const plain = grid(40);
    const shuffled = grid(40, (v) => perm[v]);
    const fillPlain = predictedFill(plain.n, plain.adjStart, plain.adj, nestedDissection(plain.n, plain.adjStart, plain.adj, plain.coords), plain.weight);
    const fillShuffled = predictedFill(shuffled.n, shuffled.adjStart, shuffled.adj, nestedDissection(shuffled.n, shuffled.adjStart, shuffled.adj, shuffled.coords), shuffled.weight);
    expect(fillShuffled / fillPlain).toBeGreaterThan(0.9);
    expect(fillShuffled / fillPlain).toBeLessThan(1.1);
  });
});

describe("fill-reducing ordering", () => {
  const roof = buildTopology(generateRoof({ spanX: 60, spanY: 60, module: 3, depth: 2 }));
  const weight = freeDofsPerNode(roof);
  const n = roof.nodeIds.length;

  it("predicts nnz(L) of the assembled K_ff exactly (node blocks of free dofs)", () => {
    for (const order of [approximateMinimumDegree(n, roof.adjStart, roof.adj), nestedDissection(n, roof.adjStart, roof.adj, roof.coords)]) {
      expect(predictedFill(n, roof.adjStart, roof.adj, order, weight)).toBe(symbolicLdl(assembleStiffness(roof, order).matrix).nnzL);
    }
  });

  it("picks nested dissection on a 20 x 20 roof, where it fills less than minimum degree", () => {
    const chosen = fillReducingOrder(n, roof.adjStart, roof.adj, roof.coords, weight);
    const amdFill = predictedFill(n, roof.adjStart, roof.adj, approximateMinimumDegree(n, roof.adjStart, roof.adj), weight);
    expect(chosen.method).toBe("nested dissection");
    expect(chosen.candidates.map((c) => c.method)).toEqual(["nested dissection", "minimum degree"]); // 841 nodes: both compared
    expect(chosen.predictedNnzL).toBeLessThan(amdFill);
    expect(isPermutation(chosen.order, n)).toBe(true);
  });

  // A 40 x 40 bay roof: 3,281 nodes, more than BOTH_ORDERINGS_UP_TO.
  const large = buildTopology(generateRoof({ spanX: 120, spanY: 120, module: 3, depth: 2 }));
  const largeN = large.nodeIds.length;
  const largeWeight = freeDofsPerNode(large);

  it("takes nested dissection without minimum degree on a large roof that it separates well", () => {
    expect(largeN).toBeGreaterThan(BOTH_ORDERINGS_UP_TO);
    const chosen = fillReducingOrder(largeN, large.adjStart, large.adj, large.coords, largeWeight);
    expect(chosen.method).toBe("nested dissection");
    expect(chosen.candidates).toEqual([{ method: "nested dissection", predictedNnzL: chosen.predictedNnzL }]);
    expect(chosen.predictedNnzL).toBeLessThanOrEqual(dissectionFillBound(largeN, largeWeight));
    expect(isPermutation(chosen.order, largeN)).toBe(true);
    // the minimum degree ordering that was skipped would have filled more
    const amdFill = predictedFill(largeN, large.adjStart, large.adj, approximateMinimumDegree(largeN, large.adjStart, large.adj), largeWeight);
    expect(amdFill).toBeGreaterThan(chosen.predictedNnzL);
  });

  it("compares with minimum degree when the coordinates do not separate the graph", () => {
    const random = seededRandom(7);
    const scrambled = Float64Array.from(large.coords, () => random());
    const chosen = fillReducingOrder(largeN, large.adjStart, large.adj, scrambled, largeWeight);
    expect(chosen.candidates.map((c) => c.method)).toEqual(["nested dissection", "minimum degree"]);
    expect(chosen.candidates[0].predictedNnzL).toBeGreaterThan(dissectionFillBound(largeN, largeWeight));
    expect(chosen.method).toBe("minimum degree");
    expect([...chosen.order]).toEqual([...approximateMinimumDegree(largeN, large.adjStart, large.adj)]);
  });

  it("keeps minimum degree for a graph too small to dissect", () => {
    const g = grid(4);
    const chosen = fillReducingOrder(g.n, g.adjStart, g.adj, g.coords, g.weight);
    expect(chosen.method).toBe("minimum degree");
    expect([...chosen.order]).toEqual([...approximateMinimumDegree(g.n, g.adjStart, g.adj)]);
  });
});
