import { describe, expect, it } from "vitest";
import { generateRoof } from "./generator";
import { loadVectorForCase } from "./loads";
import { prepareStructure, SOLVE_BLOCK } from "./prepare";

describe("prepareStructure (used by the review engine for what-ifs and influence maps)", () => {
  const model = generateRoof({ spanX: 12, spanY: 9, module: 3, depth: 1.2 });
  const s = prepareStructure(model);
  const f = loadVectorForCase(model, "snow", s.topology);
  const u = s.solve(f);

  it("solves the full 3n vector with zeros at restraints", () => {
    expect(s.status).toBe("ok");
    expect(u).toHaveLength(3 * model.nodes.length);
    s.topology.restrained.forEach((r, q) => r && expect(u[q]).toBe(0));
  });

  it("memberForceVector b_e gives N_e = b_e . u, and the adjoint solve K z = b_e gives N_e = z . f (Maxwell-Betti)", () => {
    const forces = s.memberForces(u);
    for (const e of [0, 7, 40, forces.length - 1]) {
      const b = s.memberForceVector(e);
      const dot = (x: Float64Array, y: Float64Array) => x.reduce((sum, v, q) => sum + v * y[q], 0);
      expect(dot(b, u)).toBeCloseTo(forces[e], 9);
      const z = s.solve(b);
      expect(dot(z, f)).toBeCloseTo(forces[e], 6);
    }
  });

  it("solveMany gives the same displacements as one solve per load vector", () => {
    const vectors = model.loadCases.map((c) => loadVectorForCase(model, c.id, s.topology));
    const many = s.solveMany(vectors);
    vectors.forEach((v, k) => {
      const single = s.solve(v);
      single.forEach((value, q) => expect(many[k][q]).toBeCloseTo(value, 14));
    });
  });

  it("solveColumns gives the same displacements as one solve per vector, across several blocks", () => {
    const dofs = 3 * model.nodes.length;
    const count = 2 * SOLVE_BLOCK + 3; // two full blocks and a short one
    const fs = new Float64Array(dofs * count);
    for (let c = 0; c < count; c++) {
      // unit loads at free dofs in elimination order, and one column of the snow case
      if (c === 0) fs.set(f, 0);
      else fs[c * dofs + ((3 * s.eliminationOrder[c % s.eliminationOrder.length] + (c % 3)) % dofs)] = 1;
    }
    const xs = s.solveColumns(fs, count);
    for (const c of [0, 1, SOLVE_BLOCK, count - 1]) {
      const one = s.solve(fs.slice(c * dofs, (c + 1) * dofs));
      const scale = Math.max(...one.map(Math.abs));
      one.forEach((v, q) => expect(Math.abs(xs[c * dofs + q] - v)).toBeLessThanOrEqual(1e-12 * scale));
    }
    expect(() => s.solveColumns(fs, count + 1)).toThrow(/expected/);
  });

  it("refuses solves once the factor is released, but still gives member forces", () => {
    const once = prepareStructure(model);
    once.release();
    expect(() => once.solve(f)).toThrow(/released/);
    expect(() => once.solveMany([f])).toThrow(/released/);
    expect(() => once.release()).not.toThrow(); // a second release has nothing left to free
    expect(once.memberForces(u)).toEqual(s.memberForces(u));
  });

  it("reactions balance the applied loads", () => {
    const r = s.reactions(u, f);
    for (let d = 0; d < 3; d++) {
      let sum = 0;
      for (let q = d; q < r.length; q += 3) sum += r[q] + f[q];
      expect(Math.abs(sum)).toBeLessThan(1e-8);
    }
    s.topology.restrained.forEach((restrained, q) => !restrained && expect(r[q]).toBe(0));
  });
});

describe("reusing the symbolic analysis", () => {
  const model = generateRoof({ spanX: 15, spanY: 12, module: 3, depth: 1.5 });
  const intact = prepareStructure(model);
  const compare = (a: Float64Array, b: Float64Array) => {
    const scale = Math.max(...b.map(Math.abs));
    a.forEach((v, q) => expect(Math.abs(v - b[q])).toBeLessThanOrEqual(1e-12 * scale));
  };

  it("reuses it for a removal what-if and gives the fresh analysis's displacements", () => {
    const reduced = { ...model, members: model.members.filter((m) => m.id !== "BCX-1-1" && m.id !== "D-2-2-NE") };
    const reused = prepareStructure(reduced, { symbolic: intact.symbolic });
    const fresh = prepareStructure(reduced);
    expect(reused.symbolicReused).toBe(true);
    expect(fresh.symbolicReused).toBe(false);
    const f = loadVectorForCase(reduced, "snow", fresh.topology);
    compare(reused.solve(f), fresh.solve(f));
  });

  it("still finds the mechanism when the what-if frees a node", () => {
    const loose = { ...model, members: model.members.filter((m) => !m.id.startsWith("D-2-2-")) };
    const reused = prepareStructure(loose, { symbolic: intact.symbolic });
    expect(reused.symbolicReused).toBe(true);
    expect(reused.instability).toEqual(prepareStructure(loose).instability);
    expect(reused.instability).toEqual([{ node: "B-2-2", directions: ["uz"] }]);
  });

  it("analyses afresh when a member joins two nodes not joined before, or the restraints differ", () => {
    const braced = { ...model, members: [...model.members, { id: "EXTRA", i: "T-0-0", j: "T-2-2", section: model.members[0].section }] };
    const withBrace = prepareStructure(braced, { symbolic: intact.symbolic });
    expect(withBrace.symbolicReused).toBe(false);
    const f = loadVectorForCase(braced, "snow", withBrace.topology);
    compare(withBrace.solve(f), prepareStructure(braced).solve(f));
    const heldMore = { ...model, supports: model.supports.map((s) => ({ ...s, ux: true })) };
    expect(prepareStructure(heldMore, { symbolic: intact.symbolic }).symbolicReused).toBe(false);
  });
});

describe("unusual shapes", () => {
  it("a hub joint with 80 members: each carries -P / (80 sin θ) by symmetry and vertical equilibrium", () => {
    const count = 80;
    const ring = Array.from({ length: count }, (_, k) => ({ id: `R${k}`, x: 3 * Math.cos((2 * Math.PI * k) / count), y: 3 * Math.sin((2 * Math.PI * k) / count), z: 0 }));
    const model = {
      format: "truss-model/1" as const,
      name: "hub",
      materials: [{ id: "S", E: 2e8, fy: 355e3, unitWeight: 78.5 }],
      sections: [{ id: "T", material: "S", area: 0.001, radiusOfGyration: 0.03, outerDiameter: 0.0889, wallThickness: 0.004 }],
      nodes: [{ id: "HUB", x: 0, y: 0, z: 1 }, ...ring],
      members: ring.map((r) => ({ id: `M-${r.id}`, i: "HUB", j: r.id, section: "T" })),
      supports: ring.map((r) => ({ node: r.id, ux: true, uy: true, uz: true })),
      loadCases: [{ id: "P", name: "P", category: "other" as const, selfWeight: false, nodalLoads: [{ node: "HUB", fx: 0, fy: 0, fz: -80 }] }],
      combinations: [],
    };
    const s = prepareStructure(model);
    expect(s.status).toBe("ok");
    const forces = s.memberForces(s.solve(loadVectorForCase(model, "P")));
    const sinTheta = 1 / Math.sqrt(10);
    for (const n of forces) expect(n).toBeCloseTo(-80 / (count * sinTheta), 9);
  });
});
