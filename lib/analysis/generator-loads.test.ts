// Load patterns of the roof generator (issue 15 item 7): unbalanced snow, roof imposed and point loads, and the
// EN 1990 (6.10a)/(6.10b) pair, against the factors of EN 1990 Table A1.2(B) and statics derived here.
import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { generateRoof, roofParamsSchema } from "./generator";

const base = { spanX: 12, spanY: 9, module: 3, depth: 1.5, snow: 0.8 } as const;
const totalZ = (loads: { fz: number }[]) => loads.reduce((sum, l) => sum + l.fz, 0);

describe("roof generator load patterns", () => {
  it("by default the load cases and combinations are as before (balanced snow, 6.10)", () => {
    const model = generateRoof(base);
    expect(model.loadCases.map((c) => c.id)).toEqual(["dead", "services", "snow", "wind-uplift"]);
    expect(model.combinations.map((c) => c.id)).toEqual(["ULS-1", "ULS-2", "ULS-3", "SLS-1"]);
  });

  it("unbalanced snow: four half-span patterns, each carrying 3/4 of the balanced total (1 on one half, 0.5 on the other)", () => {
    for (const spanX of [12, 15]) {
      // 4 and 5 bays along x: with an even count the centre-line nodes straddle the halves, with an odd count none does
      const model = generateRoof({ ...base, spanX, unbalancedSnow: true });
      const balanced = totalZ(model.loadCases.find((c) => c.id === "snow")!.nodalLoads);
      expect(balanced).toBeCloseTo(-0.8 * spanX * 9, 9);
      for (const id of ["snow-west", "snow-east", "snow-south", "snow-north"]) {
        const pattern = model.loadCases.find((c) => c.id === id)!;
        expect(pattern.category).toBe("snow");
        expect(totalZ(pattern.nodalLoads)).toBeCloseTo(0.75 * balanced, 9);
      }
      // west pattern: the corner T-0-0 (quarter bay) gets the full 0.8 kN/m2, the opposite corner half of it
      const west = new Map(model.loadCases.find((c) => c.id === "snow-west")!.nodalLoads.map((l) => [l.node, l.fz]));
      expect(west.get("T-0-0")).toBeCloseTo(-0.8 * 2.25, 12);
      expect(west.get(`T-${spanX / 3}-0`)).toBeCloseTo(-0.4 * 2.25, 12);
      // each pattern leads its own combination, 1.35G + 1.5S (EN 1990 (6.10), Table A1.2(B))
      expect(model.combinations.find((c) => c.id === "ULS-snow-west")!.factors).toEqual({ dead: 1.35, services: 1.35, "snow-west": 1.5 });
      expect(analyzeModel(model).status).toBe("ok");
    }
  });

  it("the two halves together are 1.5 × the balanced snow, member by member (superposition of the solved cases)", () => {
    const model = generateRoof({ ...base, unbalancedSnow: true });
    const result = analyzeModel(model);
    const west = result.results["snow-west"].memberForces;
    const snow = result.results.snow.memberForces;
    const east = result.results["snow-east"].memberForces;
    // west + east = 1.5 × balanced (each node gets 1 + 0.5, or 0.75 + 0.75 on the centre line)
    for (const id of Object.keys(snow)) expect(west[id] + east[id]).toBeCloseTo(1.5 * snow[id], 8);
  });

  it("(6.10a) and (6.10b) with ξ = 0.85, ψ0 = 0.5 for snow and 0 for roof imposed load (EN 1990 Tables A1.1, A1.2(B))", () => {
    const model = generateRoof({ ...base, combinationRule: "6.10a/6.10b", imposed: 0.4 });
    const byId = new Map(model.combinations.map((c) => [c.id, c]));
    expect(byId.get("ULS-1")!.factors).toEqual({ dead: 1.35, services: 1.35 });
    expect(byId.get("ULS-snow-a")!.factors).toEqual({ dead: 1.35, services: 1.35, snow: 0.75 });
    expect(byId.get("ULS-snow-b")!.factors.dead).toBeCloseTo(0.85 * 1.35, 12);
    expect(byId.get("ULS-snow-b")!.factors.snow).toBe(1.5);
    expect(byId.get("ULS-imposed-b")!.factors.imposed).toBe(1.5);
    // roof imposed load is not combined with snow or wind (EN 1991-1-1 3.3.2(1)); ψ0 = 0 leaves (6.10a) as ULS-1
    expect(byId.has("ULS-imposed-a")).toBe(false);
    expect(Object.keys(byId.get("ULS-imposed-b")!.factors)).not.toContain("snow");
    expect(byId.get("ULS-3")!.factors).toEqual({ dead: 1.0, "wind-uplift": 1.5 });
    expect(byId.get("SLS-1")!.kind).toBe("serviceability");
  });

  it("roof imposed load by tributary area and a maintenance point load at a chosen top node (the centre unless told)", () => {
    const model = generateRoof({ ...base, imposed: 0.4, pointLoad: 1.5 });
    expect(totalZ(model.loadCases.find((c) => c.id === "imposed")!.nodalLoads)).toBeCloseTo(-0.4 * 12 * 9, 9);
    expect(model.loadCases.find((c) => c.id === "point")!.nodalLoads).toEqual([{ node: "T-2-2", fx: 0, fy: 0, fz: -1.5 }]);
    const moved = generateRoof({ ...base, pointLoad: 1.5, pointLoadNode: "T-4-3" });
    expect(moved.loadCases.find((c) => c.id === "point")!.nodalLoads[0].node).toBe("T-4-3");
    expect(moved.combinations.find((c) => c.id === "ULS-point")!.factors).toEqual({ dead: 1.35, services: 1.35, point: 1.5 });
  });

  it("refuses a point load at a node that is not on the top layer, naming the field", () => {
    const parsed = roofParamsSchema.safeParse({ ...base, pointLoad: 1, pointLoadNode: "T-9-1" });
    expect(parsed.success).toBe(false);
    expect(parsed.error!.issues.map((i) => i.path.join("."))).toEqual(["pointLoadNode"]);
    expect(roofParamsSchema.safeParse({ ...base, pointLoad: 1, pointLoadNode: "B-1-1" }).success).toBe(false);
  });
});
