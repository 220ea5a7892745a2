import { describe, expect, it } from "vitest";
import { generateRoof } from "@/lib/analysis/generator";
import { wholeRoofCheckMembers } from "@/lib/limits";
import { pointLoads, triangleModel } from "@/tests/support/fixtures/analysis-models";
import { analyseForStorage } from "./analyse";

describe("analyseForStorage on a roof past the whole-roof check limit", () => {
  it("still reviews every member, leaves out overall stability and any-load, and says why", () => {
    // 36 x 36 bays, square on square offset: 8 x 36 x 36 = 10,368 members (roofSize), just past the limit.
    const model = generateRoof({ spanX: 108, spanY: 108, module: 3, depth: 3 });
    expect(model.members.length).toBeGreaterThan(wholeRoofCheckMembers);
    const { result, review } = analyseForStorage(model, "EN1993-1-1");
    expect(result.status).toBe("ok");
    expect(Object.keys(review!.members)).toHaveLength(model.members.length);
    expect(review!.stability).toBeUndefined();
    expect(review!.anyLoad).toBeUndefined();
    expect(Object.values(review!.members).every((m) => m.anyLoad === undefined && typeof m.verdict === "string")).toBe(true);
    // "idle" rests on the load patterns analysed: kept on the review itself, so they show beside every idle verdict
    expect(review!.analysedPatterns).toEqual(model.loadCases.map((c) => ({ id: c.id, name: c.name })));
    expect(review!.analysedPatterns!.map((p) => p.id)).toEqual(["dead", "services", "snow", "wind-uplift"]);
    expect(review!.wholeRoofChecksLeftOut).toBe(`Overall stability and "idle for any roof load" are checked with the analysis for roofs of up to 10,000 members; this one has ${model.members.length.toLocaleString("en")}. "Idle for any roof load" can be run for the whole roof as a job from the viewer.`);
  }, 120_000);
});

describe("the stored review keeps the serviceability deflection check (issue 15 item 6)", () => {
  it("each serviceability combination's largest vertical deflection against span/250, as the unit-load method gives", () => {
    // The 3-4-5 triangle (check-values §5.3 Example 1), 10 kN down at C. Unit-load method (virtual work, derived
    // here): uz_C = −P·Σ n²L/(EA) with n_AB = 2/3 (L 4 m), n_AC = n_BC = −5/6 (L 2.5 m), EA = 2e8 × 0.001 kN.
    const uzPerKn = -((2 / 3) ** 2 * 4 + 2 * (5 / 6) ** 2 * 2.5) / (2e8 * 0.001);
    const model = triangleModel({
      loadCases: [pointLoads("G", [["C", 0, 0, -10]], "dead")],
      combinations: [
        { id: "ULS", name: "1.35G", factors: { G: 1.35 } },
        { id: "SLS", name: "1.0G", factors: { G: 1 }, kind: "serviceability" },
      ],
    });
    const { review } = analyseForStorage(model, "EN1993-1-1");
    expect(review!.deflections).toHaveLength(1);
    const [check] = review!.deflections!;
    expect(check).toMatchObject({ combination: "SLS", node: "C", span: 4, limit: 250, allowed: 4 / 250 });
    expect(check.deflection).toBeCloseTo(10 * uzPerKn, 12);
    expect(check.utilisation).toBeCloseTo((10 * Math.abs(uzPerKn)) / (4 / 250), 9);
  });

  it("at the project's limit span/400 when told, and says which limit it used", () => {
    // Same triangle, worked by hand: Σ n²L = (2/3)²·4 + 2·(5/6)²·2.5 = 64/36 + 125/36 = 189/36 = 5.25 m and
    // EA = 2e8 kPa × 0.001 m² = 2e5 kN, so under 10 kN δ_C = 10 × 5.25 / 2e5 = 2.625e-4 m down; span 4 m (supports
    // A, B), allowed 4/400 = 0.010 m, utilisation 2.625e-4 / 0.010 = 0.02625 (at span/250 it would be 0.0164).
    const model = triangleModel({
      loadCases: [pointLoads("G", [["C", 0, 0, -10]], "dead")],
      combinations: [{ id: "SLS", name: "1.0G", factors: { G: 1 }, kind: "serviceability" }],
    });
    const { review } = analyseForStorage(model, "EN1993-1-1", 400);
    expect(review!.deflectionLimit).toBe(400);
    const [check] = review!.deflections!;
    expect(check).toMatchObject({ combination: "SLS", node: "C", span: 4, limit: 400 });
    expect(check.allowed).toBeCloseTo(0.01, 15);
    expect(check.deflection).toBeCloseTo(-2.625e-4, 15);
    expect(check.utilisation).toBeCloseTo(0.02625, 12);
    expect(check.steps).toContain("allowed = L/400 = 10.00 mm");
  });

  it("states the default span/250 it used when no limit is given", () => {
    const model = triangleModel({
      loadCases: [pointLoads("G", [["C", 0, 0, -10]], "dead")],
      combinations: [{ id: "SLS", name: "1.0G", factors: { G: 1 }, kind: "serviceability" }],
    });
    expect(analyseForStorage(model, "EN1993-1-1").review!.deflectionLimit).toBe(250);
  });
});
