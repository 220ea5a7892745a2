// "Idle for any roof load" against statics derived here on small trusses.
import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis";
import { idleForAnyLoad } from "./any-load";
import { createReviewContext } from "./context";
import { influenceMap } from "./influence";
import { prattTruss, prattWithExtras } from "@/tests/support/fixtures/review-models";
import type { TrussModel } from "@/lib/analysis";

function certificate(model: TrussModel, options: Parameters<typeof idleForAnyLoad>[1] = {}) {
  const result = analyzeModel(model);
  expect(result.status).toBe("ok");
  return idleForAnyLoad(createReviewContext(model, result, { standard: "EN1993-1-1" }), options);
}

describe("idle for any roof load", () => {
  it("the Pratt truss loaded on its top nodes: only the verticals at the unloaded two-chord joints L1 and L3", () => {
    // Statics (derived here): joint L1 joins the collinear bottom chords L0L1, L1L2 (along x) and the vertical U1L1;
    // with no load at L1, equilibrium along z gives N(U1L1) = 0 for every load elsewhere (the classic zero-force
    // member at an unloaded joint of two collinear members and a third); likewise U3L3 at L3. Every other member
    // carries force under a vertical load at U1 or U3 (method of joints), and loads along y go straight into the
    // y restraints.
    const cert = certificate(prattTruss());
    expect(cert.loadable).toEqual({ nodes: 3, directions: ["x", "y", "z"], which: "top layer" });
    expect(cert.idleForAnyLoad.sort()).toEqual(["U1L1", "U3L3"]);
    const chord = cert.members.find((m) => m.member === "L0L1")!;
    expect(chord.idleForAnyLoad).toBe(false);
    // a 1 kN downward load at U1 (3 m from L0 on a 12 m span): reaction at L4 = 0.25 kN, at L0 = 0.75 kN; joint L0:
    // the end diagonal L0U1 (3-4-5) takes 0.75 × 5/4 = 0.9375 kN compression, L0L1 0.75 × 3/4 = 0.5625 kN tension.
    // The same number from the other side: the member's adjoint solve (influenceMap, 1 kN downward) at U1.
    const model = prattTruss();
    const adjoint = influenceMap(createReviewContext(model, analyzeModel(model), { standard: "EN1993-1-1" }), "L0L1");
    expect(adjoint.values.find((v) => v.node === "U1")!.value).toBeCloseTo(0.5625, 9);
    expect(chord.largestInfluence).toBeGreaterThanOrEqual(0.5625 - 1e-9);
    expect(cert.tolerance).toMatch(/1e-6 × the largest \|N\|/);
  });

  it("with every node loadable, the verticals work too (a load at L1 goes up U1L1)", () => {
    const model = prattTruss();
    const cert = certificate(model, { nodes: model.nodes.map((n) => n.id) });
    expect(cert.loadable.which).toBe("as configured");
    expect(cert.idleForAnyLoad).toEqual([]);
    const vertical = cert.members.find((m) => m.member === "U1L1")!;
    // joint L1 along z: a 1 kN load along z at L1 is carried by U1L1 alone: −1 kN per kN (compression for +z)
    expect(vertical.mattersMost[0]).toEqual({ node: "L1", direction: "z", value: expect.closeTo(-1, 9) });
  });

  it("members to an unloaded joint held only by them, and a member in line with a support, never work", () => {
    // prattWithExtras (tests/support/fixtures/review-models.ts): X is held by four members to fixed nodes and carries no load, so they stay
    // at zero unless X itself is loaded; U2W runs along y from U2, whose y is restrained, to a fixed node: its
    // elongation uy(W) − uy(U2) is always 0.
    const model = prattWithExtras();
    const top = certificate(model);
    for (const id of ["XL0", "XS1", "XS2", "XS3", "U2W", "U1L1", "U3L3"]) expect(top.idleForAnyLoad).toContain(id);
    const all = certificate(model, { nodes: model.nodes.map((n) => n.id) });
    expect(all.idleForAnyLoad).toEqual(["U2W"]);
  });

  it("names the members the analysed loads hide: idle in every result, yet a roof load makes them work", () => {
    // Only services hung at the bottom node L2: U2L2 is zero (joint U2 joins the collinear top chords and U2L2, and
    // carries no load), yet a load at U2 goes straight down U2L2: +1 kN per kN upward (tension), statics at joint U2.
    const model = prattTruss();
    model.loadCases = [{ id: "hung", name: "10 kN hung at L2", category: "other", selfWeight: false, nodalLoads: [{ node: "L2", fx: 0, fy: 0, fz: -10 }] }];
    model.combinations = [];
    const result = analyzeModel(model);
    expect(result.zeroInAll.sort()).toEqual(["U1L1", "U2L2", "U3L3"]);
    const cert = idleForAnyLoad(createReviewContext(model, result, { standard: "EN1993-1-1" }));
    expect(cert.idleOnlyForAnalysedLoads).toEqual(["U2L2"]);
    const u2l2 = cert.members.find((m) => m.member === "U2L2")!;
    expect(u2l2.mattersMost[0]).toEqual({ node: "U2", direction: "z", value: expect.closeTo(1, 9) });
  });
});
