import { describe, expect, it } from "vitest";
import type { CaseResult } from "../analysis/analyze";
import { forceStateIn } from "../vocabulary/force-state";
import { stateChanges } from "./states";

const result = (memberForces: Record<string, number>, zeroForceMembers: string[]): CaseResult => ({ memberForces, zeroForceMembers, reactions: {}, displacements: {}, equilibriumResidual: 0 });

describe("member states", () => {
  it("reads zero-force from the analysis' classification, else the sign (tension positive)", () => {
    const r = result({ a: 12, b: -3, c: 1e-12 }, ["c"]);
    expect(["a", "b", "c"].map((id) => forceStateIn(r, id))).toEqual(["tension", "compression", "zero-force"]);
  });

  it("lists only the members whose state changes, in member order", () => {
    const a = result({ m1: 10, m2: -5, m3: 0, m4: 2 }, ["m3"]);
    const b = result({ m1: -4, m2: -6, m3: 7, m4: 3 }, []);
    expect(stateChanges(["m1", "m2", "m3", "m4"], a, b)).toEqual([
      { memberId: "m1", a: { state: "tension", force: 10 }, b: { state: "compression", force: -4 } },
      { memberId: "m3", a: { state: "zero-force", force: 0 }, b: { state: "tension", force: 7 } },
    ]);
  });
});
