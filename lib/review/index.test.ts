import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis";
import { createReviewContext, openingWhatIf, reviewModel, STANDING_CAUTION } from "./index";
import { prattWithExtras } from "@/tests/support/fixtures/review-models";

describe("reviewModel", () => {
  const model = prattWithExtras();
  const result = analyzeModel(model);
  const review = reviewModel(model, result, { standard: "AISC360-22", lowForceThreshold: 10.5 });
  const member = (id: string) => review.members.find((m) => m.member === id)!;

  it("checks the end post in compression with E3 in its governing combination", () => {
    // L0U1 in C1 = 1.5 × 4b: N = 1.5 × −18.75 = −28.125 kN (check-values §5.3 Ex. 4). L = 5 m, r = 30.05 mm,
    // Lc/r = 166.4 > 4.71√(E/Fy) → elastic, Fcr = 0.877·π²E/(Lc/r)² (AISC 360-22 E3-3, E3-4).
    const slenderness = 5 / 0.03005;
    const Fcr = (0.877 * Math.PI ** 2 * 210e6) / slenderness ** 2;
    const governing = member("L0U1").governing!;
    expect(governing.result).toBe("C1");
    expect(governing.force).toBeCloseTo(-28.125, 9);
    expect(governing.utilisation).toBeCloseTo(28.125 / (0.9 * Fcr * 0.00106688), 9);
    expect(governing.steps.map((s) => s.label)).toContain("Critical stress Fcr (elastic)");
  });

  it("gives verdicts with the caution, low-force flags and why-zero per result", () => {
    expect(member("U2L2").verdict.verdict).toBe("stabilising");
    expect(member("U2L2").verdict.caution).toBe(STANDING_CAUTION);
    expect(member("U2L2").whyZero["4a"].method).toBe("inspection");
    expect(member("U2L2").whyZero["C1"].explanation).toMatch(/U2/);
    expect(member("U2L2").governing).toBeNull();
    // U1L1 carries 0 in 4a (zero-force, not low-force), 10 kN in 4b (under 10.5 kN) and 15 kN in C1.
    expect(member("U1L1").lowForceIn).toEqual(["4b"]);
    expect(review.summary.verdicts).toEqual({ "load-bearing": 12, stabilising: 1, bracing: 0, idle: 5 });
    expect(review.caution).toBe(STANDING_CAUTION);
  });

  it("is plain JSON", () => {
    expect(JSON.parse(JSON.stringify(review))).toEqual(review);
  });
});

describe("openingWhatIf", () => {
  it("checks an opening in a model member across the design results", () => {
    const model = prattWithExtras();
    const context = createReviewContext(model, analyzeModel(model), { standard: "EN1993-1-1" });
    const a = openingWhatIf(context, "L1L2", { shape: "round", diameter: 0.03, position: 1.5 });
    expect(a.combinations.map((c) => c.combination)).toEqual(["C1"]);
    expect(a.combinations[0].force).toBeCloseTo(1.5 * 11.25, 9); // check-values §5.3 Ex. 4b bottom chord
    expect(a.verdict).toBe("within capacity on the checks made");
    expect(a.caution).toBe(STANDING_CAUTION);
  });
});
