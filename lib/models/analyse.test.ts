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
});
