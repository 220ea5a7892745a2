import { describe, expect, it } from "vitest";
import { analyzeModel, generateRoof, type TrussModel } from "@/lib/analysis";
import { seededRandom } from "@/tests/support/fixtures/analysis-models";
import { buildTopology } from "@/lib/analysis/topology";
import { prattTruss } from "@/tests/support/fixtures/review-models";
import { explainZeroForces, inspectZeroForces, loadVectorForResult } from "./why-zero";

/** A random planar truss in x–z (Pratt-, Howe- or mixed web), out-of-plane restraint at every node. */
function randomPlanarTruss(rand: () => number): TrussModel {
  const panels = 2 + Math.floor(rand() * 5);
  const a = 2 + rand() * 2;
  const h = 1.5 + rand() * 2;
  const nodes = [];
  for (let i = 0; i <= panels; i++) nodes.push({ id: `L${i}`, x: a * i, y: 0, z: 0 });
  for (let i = 1; i < panels; i++) nodes.push({ id: `U${i}`, x: a * i, y: 0, z: h });
  const pairs: string[][] = [];
  for (let i = 0; i < panels; i++) pairs.push([`L${i}`, `L${i + 1}`]);
  for (let i = 1; i < panels - 1; i++) pairs.push([`U${i}`, `U${i + 1}`]);
  pairs.push(["L0", "U1"], [`L${panels}`, `U${panels - 1}`]);
  for (let i = 1; i < panels; i++) pairs.push([`U${i}`, `L${i}`]);
  for (let i = 1; i < panels - 1; i++) pairs.push(rand() < 0.5 ? [`U${i}`, `L${i + 1}`] : [`L${i}`, `U${i + 1}`]);
  const loads = nodes
    .filter(() => rand() < 0.35)
    .map((n) => ({ node: n.id, fx: rand() < 0.3 ? 5 * (rand() - 0.5) : 0, fy: 0, fz: -10 * rand() }));
  return {
    format: "truss-model/1",
    name: "random planar",
    materials: [{ id: "S", E: 210e6, fy: 355e3, unitWeight: 78.5 }],
    sections: [{ id: "T", material: "S", area: 0.001, radiusOfGyration: 0.03, outerDiameter: 0.09, wallThickness: 0.004 }],
    nodes,
    members: pairs.map(([i, j]) => ({ id: `${i}-${j}`, i, j, section: "T" })),
    supports: nodes.map((n) => ({ node: n.id, ux: n.id === "L0", uy: true, uz: n.id === "L0" || n.id === `L${panels}` })),
    loadCases: [{ id: "P", name: "random", category: "other", selfWeight: false, nodalLoads: loads }],
    combinations: [],
  };
}

/**
 * A generated grid roof with appendages (a node held by three members to its nearest nodes, some on earlier
 * appendages, so zeros chain) and extra load cases with point loads at a few random nodes (hangers, plant).
 */
function randomRoof(rand: () => number): TrussModel {
  const model = generateRoof({ spanX: 3 * (2 + Math.floor(rand() * 4)), spanY: 3 * (2 + Math.floor(rand() * 3)), module: 3, depth: 1.5 + rand() });
  const section = model.sections[0].id;
  for (let k = 0; k < 8; k++) {
    const base = model.nodes[Math.floor(rand() * model.nodes.length)];
    const node = { id: `X${k}`, x: base.x + 2 * (rand() - 0.5), y: base.y + 2 * (rand() - 0.5), z: base.z + (rand() < 0.5 ? -1 : 1) * (0.5 + rand()) };
    const nearest = [...model.nodes].sort((p, q) => Math.hypot(p.x - node.x, p.y - node.y, p.z - node.z) - Math.hypot(q.x - node.x, q.y - node.y, q.z - node.z)).slice(0, 3);
    model.nodes.push(node);
    nearest.forEach((n, s) => model.members.push({ id: `X${k}-${s}`, i: n.id, j: node.id, section }));
  }
  for (let k = 0; k < 3; k++) {
    const picked = model.nodes.filter(() => rand() < 0.08);
    model.loadCases.push({
      id: `point-${k}`,
      name: "random point loads",
      category: "other",
      selfWeight: false,
      nodalLoads: picked.map((n) => ({ node: n.id, fx: 0, fy: 0, fz: -5 - 10 * rand() })),
    });
  }
  return model;
}

describe("inspectZeroForces", () => {
  // check-values §5.3 Example 4 (derived by the method of joints): in 4a (20 kN at L2) U1L1 and U3L3 are zero by
  // the three-member rule at L1 and L3, U2L2 by the same rule at U2; in 4b only U2L2 is zero.
  const model = prattTruss();
  const topology = buildTopology(model);
  const zeroIds = (caseId: string) =>
    [...inspectZeroForces(topology, loadVectorForResult(model, caseId, topology)).values()].map((s) => [s.member, s.joint, s.rule]);

  it("finds the Pratt truss zero-force members with the three-member rule", () => {
    expect(zeroIds("4a").sort()).toEqual([
      ["U1L1", "L1", "planar rule 2"],
      ["U2L2", "U2", "planar rule 2"],
      ["U3L3", "L3", "planar rule 2"],
    ]);
    expect(zeroIds("4b")).toEqual([["U2L2", "U2", "planar rule 2"]]);
  });

  it("follows a chain: a dangling two-member spur drops out joint by joint", () => {
    // A spur X–Y–Z hung off L2 and U3: Z is unloaded with two non-collinear members, so both are zero.
    const spur = prattTruss();
    spur.nodes.push({ id: "Z", x: 7, y: 0, z: 6 });
    spur.members.push({ id: "U2Z", i: "U2", j: "Z", section: "T1" }, { id: "U3Z", i: "U3", j: "Z", section: "T1" });
    spur.supports.push({ node: "Z", ux: false, uy: true, uz: false });
    const result = analyzeModel(spur);
    const why = explainZeroForces(spur, result)["4a"];
    const u2l2 = why.find((w) => w.member === "U2L2")!;
    expect(u2l2.method).toBe("inspection");
    // U2 now has U1U2, U2U3 (collinear), U2L2 and U2Z: only after U2Z drops out (two-member rule at Z) does
    // the three-member rule show U2L2 zero.
    expect(u2l2.chain.map((s) => s.member)).toEqual(["U2Z", "U2L2"]);
    expect(u2l2.chain[0].rule).toBe("planar rule 1");
    expect(u2l2.explanation).toMatch(/once U2Z is known to carry nothing/);
  });

  it("only ever calls a member zero when the analysis finds it zero (many generated trusses)", { timeout: 60_000 }, () => {
    const rand = seededRandom(20261201);
    let shown = 0;
    let analysed = 0;
    let shownInSpace = 0;
    for (let k = 0; k < 60; k++) {
      const model = k % 2 === 0 ? randomPlanarTruss(rand) : randomRoof(rand);
      const result = analyzeModel(model);
      if (result.status !== "ok") continue;
      analysed++;
      const topology = buildTopology(model);
      for (const [resultId, caseResult] of Object.entries(result.results)) {
        const zero = new Set(caseResult.zeroForceMembers);
        for (const step of inspectZeroForces(topology, loadVectorForResult(model, resultId, topology)).values()) {
          expect(zero.has(step.member), `${model.name} ${resultId} ${step.member}`).toBe(true);
          shown++;
          if (k % 2 === 1) shownInSpace++;
        }
      }
    }
    expect(analysed).toBeGreaterThan(40);
    // The rules did fire, in planar and in space trusses, so the check above means something.
    expect(shown).toBeGreaterThan(200);
    expect(shownInSpace).toBeGreaterThan(100);
  });
});

describe("explainZeroForces", () => {
  it("explains each zero-force member of every result, by inspection or by analysis", () => {
    const model = prattTruss();
    const why = explainZeroForces(model, analyzeModel(model));
    expect(why["4a"].map((w) => w.member).sort()).toEqual(["U1L1", "U2L2", "U3L3"]);
    expect(why["4a"].every((w) => w.method === "inspection")).toBe(true);
    expect(why["C1"].map((w) => w.member)).toEqual(["U2L2"]);
    expect(why["4a"][0].explanation).toMatch(/collinear/);
  });
});

describe("rule names", () => {
  it("names the special case only when the load acts along the other member", () => {
    // check-values §5.1 special case: two members at a joint, the load in line with one: the other is zero.
    // A spur Z off U2/U3 loaded along U3Z; then the same spur loaded off that line (no longer the special case).
    const spur = (load: { fx: number; fz: number }) => {
      const model = prattTruss();
      model.nodes.push({ id: "Z", x: 9, y: 0, z: 7 });
      model.members.push({ id: "U3Z", i: "U3", j: "Z", section: "T1" }, { id: "U2Z", i: "U2", j: "Z", section: "T1" });
      model.supports.push({ node: "Z", ux: false, uy: true, uz: false });
      model.loadCases = [{ id: "P", name: "at Z", category: "other", selfWeight: false, nodalLoads: [{ node: "Z", fx: load.fx, fy: 0, fz: load.fz }] }];
      model.combinations = [];
      const topology = buildTopology(model);
      return [...inspectZeroForces(topology, loadVectorForResult(model, "P", topology)).values()].find((s) => s.joint === "Z");
    };
    expect(spur({ fx: 0, fz: 5 })).toMatchObject({ member: "U2Z", rule: "special case: load along the other member" });
    expect(spur({ fx: 3, fz: 5 })).toBeUndefined(); // a load off both lines needs both members
  });
});
