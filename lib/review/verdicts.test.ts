import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis";
import { STANDING_CAUTION } from "./caution";
import { createReviewContext } from "./context";
import { bracedColumn, prattWithExtras } from "@/tests/support/fixtures/review-models";
import { memberVerdicts } from "./verdicts";

describe("memberVerdicts", () => {
  const model = prattWithExtras();
  const verdicts = new Map(memberVerdicts(createReviewContext(model, analyzeModel(model), { standard: "AISC360-22" })).map((v) => [v.member, v]));

  it("classifies each member by its role across all results", () => {
    // check-values §5.3 Ex. 4: U2L2 is zero in 4a and 4b, yet the determinate truss is a mechanism without it.
    expect(verdicts.get("U2L2")?.verdict).toBe("stabilising");
    expect(verdicts.get("U1L1")?.verdict).toBe("load-bearing"); // +10 kN in 4b
    expect(verdicts.get("L0L1")?.verdict).toBe("load-bearing");
    // U2W frames into the compressed top chords at U2, but U2's own y support holds U2 across them: by stability
    // it braces nothing (counting members called it bracing, a false alarm)
    expect(verdicts.get("U2W")?.verdict).toBe("idle");
    for (const id of ["XL0", "XS1", "XS2", "XS3"]) expect(verdicts.get(id)?.verdict).toBe("idle");
  });

  it("carries the standing caution with every verdict", () => {
    for (const v of verdicts.values()) expect(v.caution).toBe(STANDING_CAUTION);
  });
});

describe("bracing judged by stability (issue 15 item 3)", () => {
  // bracedColumn (tests/support/fixtures/review-models.ts): a brace must give k ≥ 4P/L = 4·10/2 = 20 kN/m (restraint.ts: Winter's 2P/L doubled).
  const model = bracedColumn();
  const verdicts = new Map(memberVerdicts(createReviewContext(model, analyzeModel(model), { standard: "EN1993-1-1" })).map((v) => [v.member, v]));

  it("the only adequate brace is bracing, and says which joint loses its hold and in which direction", () => {
    const v = verdicts.get("MB")!;
    expect(v.verdict).toBe("bracing");
    expect(v.braces?.sort()).toEqual(["AM", "MT"]);
    const lost = v.lostRestraints!.find((l) => l.member === "AM")!;
    expect(lost.joint).toBe("M");
    expect(Math.abs(lost.direction[0])).toBeCloseTo(1, 9);
    expect(lost.stiffnessAfter).toBeCloseTo((2e8 * 1e-8) / 3, 6);
    // before: the weakest direction across the column is y (MY alone, 1e5 kN/m; x has 1e5 + 0.667)
    expect(lost.stiffnessBefore).toBeCloseTo(1e5, 3);
    expect(lost.required).toBeCloseTo(20, 9);
    // the verdict's words say the joint and the direction it loses its hold in (issue 15 item 3)
    expect(v.reason).toMatch(/M across AM, along [+−]1\.00 x \(0\.667 kN\/m left, 20\.0 needed\)/);
  });

  it("a second brace that leaves the joint held is idle; the only hold along y is stabilising", () => {
    expect(verdicts.get("MD")?.verdict).toBe("idle");
    expect(verdicts.get("MY")?.verdict).toBe("stabilising");
  });
});
