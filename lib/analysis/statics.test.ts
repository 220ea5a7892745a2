import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { pointLoads, triangleModel, trussModel } from "@/tests/support/fixtures/analysis-models";

// Planar trusses drawn in the x-z plane are held out of plane (uy) at every node, as a 3D model needs.

/**
 * Example 1: symmetric 3-4-5 triangle, A(0,0,0), B(4,0,0), C(2,0,1.5). Closed forms by the method of joints
 * (derived by hand; the same numbers are listed in our reference notes, check-values §5.3 Example 1):
 * gravity P at C: N_AB = PL/(4h) = +6.667, N_AC = N_BC = -P/(2 sin θ) = -8.333, Az = Bz = P/2;
 * lateral H at C: Bz = H h / L = 3.75, N_BC = -3.75/0.6 = -6.25, N_AC = +6.25, N_AB = +5.
 */
const triangle = () =>
  triangleModel({
    loadCases: [pointLoads("gravity", [["C", 0, 0, -10]], "dead"), pointLoads("lateral", [["C", 10, 0, 0]], "wind")],
    combinations: [{ id: "C1", name: "1.2 gravity + 1.0 lateral", factors: { gravity: 1.2, lateral: 1.0 } }],
  });

describe("statically determinate trusses against closed forms", () => {
  it("triangle under gravity, lateral load and their combination (method of joints)", () => {
    const r = analyzeModel(triangle());
    expect(r.status).toBe("ok");
    const g = r.results.gravity;
    expect(g.memberForces.AB).toBeCloseTo(20 / 3, 9);
    expect(g.memberForces.AC).toBeCloseTo(-25 / 3, 9);
    expect(g.memberForces.BC).toBeCloseTo(-25 / 3, 9);
    expect(g.reactions.A.fz).toBeCloseTo(5, 9);
    expect(g.reactions.B.fz).toBeCloseTo(5, 9);
    const l = r.results.lateral;
    expect(l.memberForces.AB).toBeCloseTo(5, 9);
    expect(l.memberForces.AC).toBeCloseTo(6.25, 9);
    expect(l.memberForces.BC).toBeCloseTo(-6.25, 9);
    expect(l.reactions.A).toEqual({ fx: expect.closeTo(-10, 9), fy: 0, fz: expect.closeTo(-3.75, 9) });
    expect(l.reactions.B.fz).toBeCloseTo(3.75, 9);
    // combination 1.2 gravity + 1.0 lateral: N_AC = -10 + 6.25, N_BC = -10 - 6.25, N_AB = 8 + 5
    const c = r.results.C1;
    expect(c.memberForces.AC).toBeCloseTo(-3.75, 9);
    expect(c.memberForces.BC).toBeCloseTo(-16.25, 9);
    expect(c.memberForces.AB).toBeCloseTo(13, 9);
    // every supported node is listed, even one carrying no reaction in this case
    expect(Object.keys(g.reactions).sort()).toEqual(["A", "B", "C"]);
    expect(g.reactions.C).toEqual({ fx: 0, fy: 0, fz: 0 });
  });

  it("envelope keeps both signs when a member reverses between load cases (no combinations: over cases)", () => {
    const model = triangle();
    model.combinations = [];
    const r = analyzeModel(model);
    expect(r.info.envelopeOver).toBe("loadCases");
    expect(r.envelope.AC.maxTension).toBeCloseTo(6.25, 9);
    expect(r.envelope.AC.maxCompression).toBeCloseTo(-25 / 3, 9);
    expect(r.info.governing.AC).toEqual({ maxTension: "lateral", maxCompression: "gravity" });
  });

  it("zero in all covers every load case as well as every combination; a case in no combination is flagged", () => {
    // Closed form: "down" (10 kN down at C) and "up" (10 kN up at C) give opposite forces, so the combination
    // 1.0·down + 1.0·up is zero in every member, while each case loads all three (method of joints, Example 1).
    const model = triangleModel({
      loadCases: [pointLoads("down", [["C", 0, 0, -10]]), pointLoads("up", [["C", 0, 0, 10]]), pointLoads("lateral", [["C", 10, 0, 0]])],
      combinations: [{ id: "cancel", name: "down + up", factors: { down: 1, up: 1 } }],
    });
    const r = analyzeModel(model);
    expect(r.results.cancel.zeroForceMembers.sort()).toEqual(["AB", "AC", "BC"]);
    expect(r.zeroInAll).toEqual([]);
    expect(r.envelope.AC.zeroInAll).toBe(false);
    // the envelope's extremes stay over the combinations and say so
    expect(r.info.envelopeOver).toBe("combinations");
    expect(r.envelope.AC.maxCompression).toBe(0);
    expect(r.info.loadCasesInNoCombination).toEqual(["lateral"]);
  });

  it("reactions balance the applied load to 1e-9 relative in every result (global equilibrium, ΣF = 0)", () => {
    const r = analyzeModel(triangle());
    const applied: Record<string, [number, number, number]> = { gravity: [0, 0, -10], lateral: [10, 0, 0], C1: [10, 0, -12] };
    for (const [id, [fx, fy, fz]] of Object.entries(applied)) {
      const sum = [0, 0, 0];
      for (const reaction of Object.values(r.results[id].reactions)) {
        sum[0] += reaction.fx;
        sum[1] += reaction.fy;
        sum[2] += reaction.fz;
      }
      const scale = Math.hypot(fx, fy, fz);
      expect(Math.abs(sum[0] + fx) / scale).toBeLessThan(1e-9);
      expect(Math.abs(sum[1] + fy) / scale).toBeLessThan(1e-9);
      expect(Math.abs(sum[2] + fz) / scale).toBeLessThan(1e-9);
    }
  });

  it("displacement of the triangle matches the unit-load method", () => {
    // Virtual work: uz_C = sum N n L / (E A) with n the forces for a unit downward load (derived by hand).
    const r = analyzeModel(triangle());
    const EA = 2e8 * 0.001;
    const n = { AB: 2 / 3, AC: -5 / 6, BC: -5 / 6 };
    const N = r.results.gravity.memberForces;
    const expected = (N.AB * n.AB * 4 + N.AC * n.AC * 2.5 + N.BC * n.BC * 2.5) / EA;
    expect(-r.results.gravity.displacements.C.uz).toBeCloseTo(expected, 12);
  });
});

/**
 * Example 4: 4-panel Pratt truss, panel a = 3 m, height h = 4 m, diagonal d = 5 m, bottom L0..L4, top U1..U3.
 * Closed forms (method of joints and sections, derived by hand; listed in check-values §5.3 Example 4):
 * 4a, P = 20 kN at L2: bottom chords Pa/(2h) = +7.5, top chords -Pa/h = -15, end posts -Pd/(2h) = -12.5,
 * diagonals +Pd/(2h) = +12.5, verticals 0 (zero-force rule 2 at L1, L3 and U2).
 * 4b, P = 10 kN at each of L1, L2, L3: bottom chords 1.5Pa/h = +11.25, top chords -2Pa/h = -15, end posts
 * -1.5Pd/h = -18.75, diagonals +0.5Pd/h = +6.25, U1L1 = U3L3 = +P = +10 (hangers), U2L2 still 0.
 */
const pratt = (loadCases: ReturnType<typeof pointLoads>[]) =>
  trussModel({
    nodes: [
      ["L0", 0, 0, 0],
      ["L1", 3, 0, 0],
      ["L2", 6, 0, 0],
      ["L3", 9, 0, 0],
      ["L4", 12, 0, 0],
      ["U1", 3, 0, 4],
      ["U2", 6, 0, 4],
      ["U3", 9, 0, 4],
    ],
    members: ["L0-L1", "L1-L2", "L2-L3", "L3-L4", "U1-U2", "U2-U3", "L0-U1", "L4-U3", "U1-L1", "U2-L2", "U3-L3", "U1-L2", "U3-L2"],
    supports: [
      ["L0", true, true, true],
      ["L4", false, true, true],
      ...["L1", "L2", "L3", "U1", "U2", "U3"].map((n): [string, boolean, boolean, boolean] => [n, false, true, false]),
    ],
    loadCases,
  });

describe("Pratt truss (check-values §5.3 Example 4)", () => {
  const midspan = pointLoads("4a", [["L2", 0, 0, -20]]);
  const threePoint = pointLoads("4b", [
    ["L1", 0, 0, -10],
    ["L2", 0, 0, -10],
    ["L3", 0, 0, -10],
  ]);

  it("matches the closed-form forces for both loadings", () => {
    const r = analyzeModel(pratt([midspan, threePoint]));
    expect(r.status).toBe("ok");
    const a = r.results["4a"].memberForces;
    for (const m of ["L0L1", "L1L2", "L2L3", "L3L4"]) expect(a[m]).toBeCloseTo(7.5, 9);
    for (const m of ["U1U2", "U2U3"]) expect(a[m]).toBeCloseTo(-15, 9);
    for (const m of ["L0U1", "L4U3"]) expect(a[m]).toBeCloseTo(-12.5, 9);
    for (const m of ["U1L2", "U3L2"]) expect(a[m]).toBeCloseTo(12.5, 9);
    const b = r.results["4b"].memberForces;
    for (const m of ["L0L1", "L1L2", "L2L3", "L3L4"]) expect(b[m]).toBeCloseTo(11.25, 9);
    for (const m of ["U1U2", "U2U3"]) expect(b[m]).toBeCloseTo(-15, 9);
    for (const m of ["L0U1", "L4U3"]) expect(b[m]).toBeCloseTo(-18.75, 9);
    for (const m of ["U1L2", "U3L2"]) expect(b[m]).toBeCloseTo(6.25, 9);
    for (const m of ["U1L1", "U3L3"]) expect(b[m]).toBeCloseTo(10, 9);
    expect(r.results["4b"].reactions.L0.fz).toBeCloseTo(15, 9);
    expect(r.results["4b"].reactions.L4.fz).toBeCloseTo(15, 9);
  });

  it("zero-force set changes when loads are added at other joints (rule 2 stops applying at L1, L3)", () => {
    const r = analyzeModel(pratt([midspan, threePoint]));
    expect(r.results["4a"].zeroForceMembers.sort()).toEqual(["U1L1", "U2L2", "U3L3"]);
    expect(r.results["4b"].zeroForceMembers).toEqual(["U2L2"]);
    // no combinations: the envelope runs over the load cases, and only U2L2 is zero in all of them
    expect(r.zeroInAll).toEqual(["U2L2"]);
    expect(r.envelope.U2L2.zeroInAll).toBe(true);
    expect(r.envelope.U1L1).toEqual({ maxTension: expect.closeTo(10, 9), maxCompression: 0, zeroInAll: false });
  });

  it("reports members below a force threshold separately from zero-force members", () => {
    const r = analyzeModel(pratt([midspan, threePoint]), { lowForceThreshold: 8 });
    expect(r.info.lowForce?.members["4a"].sort()).toEqual(["L0L1", "L1L2", "L2L3", "L3L4"]);
    expect(r.info.lowForce?.members["4b"].sort()).toEqual(["U1L2", "U3L2"]);
    expect(r.info.lowForce?.lowInAll).toEqual([]);
    expect(analyzeModel(pratt([midspan])).info.lowForce).toBeUndefined();
  });
});

describe("zero-force member rules", () => {
  it("2D rule 1: an unloaded joint with two non-collinear members makes both zero-force", () => {
    // Textbook rule (Baker & Haynes, Engineering Statics, §6.3; check-values §5.1): D hangs off the triangle.
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 4, 0, 0],
        ["C", 2, 0, 1.5],
        ["D", 6, 0, 1.5],
      ],
      members: ["A-B", "A-C", "B-C", "B-D", "C-D"],
      supports: [
        ["A", true, true, true],
        ["B", false, true, true],
        ["C", false, true, false],
        ["D", false, true, false],
      ],
      loadCases: [pointLoads("P", [["C", 3, 0, -10]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("ok");
    expect(r.results.P.zeroForceMembers.sort()).toEqual(["BD", "CD"]);
    expect(Math.abs(r.results.P.memberForces.AC)).toBeGreaterThan(1);
  });

  it("3D rule: at an unloaded joint where all members but one are coplanar, the odd one is zero-force", () => {
    // Hibbeler, Engineering Mechanics: Statics §6.5 (from memory; proof: sum of forces along the plane normal).
    // Joint J (unloaded) has members to A, B, D in the plane z = 0 and one member to E out of it.
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 4, 0, 0],
        ["D", 2, 3, 0],
        ["E", 2, 1, 3],
        ["J", 2, 1, 0],
        ["K", 2, -2, 0],
      ],
      members: ["J-A", "J-B", "J-D", "J-E", "A-K", "B-K", "K-J"],
      supports: [
        ["A", true, true, true],
        ["B", true, true, true],
        ["D", true, true, true],
        ["E", true, true, true],
        ["K", false, false, true],
      ],
      loadCases: [pointLoads("P", [["K", 2, 5, 0]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("ok");
    expect(r.results.P.zeroForceMembers).toContain("JE");
    expect(r.results.P.zeroForceMembers).not.toContain("JA");
    // with a load out of the plane at J, JE takes all of it: N_JE = fz (JE points straight up, length 3)
    const lifted = analyzeModel({ ...model, loadCases: [pointLoads("Q", [["J", 0, 0, 7]])] });
    expect(lifted.results.Q.memberForces.JE).toBeCloseTo(-7, 9);
  });
});

describe("models without results", () => {
  it("with no load cases no member is called zero in all", () => {
    const model = triangle();
    model.loadCases = [];
    model.combinations = [];
    const r = analyzeModel(model);
    expect(r.results).toEqual({});
    expect(r.zeroInAll).toEqual([]);
    expect(r.envelope.AB).toEqual({ maxTension: 0, maxCompression: 0, zeroInAll: false });
  });
});
