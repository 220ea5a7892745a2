import { describe, expect, it } from "vitest";
import { memberVerdicts } from "./verdicts";

describe("memberVerdicts", () => {
  it("reads the verdict of each member from a stored review", () => {
    const review = { standard: "EN1993-1-1", caution: "…", members: { M1: { verdict: "idle", reason: "…" }, M2: { verdict: "load-bearing" } } };
    expect(memberVerdicts(review)).toEqual({ M1: "idle", M2: "load-bearing" });
  });
  it("gives nothing for a missing or foreign review", () => {
    expect(memberVerdicts(null)).toEqual({});
    expect(memberVerdicts({ members: { M1: { verdict: "maybe" } } })).toEqual({});
  });
});
