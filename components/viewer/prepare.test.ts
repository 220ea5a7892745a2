import { describe, expect, it } from "vitest";
import { defaultCompareResult, loadArrowCapacity, nodalLoadsFor } from "./prepare";
import type { ViewerModel } from "./types";

describe("the result compare mode starts with", () => {
  // Display order: load cases, then combinations (resultIds in lib/models/result-order.ts).
  const ids = ["dead", "snow", "ULS-1", "ULS-2", "ULS-3"];

  it("is the next result after the chosen one, or the one before for the last", () => {
    expect(defaultCompareResult(ids, "ULS-1")).toBe("ULS-2");
    expect(defaultCompareResult(ids, "ULS-3")).toBe("ULS-2");
    expect(defaultCompareResult(ids, "dead")).toBe("snow");
  });

  it("is never the chosen result itself, and none when there is no other", () => {
    expect(defaultCompareResult(["ULS-1"], "ULS-1")).toBeNull();
    expect(defaultCompareResult(ids, null)).toBe("dead");
    expect(defaultCompareResult(ids, "gone")).toBe("dead");
  });
});

describe("load arrows", () => {
  // A made-up two-node model: the dead load case lists two loads on node A (allowed by the model format).
  const model = {
    nodes: [{ id: "A", x: 0, y: 0, z: 0 }, { id: "B", x: 1, y: 0, z: 0 }],
    loadCases: [
      { id: "dead", name: "Dead", nodalLoads: [{ node: "A", fx: 0, fy: 0, fz: -1 }, { node: "A", fx: 0, fy: 0, fz: -2 }, { node: "B", fx: 0, fy: 0, fz: -1 }] },
    ],
    combinations: [{ id: "ULS-1", name: "1.35 dead", factors: { dead: 1.35 } }],
  } as unknown as ViewerModel;

  it("have room for every load of a case, even two on one node", () => {
    expect(nodalLoadsFor(model, "dead")).toHaveLength(3);
    expect(loadArrowCapacity(model)).toBe(3);
  });

  it("of a combination are one per node, summed", () => {
    expect(nodalLoadsFor(model, "ULS-1")).toEqual([
      { node: "A", fx: 0, fy: 0, fz: expect.closeTo(-4.05, 10) },
      { node: "B", fx: 0, fy: 0, fz: expect.closeTo(-1.35, 10) },
    ]);
  });
});
