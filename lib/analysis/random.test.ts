import { lusolve, matrix, type Matrix } from "mathjs";
import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { loadVectorForCase } from "./loads";
import type { TrussModel } from "./model";
import { prepareStructure } from "./prepare";
import { seededRandom } from "@/tests/support/fixtures/analysis-models";

/**
 * A random stable space truss built like a "simple space truss" (Henneberg growth): a pinned base triangle,
 * then each new node joined to three random earlier nodes (in general position a new node with three bars is
 * fixed in space), plus extra random bars to make it indeterminate. Random sections, supports and loads.
 */
function randomTruss(seed: number, nodeCount: number): TrussModel {
  const random = seededRandom(seed);
  const r = (lo: number, hi: number) => lo + (hi - lo) * random();
  const nodes = [
    { id: "N0", x: 0, y: 0, z: 0 },
    { id: "N1", x: 5, y: 0.3, z: 0 },
    { id: "N2", x: 2, y: 4, z: 0.2 },
  ];
  const members: TrussModel["members"] = [];
  const pairs = new Set<string>();
  const join = (a: number, b: number) => {
    const key = a < b ? `${a}-${b}` : `${b}-${a}`;
    if (a === b || pairs.has(key)) return false;
    pairs.add(key);
    members.push({ id: `M${members.length}`, i: `N${a}`, j: `N${b}`, section: `S${Math.floor(random() * 3)}` });
    return true;
  };
  for (let k = 3; k < nodeCount; k++) {
    nodes.push({ id: `N${k}`, x: r(-4, 8), y: r(-4, 8), z: r(0.5, 6) });
    let joined = 0;
    while (joined < 3) if (join(k, Math.floor(random() * k))) joined++;
  }
  for (let extra = 0; extra < nodeCount; extra++) join(Math.floor(random() * nodeCount), Math.floor(random() * nodeCount));
  const supports = [0, 1, 2].map((k) => ({ node: `N${k}`, ux: true, uy: true, uz: true }));
  supports.push({ node: `N${nodeCount - 1}`, ux: false, uy: false, uz: true });
  const loads = () => nodes.filter(() => random() < 0.5).map((n) => ({ node: n.id, fx: r(-10, 10), fy: r(-10, 10), fz: r(-20, 5) }));
  return {
    format: "truss-model/1",
    name: `random ${seed}`,
    materials: [{ id: "steel", E: 2.1e8, fy: 355e3, unitWeight: 78.5 }],
    sections: [0, 1, 2].map((k) => ({ id: `S${k}`, material: "steel", area: r(5e-4, 5e-3), radiusOfGyration: 0.04, outerDiameter: 0.1, wallThickness: 0.005 })),
    nodes,
    members,
    supports,
    loadCases: [
      { id: "A", name: "A", category: "dead", selfWeight: true, nodalLoads: loads() },
      { id: "B", name: "B", category: "wind", selfWeight: false, nodalLoads: loads() },
    ],
    combinations: [{ id: "AB", name: "1.35A + 1.5B", factors: { A: 1.35, B: 1.5 } }],
  };
}

/** Independent dense reference: K assembled entry by entry, restrained rows and columns dropped, mathjs lusolve. */
function denseSolve(model: TrussModel, f: Float64Array): number[] {
  const index = new Map(model.nodes.map((n, k) => [n.id, k]));
  const size = 3 * model.nodes.length;
  const K = Array.from({ length: size }, () => new Array<number>(size).fill(0));
  const sections = new Map(model.sections.map((s) => [s.id, s]));
  for (const m of model.members) {
    const a = model.nodes[index.get(m.i)!];
    const b = model.nodes[index.get(m.j)!];
    const d = [b.x - a.x, b.y - a.y, b.z - a.z];
    const L = Math.hypot(d[0], d[1], d[2]);
    const k = (sections.get(m.section)!.area * model.materials[0].E) / L;
    const dofs = [0, 1, 2].map((s) => 3 * index.get(m.i)! + s).concat([0, 1, 2].map((s) => 3 * index.get(m.j)! + s));
    for (let p = 0; p < 6; p++) {
      for (let q = 0; q < 6; q++) {
        const sign = (p < 3) === (q < 3) ? 1 : -1;
        K[dofs[p]][dofs[q]] += (sign * k * d[p % 3] * d[q % 3]) / (L * L);
      }
    }
  }
  const restrained = new Set<number>();
  for (const s of model.supports) {
    const k = 3 * index.get(s.node)!;
    if (s.ux) restrained.add(k);
    if (s.uy) restrained.add(k + 1);
    if (s.uz) restrained.add(k + 2);
  }
  const free = [...Array(size).keys()].filter((q) => !restrained.has(q));
  const Kff = matrix(free.map((p) => free.map((q) => K[p][q])));
  const x = (lusolve(Kff, free.map((q) => f[q])) as Matrix).toArray().flat() as number[];
  const u = new Array<number>(size).fill(0);
  free.forEach((q, k) => (u[q] = x[k]));
  return u;
}

describe("random stable trusses against a dense solve (mathjs lusolve)", () => {
  it.each([1, 2, 3, 4, 5])("seed %i: displacements and member forces agree", (seed) => {
    const model = randomTruss(seed, 24);
    const structure = prepareStructure(model);
    expect(structure.status).toBe("ok");
    const result = analyzeModel(model);
    for (const caseId of ["A", "B"]) {
      const f = loadVectorForCase(model, caseId);
      const reference = denseSolve(model, f);
      const u = structure.solve(f);
      const scale = Math.max(...reference.map(Math.abs));
      for (let q = 0; q < u.length; q++) expect(Math.abs(u[q] - reference[q])).toBeLessThan(1e-9 * scale);
      const forces = structure.memberForces(Float64Array.from(reference));
      const largest = Math.max(...forces.map(Math.abs));
      model.members.forEach((m, e) => expect(Math.abs(result.results[caseId].memberForces[m.id] - forces[e])).toBeLessThan(1e-8 * largest));
    }
    // combinations are the factored sums of the case results
    for (const m of model.members) {
      const expected = 1.35 * result.results.A.memberForces[m.id] + 1.5 * result.results.B.memberForces[m.id];
      expect(result.results.AB.memberForces[m.id]).toBeCloseTo(expected, 8);
    }
    expect(result.results.AB.equilibriumResidual).toBeLessThan(1e-8);
  });
});
