import { describe, expect, it } from "vitest";
import { readIfcRuns } from "./index";
import { ifcDuctFile, StepText } from "@/tests/support/fixtures/ifc-files";

const encode = (text: string) => new TextEncoder().encode(text);

// IFC2X3 in metres: a chilled-water riser and its horizontal leg as two IfcFlowSegments typed as pipe segments, the
// second placed relative to a storey placement one metre up; one fitting (skipped and counted).
function pipeFile() {
  const s = new StepText("IFC2X3");
  const ctx = s.project(undefined);
  const o = s.ownerRef;
  const centre2d = s.add(`IFCAXIS2PLACEMENT2D(${s.point(0, 0)},$)`);
  const tube = s.add(`IFCCIRCLEHOLLOWPROFILEDEF(.AREA.,$,${centre2d},0.0572,0.0036)`);
  const storey = s.localPlacement(undefined, [0, 0, 1]);
  const riser = s.add(`IFCFLOWSEGMENT('3RiserRiserRiserRiser1',${o},'CHW riser',$,$,${s.localPlacement(undefined, [10, 2, 5], [0, 0, -1], [1, 0, 0])},${s.extrusion(ctx, tube, 3)},$)`);
  const leg = s.add(`IFCFLOWSEGMENT('3LegLegLegLegLegLegLe2',${o},'CHW leg',$,$,${s.localPlacement(storey, [10, 2, 1], [1, 0, 0], [0, 0, 1])},${s.extrusion(ctx, tube, 4)},$)`);
  s.add(`IFCFLOWFITTING('3FittingFittingFittin1',${o},'Bend',$,$,$,$,$)`);
  const type = s.add(`IFCPIPESEGMENTTYPE('3TypeTypeTypeTypeType1',${o},'CHW pipe DN100',$,$,$,$,$,$,.RIGIDSEGMENT.)`);
  s.add(`IFCRELDEFINESBYTYPE('3RelTypeRelTypeRelTy1',${o},$,$,(${riser},${leg}),${type})`);
  const system = s.add(`IFCSYSTEM('3SystemSystemSystemSy1',${o},'Chilled water',$,$)`);
  s.add(`IFCRELASSIGNSTOGROUP('3GroupGroupGroupGroup1',${o},$,$,(${riser},${leg}),$,${system})`);
  return s.text();
}

describe("IFC runs import (files written by the test; expected coordinates are those written)", () => {
  it("IFC4 in mm: joins segments by end points and through an elbow's ports, reads system, insulation and profiles", async () => {
    const result = await readIfcRuns(encode(ifcDuctFile()));
    if ("message" in result) throw new Error(result.message);
    expect(result.problems).toEqual([{ where: "2BadSegment00000000001", message: expect.stringContaining("IfcEllipseProfileDef is not read") }]);
    expect(result.skipped.fittings).toBe(1);
    const duct = result.runs.find((r) => r.system === "Supply air")!;
    expect(duct.id).toBe("1AAAAAAAAAAAAAAAAAAA-1");
    expect(duct.name).toBe("SA main 1");
    expect(duct.profile).toEqual({ shape: "round", diameter: 0.4 });
    expect(duct.insulation).toBe(0.05);
    expect(duct.points).toEqual([
      { x: 0, y: 0, z: 3 },
      { x: 4, y: 0, z: 3 },
      { x: 8, y: 0, z: 3 },
      { x: 8.3, y: 0.3, z: 3 },
      { x: 8.3, y: 5.3, z: 3 },
    ]);
    expect(result.sources[duct.id]).toEqual(["1AAAAAAAAAAAAAAAAAAA$1", "1BBBBBBBBBBBBBBBBBBBB2", "1CCCCCCCCCCCCCCCCCCCC3"]);
    const tray = result.runs.find((r) => r.id === "2TrayTrayTrayTrayTray1")!;
    expect(tray.system).toBe("cable tray");
    expect(tray.profile).toEqual({ shape: "rectangular", width: 0.3, height: 0.1, rotation: 90 });
    expect(tray.points).toEqual([
      { x: 2, y: 1, z: 4 },
      { x: 2, y: 7, z: 4 },
    ]);
    expect(result.runs).toHaveLength(2);
  });

  it("IFC2X3 in m: a riser and its leg (placed relative to a storey) become one pipe run of the group's system", async () => {
    const result = await readIfcRuns(encode(pipeFile()));
    if ("message" in result) throw new Error(result.message);
    expect(result.problems).toEqual([]);
    expect(result.skipped.fittings).toBe(1);
    expect(result.runs).toHaveLength(1);
    const [pipe] = result.runs;
    expect(pipe.system).toBe("Chilled water");
    expect(pipe.profile).toEqual({ shape: "round", diameter: 0.1144 });
    // "3LegLeg..." sorts before "3RiserRiser...", so the run starts at the leg's free end.
    expect(pipe.id).toBe("3LegLegLegLegLegLegLe2");
    expect(pipe.points).toEqual([
      { x: 14, y: 2, z: 2 },
      { x: 10, y: 2, z: 2 },
      { x: 10, y: 2, z: 5 },
    ]);
  });

  it("refuses what is not an IFC STEP file, or a schema it does not read", async () => {
    expect(await readIfcRuns(encode("hello"))).toEqual({ where: "file", message: expect.stringContaining("ISO-10303-21") });
    const ifc4x3 = ifcDuctFile().replace("FILE_SCHEMA(('IFC4'))", "FILE_SCHEMA(('IFC4X3_ADD2'))");
    expect(await readIfcRuns(encode(ifc4x3))).toEqual({ where: "file", message: expect.stringContaining("IFC4X3_ADD2") });
  });
});
