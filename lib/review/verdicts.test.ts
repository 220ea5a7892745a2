import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis";
import { STANDING_CAUTION } from "./caution";
import { createReviewContext } from "./context";
import { prattWithExtras } from "./test-models";
import { memberVerdicts } from "./verdicts";

describe("memberVerdicts", () => {
  const model = prattWithExtras();
  const verdicts = new Map(memberVerdicts(createReviewContext(model, analyzeModel(model), { standard: "AISC360-22" })).map((v) => [v.member, v]));

  it("classifies each member by its role across all results", () => {
    // check-values §5.3 Ex. 4: U2L2 is zero in 4a and 4b, yet the determinate truss is a mechanism without it.
    expect(verdicts.get("U2L2")?.verdict).toBe("stabilising");
    expect(verdicts.get("U1L1")?.verdict).toBe("load-bearing"); // +10 kN in 4b
    expect(verdicts.get("L0L1")?.verdict).toBe("load-bearing");
    expect(verdicts.get("U2W")?.verdict).toBe("bracing");
    expect(verdicts.get("U2W")?.braces?.sort()).toEqual(["U1U2", "U2U3"]);
    for (const id of ["XL0", "XS1", "XS2", "XS3"]) expect(verdicts.get(id)?.verdict).toBe("idle");
  });

  it("carries the standing caution with every verdict", () => {
    for (const v of verdicts.values()) expect(v.caution).toBe(STANDING_CAUTION);
  });
});
