// Small models for the review engine's unit tests (not used by product code).
import type { TrussModel } from "@/lib/analysis";
import { pointLoads, trussModel } from "@/lib/analysis/test-fixtures";

/**
 * check-values §5.3 Example 4: 4-panel Pratt truss in x–z, panel 3 m, height 4 m. Supports L0 (ux, uy, uz),
 * L4 (uy, uz), every other node uy. Case 4a: 20 kN down at L2; case 4b: 10 kN down at L1, L2, L3.
 */
export function prattTruss(): TrussModel {
  const nodes = [
    ...[0, 1, 2, 3, 4].map((i) => ({ id: `L${i}`, x: 3 * i, y: 0, z: 0 })),
    ...[1, 2, 3].map((i) => ({ id: `U${i}`, x: 3 * i, y: 0, z: 4 })),
  ];
  const pairs = [
    ["L0", "L1"], ["L1", "L2"], ["L2", "L3"], ["L3", "L4"],
    ["U1", "U2"], ["U2", "U3"],
    ["L0", "U1"], ["L4", "U3"],
    ["U1", "L1"], ["U2", "L2"], ["U3", "L3"],
    ["U1", "L2"], ["U3", "L2"],
  ];
  return {
    format: "truss-model/1",
    name: "Pratt truss, check-values Example 4",
    materials: [{ id: "S355", E: 210e6, fy: 355e3, unitWeight: 78.5 }],
    // CHS 88.9 x 4.0 in model units (check-values §4.2).
    sections: [{ id: "T1", material: "S355", area: 0.00106688, radiusOfGyration: 0.03005, outerDiameter: 0.0889, wallThickness: 0.004, fabrication: "hot-finished" }],
    nodes,
    members: pairs.map(([i, j]) => ({ id: `${i}${j}`, i, j, section: "T1" })),
    supports: nodes.map((n) => ({ node: n.id, ux: n.id === "L0", uy: true, uz: n.id === "L0" || n.id === "L4" })),
    loadCases: [
      { id: "4a", name: "20 kN at L2", category: "other", selfWeight: false, nodalLoads: [{ node: "L2", fx: 0, fy: 0, fz: -20 }] },
      {
        id: "4b",
        name: "10 kN at L1, L2, L3",
        category: "other",
        selfWeight: false,
        nodalLoads: ["L1", "L2", "L3"].map((node) => ({ node, fx: 0, fy: 0, fz: -10 })),
      },
    ],
    combinations: [{ id: "C1", name: "1.5 x 4b", factors: { "4b": 1.5 } }],
  };
}

/**
 * The Pratt truss with extras whose role is known by statics. Node X is held by four members to fully restrained
 * nodes, no three of them in a plane through X: they never carry force and any one can go (idle). U2W runs in
 * line with U2's own y restraint to a fixed node W: never any force, and it frames into the compressed top
 * chords at U2, but U2's support holds it across them anyway, so by stability it braces nothing (idle).
 */
export function prattWithExtras(): TrussModel {
  const model = prattTruss();
  const fixed = [
    { id: "S1", x: 0, y: 2, z: 0 },
    { id: "S2", x: -2, y: -1, z: 0 },
    { id: "S3", x: -2, y: 0, z: 1.5 },
    { id: "W", x: 6, y: 3, z: 4 },
  ];
  model.nodes.push(...fixed, { id: "X", x: -1, y: 0.5, z: 2 });
  model.supports.push(...fixed.map((n) => ({ node: n.id, ux: true, uy: true, uz: true })));
  for (const end of ["L0", "S1", "S2", "S3"]) model.members.push({ id: `X${end}`, i: "X", j: end, section: "T1" });
  model.members.push({ id: "U2W", i: "U2", j: "W", section: "T1" });
  return model;
}

/**
 * A column A(0,0,0)–M(0,0,2)–T(0,0,4), 10 kN down at T; T held in x and y, A pinned. M is held across the column
 * along x by MB (to a fixed B 2 m away, EA/L = 2e8·0.001/2 = 1e5 kN/m) and by MD (fixed D 3 m away, area 1e-8:
 * EA/L = 2e8·1e-8/3 = 0.667 kN/m), along y by MY. Horizontal members at M never carry force (first order).
 */
export function bracedColumn(): TrussModel {
  const model = trussModel({
    nodes: [
      ["A", 0, 0, 0],
      ["M", 0, 0, 2],
      ["T", 0, 0, 4],
      ["B", 2, 0, 2],
      ["D", -3, 0, 2],
      ["Y", 0, 2, 2],
    ],
    members: ["A-M", "M-T", "M-B", "M-D", "M-Y"],
    supports: [["A", true, true, true], ["T", true, true, false], ["B", true, true, true], ["D", true, true, true], ["Y", true, true, true]],
    loadCases: [pointLoads("P", [["T", 0, 0, -10]])],
  });
  model.sections.push({ ...model.sections[0], id: "thin", area: 1e-8 });
  model.members.find((m) => m.id === "MD")!.section = "thin";
  return model;
}
