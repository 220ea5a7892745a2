import { spawnSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { triangleModel } from "@/tests/support/fixtures/analysis-models";
import { exportIfc } from "./export";
import { StepText } from "@/tests/support/fixtures/ifc-files";

// Runs the real command line (scripts/ifc.ts through tsx) on files in a scratch folder.
const dir = mkdtempSync(join(tmpdir(), "strutroom-ifc-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(...args: string[]) {
  const out = spawnSync(join(process.cwd(), "node_modules/.bin/tsx"), ["scripts/ifc.ts", ...args], { encoding: "utf8", timeout: 60_000 });
  return { code: out.status, stdout: out.stdout, stderr: out.stderr };
}

function pipeFile(profile: string) {
  const s = new StepText("IFC4");
  const ctx = s.project(undefined);
  const shape = s.extrusion(ctx, s.add(profile), 5);
  s.add(`IFCPIPESEGMENT('5PipePipePipePipePipe1',$,'Pipe',$,$,${s.localPlacement(undefined, [1, 2, 3], [1, 0, 0], [0, 1, 0])},${shape},$,.RIGIDSEGMENT.)`);
  return s.text();
}

describe("npm run -s ifc (scripts/ifc.ts)", () => {
  it("runs: exit 0 and a mep-runs/1 file", () => {
    const file = join(dir, "pipe.ifc");
    writeFileSync(file, pipeFile("IFCCIRCLEPROFILEDEF(.AREA.,$,$,0.05)"));
    const { code, stdout } = run("runs", file);
    expect(code).toBe(0);
    expect(JSON.parse(stdout)).toEqual({
      format: "mep-runs/1",
      runs: [{ id: "5PipePipePipePipePipe1", name: "Pipe", system: "pipe", profile: { shape: "round", diameter: 0.1 }, insulation: 0, clearance: 0, weightPerMetre: 0, points: [{ x: 1, y: 2, z: 3 }, { x: 6, y: 2, z: 3 }] }],
    });
  }, 60_000);

  it("runs: exit 2 with the segment's GlobalId and reason on stderr", () => {
    const file = join(dir, "odd.ifc");
    writeFileSync(file, pipeFile("IFCELLIPSEPROFILEDEF(.AREA.,$,$,0.1,0.05)"));
    const { code, stdout, stderr } = run("runs", file);
    expect(code).toBe(2);
    expect(stdout).toBe("");
    expect(stderr).toContain("5PipePipePipePipePipe1: profile IfcEllipseProfileDef is not read");
  }, 60_000);

  it("model: exit 0 and a truss-model/1 model; usage errors exit 1", () => {
    const file = join(dir, "roof.ifc");
    writeFileSync(file, exportIfc({ model: triangleModel(), projectName: "T", fileName: "roof.ifc", time: "2026-01-01T00:00:00", openings: [] }));
    const { code, stdout, stderr } = run("model", file);
    expect(code).toBe(0);
    const model = JSON.parse(stdout);
    expect(model.format).toBe("truss-model/1");
    expect(model.members.map((m: { id: string }) => m.id)).toEqual(["AB", "AC", "BC"]);
    expect(stderr).toContain("note: nodes merged within 5 mm");
    expect(run("plan", file).code).toBe(1);
  }, 60_000);
});
