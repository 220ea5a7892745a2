import { describe, expect, it } from "vitest";
import { analyzeModel, generateRoof } from "@/lib/analysis";
import { createReviewContext } from "./context";
import { compareServicesLoad, servicesLoadCase } from "./services-load";
import { prattWithExtras } from "@/tests/support/fixtures/review-models";

describe("servicesLoadCase", () => {
  // Bottom nodes of this roof sit at the bay centres: x = 1.5, 4.5, …; y = 1.5, 4.5, …
  const roof = generateRoof({ spanX: 15, spanY: 12, module: 3, depth: 1.5 });

  it("hangs the whole run weight on the bottom nodes nearest in plan", () => {
    const run = { id: "duct-1", points: [{ x: 1.5, y: 1.5, z: -0.4 }, { x: 13.5, y: 1.5, z: -0.4 }, { x: 13.5, y: 7.5, z: -0.4 }], weightPerMetre: 0.5 };
    const { loadCase, hangers, totalLoad } = servicesLoadCase(roof, [run], { hangerSpacing: 2.5 });
    // 12 m + 6 m = 18 m at ≤ 2.5 m → 8 bays of 2.25 m, 9 hangers; 18 m × 0.5 kN/m = 9 kN in all.
    expect(hangers).toHaveLength(9);
    expect(totalLoad).toBeCloseTo(9, 12);
    expect(loadCase.nodalLoads.reduce((s, l) => s + l.fz, 0)).toBeCloseTo(-9, 12);
    expect(loadCase.category).toBe("services");
    expect(hangers[0]).toMatchObject({ node: "B-0-0", load: 0.5 * 1.125 });
    expect(hangers[1]).toMatchObject({ x: 3.75, node: "B-1-0" }); // 3.75 is nearer 4.5 than 1.5
    expect(hangers[8].node).toBe("B-4-2");
    expect(loadCase.nodalLoads.every((l) => l.node.startsWith("B-"))).toBe(true);
  });

  it("refuses a run without length", () => {
    expect(() => servicesLoadCase(roof, [{ id: "x", points: [{ x: 1, y: 1, z: 0 }], weightPerMetre: 1 }], { hangerSpacing: 2 })).toThrow(RangeError);
  });

  it("shows how hung services change the zero-force set", () => {
    const model = prattWithExtras();
    const context = createReviewContext(model, analyzeModel(model), { standard: "AISC360-22" });
    // A short run hung under the middle of the truss puts load on L2 only, like case 4a (check-values §5.3
    // Ex. 4): the verticals U1L1, U3L3 and U2L2 carry nothing under it, and 4b's zero set (U2L2) stays zero.
    const comparison = compareServicesLoad(context, [{ id: "pipe", points: [{ x: 5.8, y: 0, z: -0.5 }, { x: 6.2, y: 0, z: -0.5 }], weightPerMetre: 2 }], { hangerSpacing: 3 });
    expect(comparison.loadCase.nodalLoads).toHaveLength(1);
    expect(comparison.loadCase.nodalLoads[0].node).toBe("L2");
    expect(comparison.loadCase.nodalLoads[0].fz).toBeCloseTo(-0.8, 12);
    const fourB = comparison.results.find((r) => r.result === "4b")!;
    expect(fourB.noLongerZero).toEqual([]);
    for (const id of ["U1L1", "U2L2", "U3L3"]) expect(comparison.zeroUnderServices).toContain(id);
    // In 4b the vertical hangers carry 10 kN; U2L2 is still zero (the three-member rule at U2 does not care).
    expect(fourB.newlyZero).toEqual([]);
  });

  it("makes a zero-force vertical work when services hang from its joint", () => {
    const model = prattWithExtras();
    const context = createReviewContext(model, analyzeModel(model), { standard: "AISC360-22" });
    // Hung at L1, the 4a zero-force hanger U1L1 (three-member rule at L1) now carries the load.
    const comparison = compareServicesLoad(context, [{ id: "pipe", points: [{ x: 2.8, y: 0, z: -0.5 }, { x: 3.2, y: 0, z: -0.5 }], weightPerMetre: 2 }], { hangerSpacing: 3 });
    expect(comparison.results.find((r) => r.result === "4a")!.noLongerZero).toEqual(["U1L1"]);
  });
});
