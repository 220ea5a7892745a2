import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { runAnalyzeCli } from "@/tests/support/analyze-cli";
import { pointLoads, triangleModel } from "@/tests/support/fixtures/analysis-models";
import { analyzeModel } from "./analyze";
import { generateRoof } from "./generator";

// Runs the real command line (scripts/analyze.ts, built to plain JS as `npm run analyze` runs it) on files in a
// scratch folder.
const dir = mkdtempSync(join(tmpdir(), "strutroom-analyze-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const run = runAnalyzeCli;

const triangle = (supports?: [string, boolean, boolean, boolean][]) => triangleModel({ supports, loadCases: [pointLoads("G", [["C", 0, 0, -10]])] });
const stable = triangle();

describe("npm run analyze (scripts/analyze.ts)", () => {
  it("exit 0 and the result JSON for a valid stable model", () => {
    const file = join(dir, "ok.json");
    writeFileSync(file, JSON.stringify(stable));
    const { code, stdout } = run(file, "--threshold", "7");
    expect(code).toBe(0);
    const result = JSON.parse(stdout);
    expect(result.status).toBe("ok");
    expect(result.results.G.memberForces.AB).toBeCloseTo(20 / 3, 9); // PL/(4h), method of joints
    expect(result.info.lowForce.members.G).toEqual(["AB"]);
  }, 60_000);

  it("exit 2 with each problem on its own stderr line", () => {
    const bad = structuredClone(stable);
    bad.members[0].j = "Z";
    bad.sections[0].area = -1;
    const file = join(dir, "bad.json");
    writeFileSync(file, JSON.stringify(bad));
    const { code, stdout, stderr } = run(file);
    expect(code).toBe(2);
    expect(stdout).toBe("");
    const lines = stderr.trim().split("\n");
    expect(lines).toHaveLength(2);
    expect(lines).toEqual(expect.arrayContaining([expect.stringMatching(/^members\[0\] "AB": .*missing node "Z"/), expect.stringMatching(/^sections\[0\] "T": area/)]));
  }, 60_000);

  it("exit 3 with the unstable result still printed", () => {
    const file = join(dir, "unstable.json");
    writeFileSync(file, JSON.stringify(triangle([["A", true, true, true], ["B", false, true, true]])));
    const { code, stdout, stderr } = run(file);
    expect(code).toBe(3);
    expect(JSON.parse(stdout)).toMatchObject({ status: "unstable", instability: [{ node: "C", directions: ["uy"] }] });
    expect(stderr).toMatch(/Mechanism 1: these joints move together with nothing resisting: C \(\+1\.00 y\)/);
  }, 60_000);

  it("--csv reads a folder of tables; problems name the CSV line", () => {
    const csv = join(dir, "csv");
    mkdirSync(csv);
    writeFileSync(join(csv, "nodes.csv"), "id,x,y,z\nA,0,0,0\nB,4,0,0\nC,2,0,1.5\n");
    writeFileSync(join(csv, "members.csv"), "id,i,j,section\nAB,A,B,T\nAC,A,C,T\nBC,B,C,T\n");
    writeFileSync(join(csv, "sections.csv"), "id,material,area,radiusOfGyration,outerDiameter,wallThickness\nT,S355,0.001,0.03,0.0889,0.004\n");
    writeFileSync(join(csv, "supports.csv"), "node,ux,uy,uz\nA,1,1,1\nB,0,1,1\nC,0,1,0\n");
    writeFileSync(join(csv, "loads.csv"), "loadCase,node,fx,fy,fz\nG,C,0,0,-10\n");
    const ok = run("--csv", csv);
    expect(ok.code).toBe(0);
    expect(JSON.parse(ok.stdout).results.G.memberForces.AC).toBeCloseTo(-25 / 3, 9);
    writeFileSync(join(csv, "loads.csv"), "loadCase,node,fx,fy,fz\nG,C,0,0,-10\nG,X,1,0,0\n");
    const bad = run("--csv", csv);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/^loads\.csv line 3 \(X\): .*missing node "X"/m);
  }, 60_000);

  it("--generate builds the roof from the generator's parameters, with the drift and wind zone cases; problems name the field", () => {
    const file = join(dir, "roof.json");
    writeFileSync(file, JSON.stringify({ spanX: 12, spanY: 9, module: 3, depth: 1.5, snow: 0.8, snowDriftEdge: "west", stepHeight: 2, upperRoofWidth: 10, windZones: true, windPeakPressure: 1, roofHeight: 10 }));
    const ok = run("--generate", file);
    expect(ok.code).toBe(0);
    const result = JSON.parse(ok.stdout);
    // the drift's total, 158.4 kN, is derived by hand in climatic-loads.test.ts (EN 1991-1-3 5.3.6): the reactions carry it
    const reactions = Object.values(result.results["snow-drift"].reactions as Record<string, { fz: number }>).reduce((sum, r) => sum + r.fz, 0);
    expect(reactions).toBeCloseTo(158.4, 6);
    expect(Object.keys(result.results)).toEqual(expect.arrayContaining(["wind-west-uplift", "wind-north-downward", "ULS-wind-south-uplift"]));
    writeFileSync(file, JSON.stringify({ spanX: 12, spanY: 9, module: 3, depth: 1.5, windZones: true }));
    const bad = run("--generate", file);
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/roof\.json: windPeakPressure: Give the peak velocity pressure/);
    expect(bad.stderr).toMatch(/roof\.json: roofHeight: /);
  }, 60_000);

  it("exit 1 for a usage error", () => {
    expect(run("--threshold", "-4", join(dir, "ok.json")).code).toBe(1);
    expect(run().code).toBe(1);
  }, 60_000);

  it("prints byte for byte what the library computes (design.md's format), on a generated grid", () => {
    // The built file must not change the output: the same JSON text as analyzeModel's result, plus a newline.
    const model = generateRoof({ name: "CLI grid", spanX: 12, spanY: 9, module: 3, depth: 1.5 });
    const file = join(dir, "grid.json");
    writeFileSync(file, JSON.stringify(model));
    const { code, stdout } = run(file);
    expect(code).toBe(0);
    expect(stdout).toBe(`${JSON.stringify(analyzeModel(model))}\n`);
  }, 60_000);
});
