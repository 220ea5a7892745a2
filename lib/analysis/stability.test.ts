import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { generateRoof } from "./generator";
import { prepareStructure } from "./prepare";
import { pointLoads, triangleModel, trussModel } from "./test-fixtures";

const pinned = (node: string): [string, boolean, boolean, boolean] => [node, true, true, true];

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
    expect(r.info.instabilityText?.[0]).toMatch(/Node LOOSE is free to move along x, y and z: no member or support holds it in those directions/);
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
    // three rigid-body rotations remain: three free directions, named on nodes other than A
    const named = r.instability!.flatMap((i) => i.directions.map((d) => `${i.node}.${d}`));
    expect(named).toHaveLength(3);
    expect(named.every((n) => !n.startsWith("A."))).toBe(true);
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
