import { describe, expect, it } from "vitest";
import { runsFingerprint } from "./runs-fingerprint";
import type { Run } from "./schemas";

const duct: Run = {
  id: "SA-01",
  system: "supply air",
  profile: { shape: "round", diameter: 0.5 },
  insulation: 0.05,
  clearance: 0.1,
  weightPerMetre: 0.35,
  points: [
    { x: -1, y: 1.5, z: 2 },
    { x: 10, y: 1.5, z: 2 },
  ],
};

describe("the fingerprint of the runs a hanging was queued for", () => {
  it("is the SHA-256 of the runs' JSON (digest of this exact text checked with `printf '%s' '[]' | sha256sum`)", () => {
    // sha256("[]"), from coreutils' sha256sum (a general-purpose reference implementation, not this project)
    expect(runsFingerprint([])).toBe("4f53cda18c2baa0c0354bb5f9a3ecbe5ed12ab4d8e11ba873c2f11161202b945");
  });

  it("changes when a run's weight, route or set of runs changes, and not when nothing did", () => {
    const before = runsFingerprint([duct]);
    expect(runsFingerprint([structuredClone(duct)])).toBe(before);
    expect(runsFingerprint([{ ...duct, weightPerMetre: 0.36 }])).not.toBe(before);
    expect(runsFingerprint([{ ...duct, points: [duct.points[0], { x: 9, y: 1.5, z: 2 }] }])).not.toBe(before);
    expect(runsFingerprint([duct, { ...duct, id: "SA-02" }])).not.toBe(before);
  });
});
