import { describe, expect, it } from "vitest";
import { analyzeModel, generateRoof, type TrussModel } from "@/lib/analysis";
import { createReviewContext } from "./context";
import { influenceMap, topLayerNodes } from "./influence";

describe("influenceMap", () => {
  const roof = generateRoof({ spanX: 15, spanY: 12, module: 3, depth: 1.5 });
  const context = createReviewContext(roof, analyzeModel(roof), { standard: "EN1993-1-1" });

  it("agrees with direct analyses of a unit load at a few top nodes", () => {
    const member = "D-1-1-NE";
    const map = influenceMap(context, member);
    const value = new Map(map.values.map((v) => [v.node, v.value]));
    for (const node of ["T-2-2", "T-3-1", "T-1-3", "T-5-4"]) {
      const probe: TrussModel = {
        ...roof,
        loadCases: [{ id: "unit", name: "1 kN down", category: "other", selfWeight: false, nodalLoads: [{ node, fx: 0, fy: 0, fz: -1 }] }],
        combinations: [],
      };
      const direct = analyzeModel(probe).results.unit.memberForces[member];
      expect(value.get(node)).toBeCloseTo(direct, 9);
    }
  });

  it("covers the top layer only and gives zero at a vertically supported node", () => {
    const nodes = topLayerNodes(context);
    expect(nodes).toHaveLength(6 * 5);
    expect(nodes.every((n) => n.startsWith("T-"))).toBe(true);
    const map = influenceMap(context, "BCX-2-2");
    expect(map.values.find((v) => v.node === "T-0-2")?.value).toBe(0);
    expect(map.largestTension!.value).toBeGreaterThan(0); // a bottom chord is in tension under downward load
  });
});
