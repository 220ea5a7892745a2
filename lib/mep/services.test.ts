import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis/analyze";
import { generateRoof } from "@/lib/analysis/generator";
import { HUNG_SERVICES_CASE, hangServices, zeroForceChange } from "./services";
import { runSchema } from "./schemas";

// 12 m × 9 m roof on 3 m modules (generator combinations: EN 1990 (6.10) with a "services" case at 1.35 / 1.0 and
// left out of the uplift combination).
const roof = generateRoof({ name: "t", spanX: 12, spanY: 9, module: 3, depth: 1.5 });
const duct = runSchema.parse({
  id: "SA-01",
  system: "supply air",
  profile: { shape: "round", diameter: 0.5 },
  weightPerMetre: 0.4,
  points: [{ x: 1.5, y: 4.5, z: 0.6 }, { x: 10.5, y: 4.5, z: 0.6 }],
});

describe("hangServices", () => {
  it("adds the runs' whole weight as one load case, factored like the model's services case", () => {
    const { model, totalLoad } = hangServices(roof, [duct], 3);
    // 9 m × 0.4 kN/m = 3.6 kN, all of it hung (hand arithmetic).
    expect(totalLoad).toBeCloseTo(3.6, 12);
    const hung = model.loadCases.find((c) => c.id === HUNG_SERVICES_CASE)!;
    expect(hung.nodalLoads.reduce((s, l) => s + l.fz, 0)).toBeCloseTo(-3.6, 12);
    for (const combination of model.combinations) {
      expect(combination.factors[HUNG_SERVICES_CASE]).toBe(combination.factors.services);
    }
  });

  it("replaces an earlier hung-services case instead of adding a second", () => {
    const once = hangServices(roof, [duct], 3).model;
    const twice = hangServices(once, [duct], 1.5).model;
    expect(twice.loadCases.filter((c) => c.id === HUNG_SERVICES_CASE)).toHaveLength(1);
    expect(twice.loadCases).toHaveLength(roof.loadCases.length + 1);
  });

  it("reports which members stop being zero-force everywhere", () => {
    const before = analyzeModel(roof);
    const after = analyzeModel(hangServices(roof, [duct], 3).model);
    const change = zeroForceChange(before, after);
    // Every member reported as no longer zero really was zero before and is not now.
    for (const id of change.noLongerZero) {
      expect(before.zeroInAll).toContain(id);
      expect(after.zeroInAll).not.toContain(id);
    }
    expect(zeroForceChange(before, before)).toEqual({ noLongerZero: [], newlyZero: [] });
  });
});
