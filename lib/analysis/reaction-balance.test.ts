// Support reactions against closed forms derived here: a square pyramid of four equal legs, pinned at the corners of
// a 4 m square, apex 3 m up. Statics (ΣF = 0) and symmetry give each support a vertical reaction of P/4 for an apex
// load P, plus the self-weight: each leg weighs w = A γ L, half at each end, so a corner carries w/2 directly and a
// quarter of the apex's 4 · w/2, i.e. Rz = P/4 + w at every support.
import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import type { TrussModel } from "./model";
import { BALANCE_TOLERANCE, appliedLoad, largestDisplacement, reactionBalance } from "./reaction-balance";

const A = 1.2e-3;
const gamma = 78.5;
const L = Math.hypot(2, 2, 3);
const corners = [[0, 0], [4, 0], [4, 4], [0, 4]] as const;

const pyramid: TrussModel = {
  format: "truss-model/1",
  name: "Square pyramid",
  materials: [{ id: "S355", E: 210e6, fy: 355e3, unitWeight: gamma }],
  sections: [{ id: "T", material: "S355", area: A, radiusOfGyration: 0.03, outerDiameter: 0.0889, wallThickness: 0.0045 }],
  nodes: [...corners.map(([x, y], k) => ({ id: `S${k}`, x, y, z: 0 })), { id: "P", x: 2, y: 2, z: 3 }],
  members: corners.map((_, k) => ({ id: `L${k}`, i: `S${k}`, j: "P", section: "T" })),
  supports: corners.map((_, k) => ({ node: `S${k}`, ux: true, uy: true, uz: true })),
  loadCases: [
    { id: "G", name: "Self-weight and apex load", category: "dead", selfWeight: true, nodalLoads: [{ node: "P", fx: 0, fy: 0, fz: -100 }] },
    { id: "H", name: "Horizontal apex load", category: "wind", selfWeight: false, nodalLoads: [{ node: "P", fx: 12, fy: 0, fz: 0 }] },
  ],
  combinations: [{ id: "ULS", name: "1.35G + 1.5H", factors: { G: 1.35, H: 1.5 } }],
};

describe("reaction balance", () => {
  const result = analyzeModel(pyramid);

  it("each corner of the symmetric pyramid carries P/4 + A γ L (derived above)", () => {
    const w = A * gamma * L;
    for (const k of [0, 1, 2, 3]) expect(result.results.G.reactions[`S${k}`].fz).toBeCloseTo(100 / 4 + w, 9);
  });

  it("sums the applied load from the model, combination factors included: ΣF = -(4 w + P) vertically, 1.5 H horizontally", () => {
    const w = A * gamma * L;
    const uls = appliedLoad(pyramid, "ULS");
    expect(uls.fz).toBeCloseTo(-1.35 * (100 + 4 * w), 10);
    expect(uls.fx).toBeCloseTo(1.5 * 12, 12);
    expect(uls.fy).toBe(0);
  });

  it("finds every result of the analysis balanced to 1e-9 relative, and says so in one line", () => {
    for (const id of ["G", "H", "ULS"]) {
      const balance = reactionBalance(pyramid, id, result.results[id]);
      expect(balance.balanced, id).toBe(true);
      expect(balance.relative).toBeLessThanOrEqual(BALANCE_TOLERANCE);
      expect(balance.text).toMatch(/^Reactions balance: sum of reactions \(.*\) kN against applied load \(.*\) kN; relative imbalance .* <= 1e-9\.$/);
    }
  });

  it("flags reactions that miss the applied load by more than 1e-9 relative (the check can fail)", () => {
    const reactions = structuredClone(result.results.G.reactions);
    reactions.S0.fz *= 1 + 1e-6;
    const balance = reactionBalance(pyramid, "G", { reactions });
    expect(balance.balanced).toBe(false);
    expect(balance.text).toContain("NOT BALANCED");
  });

  it("names the node that moves most: the apex", () => {
    const moved = largestDisplacement(result.results.G)!;
    expect(moved.node).toBe("P");
    expect(moved.uz).toBeLessThan(0);
    expect(moved.size).toBeCloseTo(Math.abs(moved.uz), 12);
  });
});
