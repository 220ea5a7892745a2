// A small report input for the report tests: a tripod whose three legs meet at the apex D, plus a member AB
// between two fully restrained supports (it can never carry force). Loads: 30 kN down at D (dead) and 40 kN up
// at D (wind uplift), so the legs are in compression under 1.35 G and in tension under 1.0 G + 1.5 W.
import { analyzeModel } from "../analysis/analyze";
import type { TrussModel } from "../analysis/model";
import type { ReportInput } from "./types";

const tube = { id: "CHS-88.9x4.0", material: "S355", area: 1.07e-3, radiusOfGyration: 0.0301, outerDiameter: 0.0889, wallThickness: 0.004 };

export const TRIPOD: TrussModel = {
  format: "truss-model/1",
  name: "Northfield lantern tripod",
  materials: [{ id: "S355", E: 210e6, fy: 355e3, unitWeight: 78.5 }],
  sections: [tube],
  nodes: [
    { id: "A", x: 1, y: 0, z: 0 },
    { id: "B", x: -0.5, y: Math.sqrt(3) / 2, z: 0 },
    { id: "C", x: -0.5, y: -Math.sqrt(3) / 2, z: 0 },
    { id: "D", x: 0, y: 0, z: 1 },
  ],
  members: [
    { id: "AD", i: "A", j: "D", section: tube.id },
    { id: "BD", i: "B", j: "D", section: tube.id },
    { id: "CD", i: "C", j: "D", section: tube.id },
    { id: "AB", i: "A", j: "B", section: tube.id },
  ],
  supports: ["A", "B", "C"].map((node) => ({ node, ux: true, uy: true, uz: true })),
  loadCases: [
    { id: "dead", name: "Lantern weight", category: "dead", selfWeight: false, nodalLoads: [{ node: "D", fx: 0, fy: 0, fz: -30 }] },
    { id: "wind", name: "Wind uplift", category: "wind", selfWeight: false, nodalLoads: [{ node: "D", fx: 0, fy: 0, fz: 40 }] },
  ],
  combinations: [
    { id: "ULS-1", name: "Permanent only 1.35G", factors: { dead: 1.35 } },
    { id: "ULS-3", name: "Uplift 1.0G + 1.5W", factors: { dead: 1, wind: 1.5 } },
  ],
};

/** The tripod analysed, with two clashes (one decided) and one open question. */
export function tripodReport(): ReportInput {
  return {
    project: { name: "Northfield Sports Hall", description: "Roof review for the Northfield community sports hall." },
    revision: { number: 3, name: "Lantern added", createdAt: "2026-03-02T09:00:00.000Z", createdBy: "Tomasz Reiner" },
    model: TRIPOD,
    result: analyzeModel(TRIPOD),
    combinations: ["ULS-1", "ULS-3"],
    compare: ["ULS-1", "ULS-3"],
    clashes: [
      { clashKey: "c-91ab", memberId: "AB", runId: "SA-01", kind: "hard", status: "active", outcome: "Opening accepted with conditions", note: "", conditions: "Sleeve 100 mm at mid-length", proposedBy: "Lucas Ferreira", decidedBy: "Tomasz Reiner", decidedAt: "2026-03-03T10:00:00.000Z" },
      { clashKey: "c-77fe", memberId: "CD", runId: "CW-02", kind: "clearance", status: "active", outcome: null, note: "", conditions: null, proposedBy: null, decidedBy: null, decidedAt: null },
    ],
    openQuestions: [{ title: "Can the lantern ring be lowered 200 mm?", anchor: "member AD", state: "open", author: "Amara Okafor", createdAt: "2026-03-02T11:00:00.000Z", comments: 2 }],
    generatedAt: "2026-03-04T08:30:00.000Z",
    generatedBy: "Ines Marlow",
  };
}
