import type { LoadCase, TrussModel } from "./model";

/** Small model builders shared by the analysis tests (plain data, no I/O). */
export const steelMaterial = { id: "S", E: 2e8, fy: 355e3, unitWeight: 78.5 };
export const tube = { id: "T", material: "S", area: 0.001, radiusOfGyration: 0.03, outerDiameter: 0.0889, wallThickness: 0.004 };

type NodeSpec = [id: string, x: number, y: number, z: number];
type SupportSpec = [node: string, ux: boolean, uy: boolean, uz: boolean];

/** A model from compact node, member and support lists; members are "A-B" pairs (id "AB"). */
export function trussModel(spec: {
  nodes: NodeSpec[];
  members: string[];
  supports: SupportSpec[];
  loadCases?: LoadCase[];
  combinations?: TrussModel["combinations"];
}): TrussModel {
  return {
    format: "truss-model/1",
    name: "test truss",
    materials: [{ ...steelMaterial }],
    sections: [{ ...tube }],
    nodes: spec.nodes.map(([id, x, y, z]) => ({ id, x, y, z })),
    members: spec.members.map((pair) => {
      const [i, j] = pair.split("-");
      return { id: `${i}${j}`, i, j, section: "T" };
    }),
    supports: spec.supports.map(([node, ux, uy, uz]) => ({ node, ux, uy, uz })),
    loadCases: spec.loadCases ?? [],
    combinations: spec.combinations ?? [],
  };
}

/**
 * The 3-4-5 triangle A(0,0,0), B(4,0,0), C(2,0,1.5) drawn in the x-z plane (members AB, AC, BC). By default A
 * is pinned, B is a roller in x and every node is held out of plane (uy), as a 3D model of a planar truss needs.
 */
export function triangleModel({ supports, ...rest }: { supports?: SupportSpec[]; loadCases?: LoadCase[]; combinations?: TrussModel["combinations"] } = {}): TrussModel {
  return trussModel({
    ...rest,
    nodes: [
      ["A", 0, 0, 0],
      ["B", 4, 0, 0],
      ["C", 2, 0, 1.5],
    ],
    members: ["A-B", "A-C", "B-C"],
    supports: supports ?? [
      ["A", true, true, true],
      ["B", false, true, true],
      ["C", false, true, false],
    ],
  });
}

/** A load case of point loads: [node, fx, fy, fz]. */
export function pointLoads(id: string, loads: [string, number, number, number][], category: LoadCase["category"] = "other"): LoadCase {
  return { id, name: id, category, selfWeight: false, nodalLoads: loads.map(([node, fx, fy, fz]) => ({ node, fx, fy, fz })) };
}

/** Deterministic pseudo-random numbers (mulberry32) so failures reproduce. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
