import { describe, expect, it } from "vitest";
import { seededRandom } from "@/tests/support/fixtures/analysis-models";
import { approximateMinimumDegree } from "./amd";
import { symbolicLdl, type UpperCsc } from "./ldl";

/** 5-point grid graph (k x k), vertices numbered through `label`. */
function gridGraph(k: number, label: (v: number) => number) {
  const n = k * k;
  const lists: number[][] = Array.from({ length: n }, () => []);
  const link = (a: number, b: number) => {
    lists[label(a)].push(label(b));
    lists[label(b)].push(label(a));
  };
  for (let y = 0; y < k; y++) {
    for (let x = 0; x < k; x++) {
      if (x + 1 < k) link(y * k + x, y * k + x + 1);
      if (y + 1 < k) link(y * k + x, (y + 1) * k + x);
    }
  }
  const adjStart = new Int32Array(n + 1);
  lists.forEach((l, v) => (adjStart[v + 1] = adjStart[v] + l.length));
  return { n, adjStart, adj: Int32Array.from(lists.flat()) };
}

/** Entries of L for the graph eliminated in `order` (pattern only). */
function fill(g: ReturnType<typeof gridGraph>, order: Int32Array): number {
  const position = new Int32Array(g.n);
  order.forEach((v, p) => (position[v] = p));
  const cols: number[][] = Array.from({ length: g.n }, (_, j) => [j]);
  for (let v = 0; v < g.n; v++) {
    for (let q = g.adjStart[v]; q < g.adjStart[v + 1]; q++) {
      const [i, j] = [position[v], position[g.adj[q]]];
      if (i < j) cols[j].push(i);
    }
  }
  const colPtr = new Int32Array(g.n + 1);
  cols.forEach((c, j) => (colPtr[j + 1] = colPtr[j] + c.length));
  const a: UpperCsc = { n: g.n, colPtr, rowIdx: Int32Array.from(cols.flat()), values: new Float64Array(colPtr[g.n]) };
  return symbolicLdl(a).nnzL;
}

describe("approximate minimum degree", () => {
  it("returns a permutation", () => {
    const g = gridGraph(12, (v) => v);
    const order = approximateMinimumDegree(g.n, g.adjStart, g.adj);
    expect([...order].sort((a, b) => a - b)).toEqual([...Array(g.n).keys()]);
  });

  it("cuts fill far below the banded natural order and is insensitive to the numbering", () => {
    const k = 30;
    const natural = gridGraph(k, (v) => v);
    const bandFill = fill(natural, Int32Array.from({ length: natural.n }, (_, v) => v));
    const amdFill = fill(natural, approximateMinimumDegree(natural.n, natural.adjStart, natural.adj));
    // banded elimination of a k x k grid fills about k entries per column; minimum degree far fewer
    expect(amdFill).toBeLessThan(0.5 * bandFill);
    const random = seededRandom(7);
    const perm = [...Array(natural.n).keys()].sort(() => random() - 0.5);
    const shuffled = gridGraph(k, (v) => perm[v]);
    const shuffledFill = fill(shuffled, approximateMinimumDegree(shuffled.n, shuffled.adjStart, shuffled.adj));
    expect(shuffledFill / amdFill).toBeGreaterThan(0.8);
    expect(shuffledFill / amdFill).toBeLessThan(1.25);
  });

  it("handles isolated vertices and a complete graph", () => {
    const empty = approximateMinimumDegree(4, new Int32Array(5), new Int32Array(0));
    expect([...empty].sort()).toEqual([0, 1, 2, 3]);
    const lists = [0, 1, 2, 3, 4].map((v) => [0, 1, 2, 3, 4].filter((u) => u !== v));
    const adjStart = Int32Array.from([0, 4, 8, 12, 16, 20]);
    expect([...approximateMinimumDegree(5, adjStart, Int32Array.from(lists.flat()))].sort()).toEqual([0, 1, 2, 3, 4]);
  });
});
