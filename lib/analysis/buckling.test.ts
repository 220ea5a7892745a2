// Overall stability (linear buckling of the whole truss) against closed forms derived here and a dense eigen-solve
// of the same matrices by a general-purpose library (mathjs).
import { eigs, matrix, multiply, transpose, diag, type Matrix } from "mathjs";
import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { bucklingModes, geometricProduct } from "./buckling";
import { generalizedSymmetricEigen, symmetricEigen } from "./dense-eigen";
import { generateRoof } from "./generator";
import type { TrussModel } from "./model";
import { prepareStructure } from "./prepare";
import { pointLoads, seededRandom, steelMaterial, tube, trussModel } from "@/tests/support/fixtures/analysis-models";

const EA = steelMaterial.E * tube.area; // 2e5 kN

function forcesOf(model: TrussModel, resultId: string): Float64Array {
  const r = analyzeModel(model);
  expect(r.status).toBe("ok");
  return Float64Array.from(model.members, (m) => r.results[resultId].memberForces[m.id]);
}

/**
 * A column B–M–T of two pin-ended segments a long, pinned at B, held laterally at T, loaded P down at T, its
 * mid joint M held by one horizontal bar along x (length bx) and one along y (length by) to fixed points.
 *
 * Closed form (derived here): under P each segment carries N = −P; moving M sideways by δ turns both segments by
 * δ/a, so the geometric stiffness at M across the column is 2N/a, and the brace gives k = EA/b. Buckling when
 * k − α·2P/a = 0: α = k a / (2P), i.e. the ideal brace stiffness 2P/a of Winter's braced column (G. Winter,
 * "Lateral bracing of columns and beams", ASCE Transactions 1960; from memory). Motion along the column is axial
 * and the braces carry no force, so these are the only two modes.
 */
function bracedColumn({ a = 3, bx = 2, by = 4, P = 10, hanging = 0 } = {}): TrussModel {
  const nodes: [string, number, number, number][] = [
    ["B", 0, 0, 0],
    ["M", 0, 0, a],
    ["T", 0, 0, 2 * a],
    ["SX", bx, 0, a],
    ["SY", 0, by, a],
  ];
  const members = ["B-M", "M-T", "M-SX", "M-SY"];
  const supports: [string, boolean, boolean, boolean][] = [
    ["B", true, true, true],
    ["T", true, true, false],
    ["SX", true, true, true],
    ["SY", true, true, true],
  ];
  const loads: [string, number, number, number][] = [["T", 0, 0, -P]];
  // Hangers: joint H_k hung 2 m below a fixed point by a tension bar carrying 100 kN, held sideways by bars 10 m
  // long. A tension bar turned by θ pulls its joint back (geometric stiffness +T/L): only a reversed load could
  // buckle it, at α = −(EA/10)·2/100 = −400 in each of x and y (derived as above, with N = +T).
  for (let k = 0; k < hanging; k++) {
    const x = 20 + 3 * k;
    nodes.push([`A${k}`, x, 0, 0], [`H${k}`, x, 0, -2], [`X${k}`, x + 10, 0, -2], [`Y${k}`, x, 10, -2]);
    members.push(`A${k}-H${k}`, `H${k}-X${k}`, `H${k}-Y${k}`);
    supports.push([`A${k}`, true, true, true], [`X${k}`, true, true, true], [`Y${k}`, true, true, true]);
    loads.push([`H${k}`, 0, 0, -100]);
  }
  return trussModel({ nodes, members, supports, loadCases: [pointLoads("P", loads)] });
}

describe("linear buckling of the whole truss against closed forms", () => {
  it("a braced column: α = k a / (2P) for each brace, the mode moves the braced joint across the column", () => {
    const model = bracedColumn();
    const structure = prepareStructure(model);
    const { modes, converged } = bucklingModes(structure, forcesOf(model, "P"));
    expect(converged).toBe(true);
    expect(modes).toHaveLength(2);
    // y brace (4 m, k = 5e4 kN/m) is the softer: α = 5e4 × 3 / 20 = 7500; x brace: 1e5 × 3 / 20 = 15000
    expect(modes[0].alphaCr).toBeCloseTo((EA / 4) * 3 / (2 * 10), 6);
    expect(modes[1].alphaCr).toBeCloseTo((EA / 2) * 3 / (2 * 10), 6);
    expect(modes[0].joints).toHaveLength(1);
    expect(modes[0].joints[0].node).toBe("M");
    expect(Math.abs(modes[0].joints[0].direction[1])).toBeCloseTo(1, 8);
    expect(Math.abs(modes[1].joints[0].direction[0])).toBeCloseTo(1, 8);
  });

  it("tension members dominating the spectrum (reversed-load buckling) do not hide the compression mode", () => {
    // five hangers give ten modes at α = −400, more than the iteration's block; the column's modes stay 7500, 15000
    const model = bracedColumn({ hanging: 5 });
    const structure = prepareStructure(model);
    const { modes, converged } = bucklingModes(structure, forcesOf(model, "P"), { modes: 2 });
    expect(converged).toBe(true);
    expect(modes.map((m) => m.alphaCr)).toEqual([expect.closeTo(7500, 4), expect.closeTo(15000, 4)]);
  });

  it("a shallow two-bar (von Mises) truss: the symmetric snap mode and the sway mode", () => {
    // Supports at x = ±d, apex C at height h (held out of plane), P down at C. Derived here: each bar carries
    // N = −P / (2 sin θ); at C the bars give elastic stiffness 2k cos²θ (x) and 2k sin²θ (z), k = EA/L, and geometric
    // stiffness 2(N/L) sin²θ (x) and 2(N/L) cos²θ (z). Hence α_z = 2EA sin³θ / (P cos²θ) (snap-through, the
    // linearised estimate) and α_x = 2EA cos²θ / (P sin θ) (sway).
    const d = 5;
    const h = 0.5;
    const P = 20;
    const model = trussModel({
      nodes: [
        ["A", -d, 0, 0],
        ["B", d, 0, 0],
        ["C", 0, 0, h],
      ],
      members: ["A-C", "B-C"],
      supports: [
        ["A", true, true, true],
        ["B", true, true, true],
        ["C", false, true, false],
      ],
      loadCases: [pointLoads("P", [["C", 0, 0, -P]])],
    });
    const theta = Math.atan2(h, d);
    const snap = (2 * EA * Math.sin(theta) ** 3) / (P * Math.cos(theta) ** 2);
    const sway = (2 * EA * Math.cos(theta) ** 2) / (P * Math.sin(theta));
    const structure = prepareStructure(model);
    const { modes } = bucklingModes(structure, forcesOf(model, "P"));
    expect(modes.map((m) => m.alphaCr)).toEqual([expect.closeTo(snap, 6), expect.closeTo(sway, 4)]);
    expect(Math.abs(modes[0].joints[0].direction[2])).toBeCloseTo(1, 8);
  });

  it("no compression, no buckling: an empty list, not a made-up factor", () => {
    const model = bracedColumn({ P: 0, hanging: 1 });
    const structure = prepareStructure(model);
    expect(bucklingModes(structure, forcesOf(model, "P")).modes).toEqual([]);
  });
});

/** Dense K_ff and A = −K_G (free dofs) of a structure, column by column through the same products. */
function denseMatrices(model: TrussModel, forces: Float64Array) {
  const structure = prepareStructure(model);
  const r = structure.topology.restrained;
  const free = [...r.keys()].filter((q) => !r[q]);
  const dofs = r.length;
  const K: number[][] = [];
  const A: number[][] = [];
  for (const q of free) {
    const e = new Float64Array(dofs);
    e[q] = 1;
    const k = structure.internalForces(e);
    const a = geometricProduct(structure.topology, forces, e, 1);
    K.push(free.map((p) => k[p]));
    A.push(free.map((p) => a[p]));
  }
  return { structure, K, A };
}

describe("linear buckling against a dense eigen-solve of the same matrices (mathjs)", { timeout: 60_000 }, () => {
  it("a generated 4 × 4 double-layer roof: the lowest three αcr agree", () => {
    const model = generateRoof({ spanX: 12, spanY: 12, module: 3, depth: 1.5 });
    const result = analyzeModel(model);
    expect(result.status).toBe("ok");
    const id = model.combinations[0]?.id ?? model.loadCases[0].id;
    const forces = Float64Array.from(model.members, (m) => result.results[id].memberForces[m.id]);
    const { structure, K, A } = denseMatrices(model, forces);
    // μ = 1/α from K^{-1/2} A K^{-1/2} (K = V D Vᵀ), mathjs eigs on symmetric matrices
    const kEig = eigs(matrix(K));
    const V = kEig.eigenvectors.map((p) => p.vector as Matrix);
    const values = kEig.eigenvectors.map((p) => p.value as number);
    const Vm = transpose(matrix(V.map((v) => v.toArray() as number[])));
    const inverseRoot = multiply(multiply(Vm, diag(values.map((v) => 1 / Math.sqrt(v)))), transpose(Vm));
    const C = multiply(multiply(inverseRoot, matrix(A)), inverseRoot) as Matrix;
    const Cs = (C.toArray() as number[][]).map((row, i) => row.map((v, j) => 0.5 * (v + (C.get([j, i]) as number))));
    const mu = (eigs(matrix(Cs)).values as Matrix).toArray() as number[];
    const expected = mu
      .filter((v) => v > 0)
      .map((v) => 1 / v)
      .sort((x, y) => x - y)
      .slice(0, 3);
    expect(expected.length).toBe(3);
    const { modes, converged } = bucklingModes(structure, forces);
    expect(converged).toBe(true);
    modes.forEach((mode, k) => expect(mode.alphaCr / expected[k]).toBeCloseTo(1, 7));
  });

  it("the small dense routines agree with mathjs on a random symmetric pencil", () => {
    const random = seededRandom(15);
    const n = 7;
    const a = Array.from({ length: n }, () => Array.from({ length: n }, () => random() - 0.5));
    const sym = a.map((row, i) => row.map((v, j) => v + a[j][i]));
    const spd = multiply(matrix(a), transpose(matrix(a))).toArray() as number[][];
    spd.forEach((row, i) => (row[i] += 1));
    const ours = symmetricEigen(Float64Array.from(sym.flat()), n).values.sort();
    const theirs = ((eigs(matrix(sym)).values as Matrix).toArray() as number[]).sort((x, y) => x - y);
    Array.from(ours).forEach((v, k) => expect(v).toBeCloseTo(theirs[k], 10));
    // generalized: compare against mathjs on L⁻¹ A L⁻ᵀ through B^{-1/2} as above
    const g = generalizedSymmetricEigen(Float64Array.from(sym.flat()), Float64Array.from(spd.flat()), n).values.sort();
    const bEig = eigs(matrix(spd));
    const Vb = transpose(matrix(bEig.eigenvectors.map((p) => (p.vector as Matrix).toArray() as number[])));
    const root = multiply(multiply(Vb, diag(bEig.eigenvectors.map((p) => 1 / Math.sqrt(p.value as number)))), transpose(Vb));
    const Cg = multiply(multiply(root, matrix(sym)), root) as Matrix;
    const Cgs = (Cg.toArray() as number[][]).map((row, i) => row.map((v, j) => 0.5 * (v + (Cg.get([j, i]) as number))));
    const expectedG = ((eigs(matrix(Cgs)).values as Matrix).toArray() as number[]).sort((x, y) => x - y);
    Array.from(g).forEach((v, k) => expect(v).toBeCloseTo(expectedG[k], 9));
  });
});
