// Issue 15 item 5 end to end: the fabrication route is a section property of the model, set by the roof generator
// and by the CSV upload (default stated: cold-formed when absent, the conservative choice), and shown in every
// check, where it picks the EN 1993-1-1 Table 6.2 curve for hollow sections: hot finished a, cold formed c.
import { describe, expect, it } from "vitest";
import { analyzeModel, generateRoof, modelFromCsv } from "@/lib/analysis";
import { designMembers } from "./member-design";

const curveOf = (steps: { label: string; value: unknown }[]) => steps.find((s) => s.label === "Buckling curve")?.value;
const stepOf = (steps: { label: string; value: unknown; expression?: string }[]) => steps.find((s) => s.label === "Fabrication");

/** The governing EN checks of the compression members of a model. */
function compressionChecks(model: ReturnType<typeof generateRoof>) {
  return designMembers(model, analyzeModel(model), { standard: "EN1993-1-1" })
    .map((d) => d.governing)
    .filter((g): g is NonNullable<typeof g> => g !== null && g.mode === "compression");
}

describe("fabrication from the roof generator to the checks", () => {
  const params = { spanX: 9, spanY: 6, module: 3, depth: 1.5 };

  it("hot finished by the generator's stated default: every section says so and compression uses curve a (Table 6.2, S355)", () => {
    const model = generateRoof(params);
    expect(model.sections.every((s) => s.fabrication === "hot-finished")).toBe(true);
    const checks = compressionChecks(model);
    expect(checks.length).toBeGreaterThan(0);
    for (const c of checks) {
      expect(stepOf(c.steps)?.value).toBe("hot-finished");
      expect(curveOf(c.steps)).toBe("a");
    }
  });

  it("cold formed when chosen: curve c in every compression check, and never a larger resistance than hot finished", () => {
    const hot = compressionChecks(generateRoof(params));
    const cold = compressionChecks(generateRoof({ ...params, fabrication: "cold-formed" }));
    expect(cold.map((c) => curveOf(c.steps))).toEqual(hot.map(() => "c"));
    cold.forEach((c, k) => expect(c.resistance).toBeLessThanOrEqual(hot[k].resistance));
  });
});

describe("fabrication from the CSV upload", () => {
  const tables = (fabrication: string | null): Record<string, string> => ({
    "nodes.csv": "id,x,y,z\nA,0,0,0\nB,4,0,0\nC,2,0,1.5\n",
    "members.csv": "id,i,j,section\nAB,A,B,T\nAC,A,C,T\nBC,B,C,T\n",
    "sections.csv": fabrication === null ? "id,material,area,radiusOfGyration,outerDiameter,wallThickness\nT,S355,0.001,0.03,0.0889,0.004\n" : `id,material,area,radiusOfGyration,outerDiameter,wallThickness,fabrication\nT,S355,0.001,0.03,0.0889,0.004,${fabrication}\n`,
    "supports.csv": "node,ux,uy,uz\nA,1,1,1\nB,0,1,1\nC,0,1,0\n",
    "loads.csv": "loadCase,node,fx,fy,fz\nG,C,0,0,-10\n",
  });

  it("reads the optional column; absent or empty means the stated default cold-formed, shown in the check as the default", () => {
    const stated = modelFromCsv(tables("hot-finished"));
    expect(stated.ok && stated.model.sections[0].fabrication).toBe("hot-finished");
    for (const missing of [null, ""]) {
      const read = modelFromCsv(tables(missing));
      expect(read.ok).toBe(true);
      if (!read.ok) return;
      expect(read.model.sections[0].fabrication).toBeUndefined();
      // AC and BC are in compression under the load at C (method of joints, check-values §5.3 Example 1)
      const ac = designMembers(read.model, analyzeModel(read.model), { standard: "EN1993-1-1" }).find((d) => d.member === "AC")!.governing!;
      expect(stepOf(ac.steps)?.value).toBe("cold-formed");
      expect(stepOf(ac.steps)?.expression).toMatch(/default/);
      expect(curveOf(ac.steps)).toBe("c");
    }
  });

  it("refuses any other value, naming the table, line and section", () => {
    const read = modelFromCsv(tables("welded"));
    expect(read.ok).toBe(false);
    if (read.ok) return;
    expect(read.problems.some((p) => /^sections\.csv line 2/.test(p.where) && /fabrication must be hot-finished or cold-formed \(got "welded"\)/.test(p.message))).toBe(true);
  });
});
