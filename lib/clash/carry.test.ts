import { describe, expect, it } from "vitest";
import type { Run } from "../mep/schemas";
import { carryDecision, recheckReasons, runChangeReason, type MemberSnapshot } from "./carry";

// Invented member data (the carry rules are ours, issue 16); the forces are not from an analysis here.
const names = { DL: "Dead load", SN: "Snow", WU: "Wind uplift", C1: "1.35 G + 1.5 S", C2: "1.0 G + 1.5 W uplift" };
const zeroEverywhere: MemberSnapshot = {
  section: "CHS-60",
  ends: [[0, 0, 0], [3, 0, 0]],
  results: { DL: { force: 0, zero: true }, SN: { force: 0, zero: true }, WU: { force: 0, zero: true }, C1: { force: 0, zero: true }, C2: { force: 0, zero: true } },
  verdict: "idle",
  utilisation: 0,
};
const run: Run = { id: "SA-01", system: "supply air", profile: { shape: "round", diameter: 0.4 }, insulation: 0.05, clearance: 0.1, weightPerMetre: 0.3, points: [{ x: -1, y: 0, z: 0 }, { x: 4, y: 0, z: 0 }] } as Run;
const carry = (after: MemberSnapshot | null, runAfter: Run | null = run) => carryDecision({ memberId: "D-8-5-SW", runId: "SA-01", revisionNumber: 3, member: { before: zeroEverywhere, after }, run: { before: run, after: runAfter } });

describe("carrying a decision to a new revision", () => {
  it("keeps it when the member, the run and the results are unchanged", () => {
    expect(carry(structuredClone(zeroEverywhere))).toEqual({ action: "keep" });
    expect(recheckReasons("D-8-5-SW", zeroEverywhere, structuredClone(zeroEverywhere), names)).toEqual([]);
  });

  it("asks for another look, in words, when a member that was zero everywhere now works under wind uplift", () => {
    const after = structuredClone(zeroEverywhere);
    after.results.WU = { force: -12.4, zero: false };
    after.results.C2 = { force: -18.6, zero: false };
    after.verdict = "load-bearing";
    after.utilisation = 0.21;
    expect(recheckReasons("D-8-5-SW", zeroEverywhere, after, names)).toEqual([
      "D-8-5-SW was zero in every combination; now carries 18.6 kN compression in 1.0 G + 1.5 W uplift",
      "its verdict was idle; now load-bearing",
      "utilisation went from 0.00 to 0.21",
    ]);
  });

  it("names the results a gravity-only zero member now works in", () => {
    const before: MemberSnapshot = { ...zeroEverywhere, results: { ...zeroEverywhere.results, WU: { force: 5, zero: false } }, verdict: "load-bearing", utilisation: 0.1 };
    const after = structuredClone(before);
    after.results.SN = { force: 7.25, zero: false };
    expect(recheckReasons("D-1", before, after, names)).toEqual(["D-1 was zero in Snow; now carries 7.3 kN tension in Snow"]);
  });

  it("ignores changes within the tolerances, but not beyond them", () => {
    const working: MemberSnapshot = { ...zeroEverywhere, results: { C1: { force: -100, zero: false } }, verdict: "load-bearing", utilisation: 0.5 };
    const slightly = { ...working, results: { C1: { force: -105, zero: false } }, utilisation: 0.54 };
    expect(recheckReasons("T-1", working, slightly, names)).toEqual([]);
    const clearly = { ...working, results: { C1: { force: -130, zero: false } }, utilisation: 0.65 };
    expect(recheckReasons("T-1", working, clearly, names)).toEqual(["T-1 maximum compression changed from 100.0 kN to 130.0 kN", "utilisation went from 0.50 to 0.65"]);
  });

  it("closes it, with the reason, when the member or the run changed or vanished", () => {
    expect(carry(null)).toEqual({ action: "close", reason: "member D-8-5-SW is not in revision 3" });
    expect(carry({ ...zeroEverywhere, section: "CHS-89" })).toEqual({ action: "close", reason: "member D-8-5-SW changed section in revision 3 (CHS-60 → CHS-89)" });
    expect(carry({ ...zeroEverywhere, ends: [[0, 0, 0], [3, 0, 0.2]] })).toEqual({ action: "close", reason: "member D-8-5-SW moved in revision 3" });
    expect(carry(zeroEverywhere, null)).toEqual({ action: "close", reason: "run SA-01 is not on revision 3" });
    expect(carry(zeroEverywhere, { ...run, clearance: 0.2 })).toEqual({ action: "close", reason: "run SA-01 was moved or resized in revision 3" });
  });

  it("says why a decision no longer holds when its run is edited: moved, resized or removed, not renamed or reweighed", () => {
    const moved = { ...run, points: [{ x: -1, y: 0, z: 0.05 }, { x: 4, y: 0, z: 0.05 }] };
    expect(runChangeReason("SA-01", run, moved, 2)).toBe("run SA-01 was moved or resized in revision 2");
    expect(runChangeReason("SA-01", run, { ...run, profile: { shape: "round", diameter: 0.5 } } as Run, 2)).toBe("run SA-01 was moved or resized in revision 2");
    expect(runChangeReason("SA-01", run, null, 2)).toBe("run SA-01 is not on revision 2");
    expect(runChangeReason("SA-01", run, { ...run, system: "extract air", weightPerMetre: 0.5 }, 2)).toBeNull();
  });
});
