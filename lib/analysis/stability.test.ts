import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { generateRoof } from "./generator";
import { prepareStructure } from "./prepare";
import type { TrussModel } from "./model";
import { pointLoads, triangleModel, trussModel } from "@/tests/support/fixtures/analysis-models";

const pinned = (node: string): [string, boolean, boolean, boolean] => [node, true, true, true];

/** Largest first-order elongation c·(v_j − v_i) of any member under a motion v (full 3n, model node order). */
function maxElongation(model: TrussModel, v: number[]): number {
  const index = new Map(model.nodes.map((n, k) => [n.id, k]));
  let worst = 0;
  for (const m of model.members) {
    const a = model.nodes[index.get(m.i)!];
    const b = model.nodes[index.get(m.j)!];
    const L = Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
    const c = [(b.x - a.x) / L, (b.y - a.y) / L, (b.z - a.z) / L];
    const ia = 3 * index.get(m.i)!;
    const ib = 3 * index.get(m.j)!;
    worst = Math.max(worst, Math.abs(c[0] * (v[ib] - v[ia]) + c[1] * (v[ib + 1] - v[ia + 1]) + c[2] * (v[ib + 2] - v[ia + 2])));
  }
  return worst;
}

/** The whole result must be plain finite JSON (JSON.stringify would turn NaN or Infinity into null). */
function expectFiniteJson(value: unknown) {
  expect(JSON.stringify(value)).not.toMatch(/NaN|Infinity|null/);
}

describe("mechanisms are reported as unstable with the free node and direction", () => {
  it("an unsupported node with no members", () => {
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 3, 0, 0],
        ["C", 0, 3, 0],
        ["D", 0, 0, 3],
        ["LOOSE", 5, 5, 5],
      ],
      members: ["A-B", "A-C", "A-D", "B-C", "B-D", "C-D"],
      supports: [pinned("A"), pinned("B"), pinned("C")],
      loadCases: [pointLoads("P", [["D", 1, 1, -5]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    expect(r.instability).toEqual([{ node: "LOOSE", directions: ["ux", "uy", "uz"] }]);
    // three modes, one per axis, each moving LOOSE alone
    expect(r.info.instabilityText).toHaveLength(3);
    for (const line of r.info.instabilityText!) expect(line).toMatch(/^Mechanism \d: these joints move together with nothing resisting: LOOSE \(\+1\.00 [xyz]\)/);
    expect(r.results).toEqual({});
    expectFiniteJson(r);
  });

  it("a joint held only by collinear members", () => {
    // C sits on the line A-B: the two members give it no stiffness across that line (y and z).
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 4, 0, 0],
        ["C", 2, 0, 0],
      ],
      members: ["A-C", "C-B"],
      supports: [pinned("A"), pinned("B")],
      loadCases: [pointLoads("P", [["C", 0, 0, -10]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    expect(r.instability).toEqual([{ node: "C", directions: ["uy", "uz"] }]);
    expectFiniteJson(r);
  });

  it("a nearly collinear joint (near-singular stiffness) is flagged too, not solved into huge numbers", () => {
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 4, 0, 0],
        ["C", 2, 0, 1e-7],
      ],
      members: ["A-C", "C-B"],
      supports: [pinned("A"), pinned("B"), ["C", false, true, false]],
      loadCases: [pointLoads("P", [["C", 0, 0, -10]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    expect(r.instability).toEqual([{ node: "C", directions: ["uz"] }]);
    expectFiniteJson(r);
  });

  it("too few supports: a tetrahedron held at one pinned node can rotate", () => {
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 3, 0, 0],
        ["C", 0, 3, 0],
        ["D", 0, 0, 3],
      ],
      members: ["A-B", "A-C", "A-D", "B-C", "B-D", "C-D"],
      supports: [pinned("A")],
      loadCases: [pointLoads("P", [["D", 0, 0, -5]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    // three rigid-body rotations about A remain: three modes; A never moves, B, C and D do; and every member keeps
    // its length to first order (c·(v_j − v_i) = 0, the definition of a mechanism motion)
    const modes = r.info.mechanismModes!;
    expect(modes).toHaveLength(3);
    for (const mode of modes) {
      expect(mode.kind).toBe("mechanism");
      expect(mode.joints.map((j) => j.node)).not.toContain("A");
      expect(maxElongation(model, mode.shape)).toBeLessThan(1e-9);
    }
    expect(r.instability!.map((i) => i.node).sort()).toEqual(["B", "C", "D"]);
    expect(r.info.countCheck.difference).toBe(6 + 3 - 12);
    expectFiniteJson(r);
  });

  it("a planar truss without out-of-plane restraint names the free node and y", () => {
    // check-values §5.2: every node of a planar truss needs an out-of-plane restraint in a 3D model.
    const model = triangleModel({ supports: [pinned("A"), ["B", false, true, true]], loadCases: [pointLoads("P", [["C", 0, 0, -10]])] });
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    expect(r.instability).toEqual([{ node: "C", directions: ["uy"] }]);
    expect(r.info.countCheck.reading).toMatch(/mechanism/);
  });

  it("the count check is information only: a count that suffices does not hide a mechanism", () => {
    // 4 members + 9 reactions = 13 >= 3 x 4 joints, yet D joins the structure by two collinear members.
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 4, 0, 0],
        ["C", 0, 4, 0],
        ["D", 2, 0, 0],
      ],
      members: ["A-D", "D-B", "A-C", "B-C"],
      supports: [pinned("A"), pinned("B"), pinned("C")],
    });
    const r = analyzeModel(model);
    expect(r.info.countCheck.difference).toBeGreaterThanOrEqual(0);
    expect(r.status).toBe("unstable");
    expect(r.instability).toEqual([{ node: "D", directions: ["uy", "uz"] }]);
  });

  it("prepareStructure reports the same status and still returns finite vectors", () => {
    const model = trussModel({
      nodes: [
        ["A", 0, 0, 0],
        ["B", 4, 0, 0],
        ["C", 2, 0, 0],
      ],
      members: ["A-C", "C-B"],
      supports: [pinned("A"), pinned("B")],
    });
    const s = prepareStructure(model);
    expect(s.status).toBe("unstable");
    const u = s.solve(new Float64Array([0, 0, 0, 0, 0, 0, 1, 1, 1]));
    expect([...u].every(Number.isFinite)).toBe(true);
  });
});

describe("mechanisms inside a large grid", () => {
  it("a bottom node left with two collinear chords is named alone, and nothing else is flagged", () => {
    const model = generateRoof({ spanX: 36, spanY: 36, module: 3, depth: 2 });
    model.members = model.members.filter((m) => !/^D-6-6-|^BCY-6-6$|^BCY-6-5$/.test(m.id));
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    expect(r.instability).toEqual([{ node: "B-6-6", directions: ["uy", "uz"] }]);
    expectFiniteJson(r);
  });
});

describe("mechanism modes name every joint that moves and how (issue 15 items 1, 2)", () => {
  it("a tripod missing a leg: the apex moves along the normal of the two legs' plane (closed form a × b)", () => {
    // Legs P–A and P–B with A(−1,−1,0), B(1,−1,0), P(0,0,2): a = (−1,−1,−2), b = (1,−1,−2), a × b = (0,−4,2),
    // so P moves along ±(0, −0.894, 0.447): mostly y, and both legs resist any motion along z alone.
    const model = trussModel({
      nodes: [
        ["A", -1, -1, 0],
        ["B", 1, -1, 0],
        ["P", 0, 0, 2],
      ],
      members: ["P-A", "P-B"],
      supports: [pinned("A"), pinned("B")],
      loadCases: [pointLoads("G", [["P", 0, 0, -10]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    const [mode, ...others] = r.info.mechanismModes!;
    expect(others).toHaveLength(0);
    expect(mode.kind).toBe("mechanism");
    expect(mode.joints.map((j) => j.node)).toEqual(["P"]);
    const n = [0, -4 / Math.sqrt(20), 2 / Math.sqrt(20)];
    const d = mode.joints[0].direction;
    const sign = Math.sign(d[1] / n[1]);
    d.forEach((v, s) => expect(sign * v).toBeCloseTo(n[s], 9));
    expect(r.instability).toEqual([{ node: "P", directions: ["uy", "uz"] }]);
  });

  it("a Pratt panel missing its diagonal racks: one mode moving several joints, no member stretched", () => {
    // check-values §5.3 Example 4 without U1L2 (removal check there: rank 23 of 24 → one mechanism).
    const model = trussModel({
      nodes: [
        ...[0, 1, 2, 3, 4].map((i): [string, number, number, number] => [`L${i}`, 3 * i, 0, 0]),
        ...[1, 2, 3].map((i): [string, number, number, number] => [`U${i}`, 3 * i, 0, 4]),
      ],
      members: ["L0-L1", "L1-L2", "L2-L3", "L3-L4", "U1-U2", "U2-U3", "L0-U1", "L4-U3", "U1-L1", "U2-L2", "U3-L3", "U3-L2"],
      supports: [pinned("L0"), ["L4", false, true, true], ...["L1", "L2", "L3", "U1", "U2", "U3"].map((id): [string, boolean, boolean, boolean] => [id, false, true, false])],
      loadCases: [pointLoads("P", [["L2", 0, 0, -20]])],
    });
    const r = analyzeModel(model);
    expect(r.status).toBe("unstable");
    const modes = r.info.mechanismModes!;
    expect(modes).toHaveLength(1);
    expect(modes[0].joints.length).toBeGreaterThan(1);
    expect(maxElongation(model, modes[0].shape)).toBeLessThan(1e-9);
    expect(r.info.instabilityText![0]).toMatch(/^Mechanism 1: these joints move together/);
  });

  it("a joint kinked 1e-5 m off the line is nearly a mechanism, an exactly straight one a mechanism", () => {
    const line = (offset: number) =>
      trussModel({
        nodes: [
          ["A", 0, 0, 0],
          ["B", 4, 0, 0],
          ["C", 2, 0, offset],
        ],
        members: ["A-C", "C-B"],
        supports: [pinned("A"), pinned("B"), ["C", false, true, false]],
      });
    const kinked = analyzeModel(line(1e-5));
    expect(kinked.info.mechanismModes![0].kind).toBe("nearly a mechanism");
    expect(kinked.info.instabilityText![0]).toMatch(/^Nearly a mechanism 1: .*C \(/);
    const straight = analyzeModel(line(0));
    expect(straight.info.mechanismModes![0].kind).toBe("mechanism");
  });

  it("a brace of area ratio 1e-9 is flagged nearly a mechanism, and displacements beyond span/50 are warned", () => {
    // C is held out of plane only by C–D with area 1e-12 m² (1e-9 of the others): k = EA/L = 2e8·1e-12/1 = 2e-4 kN/m,
    // so 1 kN along y moves C by 5000 m (closed form 1/k), far beyond span/50.
    const model = triangleModel({ supports: [pinned("A"), ["B", false, true, true]], loadCases: [pointLoads("P", [["C", 0, 1, -10]])] });
    model.nodes.push({ id: "D", x: 2, y: 1, z: 1.5 });
    model.supports.push({ node: "D", ux: true, uy: true, uz: true });
    model.sections.push({ ...model.sections[0], id: "tiny", area: 1e-12 });
    model.members.push({ id: "CD", i: "C", j: "D", section: "tiny" });
    const r = analyzeModel(model);
    expect(r.status).toBe("ok");
    expect(r.results.P.displacements.C.uy).toBeCloseTo(5000, 3);
    expect(r.info.nearMechanism?.joints[0].node).toBe("C");
    expect(r.info.warnings.some((w) => /^Nearly a mechanism/.test(w))).toBe(true);
    expect(r.info.warnings.some((w) => /span\/50/.test(w))).toBe(true);
  });

  it("a stable roof carries no warning", () => {
    const r = analyzeModel(generateRoof({ spanX: 12, spanY: 9, module: 3, depth: 1.5 }));
    expect(r.info.warnings).toEqual([]);
  });
});
