import { describe, expect, it } from "vitest";
import { prattTruss } from "@/tests/support/fixtures/review-models";
import { generateRoof } from "./generator";
import { prepareStructure, SOLVE_BLOCK } from "./prepare";

describe("unitLoadForces (the certificate workload)", () => {
  it("gives the Pratt truss's forces under 1 kN up at U1 by statics, and zero for a load on a support", () => {
    // Statics (derived here, as in lib/review/any-load.test.ts): 1 kN along +z at U1, 3 m from L0 on the 12 m span,
    // needs reactions of -0.75 kN at L0 and -0.25 kN at L4; joint L0 then gives the end diagonal L0U1 (3-4-5)
    // 0.75 x 5/4 = 0.9375 kN tension and the bottom chord L0L1 0.75 x 3/4 = 0.5625 kN compression. Every node's y is
    // restrained, so a load along y at U1 goes straight into its support.
    const model = prattTruss();
    const s = prepareStructure(model);
    const u1 = s.topology.nodeIndex.get("U1")!;
    const blocks = [...s.unitLoadForces(Int32Array.from([3 * u1 + 2, 3 * u1 + 1]))];
    expect(blocks).toHaveLength(1);
    const { first, width, forces } = blocks[0];
    expect([first, width]).toEqual([0, 2]);
    const force = (member: string, load: number) => forces[model.members.findIndex((m) => m.id === member) * width + load];
    expect(force("L0U1", 0)).toBeCloseTo(0.9375, 9);
    expect(force("L0L1", 0)).toBeCloseTo(-0.5625, 9);
    for (const member of model.members) expect(Math.abs(force(member.id, 1))).toBe(0);
  });

  it("gives, bit for bit, the member forces of solveColumns' displacements, across blocks", () => {
    const model = generateRoof({ spanX: 12, spanY: 9, module: 3, depth: 1.2 });
    const s = prepareStructure(model);
    const dofs = 3 * model.nodes.length;
    const m = model.members.length;
    // every dof of nodes in elimination order, restrained ones included: a full block and a short one
    const loadDofs = Int32Array.from({ length: SOLVE_BLOCK + 5 }, (_, c) => 3 * s.eliminationOrder[Math.floor(c / 3)] + (c % 3));
    expect(loadDofs.some((dof) => s.topology.restrained[dof])).toBe(true);
    const fs = new Float64Array(dofs * loadDofs.length);
    loadDofs.forEach((dof, c) => (fs[c * dofs + dof] = 1));
    const u = s.solveColumns(fs, loadDofs.length);
    const seen: number[] = [];
    const differing: string[] = []; // load, member: compared with Object.is, so -0 against +0 counts too
    for (const { first, width, forces } of s.unitLoadForces(loadDofs)) {
      expect(width).toBe(Math.min(SOLVE_BLOCK, loadDofs.length - first));
      for (let c = 0; c < width; c++) {
        const expected = s.memberForces(u.subarray((first + c) * dofs, (first + c + 1) * dofs));
        for (let e = 0; e < m; e++) if (!Object.is(forces[e * width + c], expected[e])) differing.push(`${first + c}, ${e}`);
      }
      seen.push(first);
    }
    expect(seen).toEqual([0, SOLVE_BLOCK]);
    expect(differing).toEqual([]);
  }, 60_000); // a shared, loaded machine; the work is a few milliseconds

  it("refuses once the factor is released", () => {
    const s = prepareStructure(prattTruss());
    s.release();
    expect(() => [...s.unitLoadForces(Int32Array.from([0]))]).toThrow(/released/);
  });
});
