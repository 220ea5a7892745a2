import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis";
import { pointLoads, triangleModel } from "@/tests/support/fixtures/analysis-models";
import { checkDeflections } from "./deflection";
import { designResultIds } from "./member-design";
import { reviewModel } from "./review-model";

// The 3-4-5 triangle (check-values §5.3 Example 1) with 10 kN down at C. Unit-load method (virtual work,
// derived here): uz_C = −P·Σ n²L/(EA) with n_AB = 2/3 (L 4 m), n_AC = n_BC = −5/6 (L 2.5 m), EA = 2e8 × 0.001 kN.
const EA = 2e8 * 0.001;
const uzPerKn = -((2 / 3) ** 2 * 4 + 2 * (5 / 6) ** 2 * 2.5) / EA;
const model = triangleModel({
  loadCases: [pointLoads("G", [["C", 0, 0, -10]], "dead")],
  combinations: [
    { id: "ULS", name: "1.35G", factors: { G: 1.35 } },
    { id: "SLS", name: "1.0G", factors: { G: 1 }, kind: "serviceability" },
  ],
});
const result = analyzeModel(model);

describe("serviceability combinations", () => {
  it("are not checked against resistance: only ultimate combinations are design results", () => {
    expect(designResultIds(model)).toEqual(["ULS"]);
    const review = reviewModel(model, result, { standard: "EN1993-1-1" });
    expect(review.members.every((m) => m.checks.every((c) => c.result === "ULS"))).toBe(true);
  });

  it("are checked for deflection against span/250 by default and span/limit when told", () => {
    const [check] = checkDeflections(model, result);
    expect(check.combination).toBe("SLS");
    expect(check.node).toBe("C");
    expect(check.deflection).toBeCloseTo(10 * uzPerKn, 12);
    // supports A and B lie on a line 4 m long: that is the span
    expect(check.span).toBe(4);
    expect(check.utilisation).toBeCloseTo((10 * Math.abs(uzPerKn)) / (4 / 250), 9);
    expect(checkDeflections(model, result, 500)[0].utilisation).toBeCloseTo(2 * check.utilisation, 9);
    expect(reviewModel(model, result, { standard: "EN1993-1-1", deflectionLimit: 500 }).deflections[0].limit).toBe(500);
  });
});
