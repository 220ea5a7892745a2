import { describe, expect, it } from "vitest";
import { analyzeModel } from "./analyze";
import { modelFromCsv } from "./csv";

// The Example 1 triangle (check-values §5.3, method of joints) as CSV tables.
const tables = (): Record<string, string> => ({
  "nodes.csv": "id,x,y,z\nA,0,0,0\nB,4,0,0\nC,2,0,1.5\n",
  "members.csv": "id,i,j,section\nAB,A,B,T\nAC,A,C,T\nBC,B,C,T\n",
  "sections.csv": "id,material,area,radiusOfGyration,outerDiameter,wallThickness\nT,S,0.001,0.03,0.0889,0.004\n",
  "materials.csv": "id,E,fy,unitWeight\nS,2e8,355000,78.5\n",
  "supports.csv": "node,ux,uy,uz\nA,true,true,true\nB,false,yes,1\nC,no,true,false\n",
  "loadCases.csv": "id,name,category,selfWeight\ngravity,Gravity at C,dead,false\nlateral,Lateral at C,wind,false\n",
  "loads.csv": "loadCase,node,fx,fy,fz\ngravity,C,0,0,-10\nlateral,C,10,0,0\n",
  "combinations.csv": "id,name,loadCase,factor\nC1,1.2 gravity + lateral,gravity,1.2\nC1,1.2 gravity + lateral,lateral,1.0\n",
});

describe("modelFromCsv", () => {
  it("reads every table into the model format and analyses like the JSON model", () => {
    const result = modelFromCsv(tables());
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.model.supports[1]).toEqual({ node: "B", ux: false, uy: true, uz: true });
    expect(result.model.combinations).toEqual([{ id: "C1", name: "1.2 gravity + lateral", factors: { gravity: 1.2, lateral: 1 } }]);
    const analysis = analyzeModel(result.model);
    expect(analysis.results.gravity.memberForces.AB).toBeCloseTo(20 / 3, 9); // PL/(4h), method of joints
    expect(analysis.results.C1.memberForces.BC).toBeCloseTo(-16.25, 9);
  });

  it("fills in a default steel and one load case per name when those tables are absent", () => {
    const t = tables();
    delete t["materials.csv"];
    delete t["loadCases.csv"];
    delete t["combinations.csv"];
    t["sections.csv"] = t["sections.csv"].replace("T,S,", "T,S355,");
    const result = modelFromCsv(t);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.model.materials[0].id).toBe("S355");
    expect(result.model.loadCases.map((c) => [c.id, c.category])).toEqual([
      ["gravity", "other"],
      ["lateral", "other"],
    ]);
  });

  it("names the file and line of every problem", () => {
    const t = tables();
    t["nodes.csv"] = "id,x,y,z\nA,0,0,0\nB,4,zero,0\n\nC,2,0,1.5\nC,3,0,1\n";
    t["members.csv"] = "id,i,j,section\nAB,A,B,T\nAC,A,Q,T\nBC,B,C,T\n";
    t["loads.csv"] = "loadCase,node,fx,fy,fz\ngravity,C,0,0,-10\nlateral,Z,10,0,0\n";
    t["supports.csv"] = "node,ux,uy,uz\nA,true,true,true\nB,false,maybe,1\n";
    const result = modelFromCsv(t);
    expect(result.ok).toBe(false);
    const lines = result.ok ? [] : result.problems.map((p) => `${p.where}: ${p.message}`);
    expect(lines).toEqual(
      expect.arrayContaining([
        'nodes.csv line 3 (B): y is not a finite number ("zero")',
        'supports.csv line 3 (B): uy must be true or false ("maybe")',
        'nodes.csv line 6 (C): duplicate node id "C" (first at nodes.csv line 5 (C))',
        'members.csv line 3 (AC): member "AC" ends at a missing node "Q"',
        'loads.csv line 3 (Z): load case "lateral" has a load on a missing node "Z"',
      ]),
    );
  });

  it("reports missing tables and columns", () => {
    const result = modelFromCsv({ "nodes.csv": "id,x,y\nA,0,0\n" });
    expect(result.ok).toBe(false);
    const where = result.ok ? [] : result.problems.map((p) => `${p.where}: ${p.message}`);
    expect(where).toEqual(expect.arrayContaining(["members.csv: table missing", 'nodes.csv header: missing column "z"']));
  });
});
