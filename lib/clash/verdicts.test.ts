import { describe, expect, it } from "vitest";
import { memberVerdicts } from "./verdicts";

describe("memberVerdicts", () => {
  it("keeps the four verdicts and drops anything else", () => {
    expect(memberVerdicts({ M1: "idle", M2: "load-bearing", M3: "maybe", M4: 3 })).toEqual({ M1: "idle", M2: "load-bearing" });
  });
  it("gives nothing for a missing review", () => {
    expect(memberVerdicts(null)).toEqual({});
  });
});
