import { describe, expect, it } from "vitest";
import { analyzeModel } from "@/lib/analysis";
import { readIfcRoof } from "./index";
import { ifcTriangleAnalysisFile, StepText } from "@/tests/support/fixtures/ifc-files";

const encode = (text: string) => new TextEncoder().encode(text);

// The same triangle as IFC2X3 writes an analysis model (entity and attribute lists of the IFC2X3 TC1 schema by
// buildingSMART): metres and kilonewtons in the unit assignment; the profile through IfcRelAssociatesProfileProperties
// and IfcGeneralProfileProperties (IFC2X3 has no material profile sets); material values as
// IfcMechanicalSteelMaterialProperties and IfcGeneralMaterialProperties; supports as IfcBoundaryNodeCondition
// stiffnesses where -1. is infinite (fixed) and 0. free; the combination as the load case assigned to a
// LOAD_COMBINATION group, entering with the case's Coefficient (IFC2X3 has no IfcRelAssignsToGroupByFactor).
function triangleIfc2x3File() {
  const s = new StepText("IFC2X3");
  const ctx = s.project(undefined, ["IFCSIUNIT(*,.FORCEUNIT.,.KILO.,.NEWTON.)"]);
  const o = s.ownerRef;
  const vertexAt = (x: number, y: number, z: number) => s.add(`IFCVERTEXPOINT(${s.point(x, y, z)})`);
  const shape = (kind: string, item: string) => s.add(`IFCPRODUCTDEFINITIONSHAPE($,$,(${s.add(`IFCTOPOLOGYREPRESENTATION(${ctx},'Reference','${kind}',(${item}))`)}))`);
  const connection = (guid: string, name: string, at: [number, number, number], fixed: [string, string, string]) => {
    const condition = s.add(`IFCBOUNDARYNODECONDITION('${name}',${fixed.join(",")},$,$,$)`);
    return s.add(`IFCSTRUCTURALPOINTCONNECTION('${guid}',${o},'${name}',$,$,$,${shape("Vertex", vertexAt(...at))},${condition})`);
  };
  const A = connection("2ConnA000000000000000A", "A", [0, 0, 0], ["-1.", "-1.", "-1."]);
  const B = connection("2ConnB000000000000000B", "B", [4, 0, 0], ["0.", "-1.", "-1."]);
  const C = connection("2ConnC000000000000000C", "C", [2, 0, 1.5], ["0.", "-1.", "0."]);
  const member = (guid: string, name: string, a: [number, number, number], b: [number, number, number]) =>
    s.add(`IFCSTRUCTURALCURVEMEMBER('${guid}',${o},'${name}',$,$,$,${shape("Edge", s.add(`IFCEDGE(${vertexAt(...a)},${vertexAt(...b)})`))},.RIGID_JOINED_MEMBER.)`);
  const ab = member("2MembAB00000000000000A", "AB", [0, 0, 0], [4, 0, 0]);
  const ac = member("2MembAC00000000000000A", "AC", [0, 0, 0], [2, 0, 1.5]);
  const bc = member("2MembBC00000000000000B", "BC", [4, 0, 0], [2, 0, 1.5]);
  const steel = s.add("IFCMATERIAL('S235')");
  // Pressures stay in pascals (the file assigns no pressure unit): E 2.1e11 Pa, fy 2.35e8 Pa; density 7850 kg/m3.
  s.add(`IFCMECHANICALSTEELMATERIALPROPERTIES(${steel},$,2.1E11,$,$,$,2.35E8,$,$,$,$,$,$)`);
  s.add(`IFCGENERALMATERIALPROPERTIES(${steel},$,$,7850.)`);
  s.add(`IFCRELASSOCIATESMATERIAL('2AssocAssocAssocAsso1',${o},$,$,(${ab},${ac},${bc}),${steel})`);
  const tube = s.add(`IFCCIRCLEHOLLOWPROFILEDEF(.AREA.,'CHS 88.9x4',${s.add(`IFCAXIS2PLACEMENT2D(${s.point(0, 0)},$)`)},0.04445,0.004)`);
  const properties = s.add(`IFCGENERALPROFILEPROPERTIES('CHS 88.9x4',${tube},$,$,$,$,$)`);
  s.add(`IFCRELASSOCIATESPROFILEPROPERTIES('2ProfProfProfProfProf1',${o},$,$,(${ab},${ac},${bc}),${properties},$,$)`);
  const analysis = s.add(`IFCSTRUCTURALANALYSISMODEL('2AnalysisAnalysisAnal1',${o},'Triangle',$,$,.LOADING_3D.,$,$,$)`);
  s.add(`IFCRELASSIGNSTOGROUP('2AssignAssignAssignAs1',${o},$,$,(${ab},${ac},${bc},${A},${B},${C}),$,${analysis})`);
  const gravity = s.add(`IFCSTRUCTURALLOADGROUP('2Case1aCase1aCase1aCa1',${o},'1a',$,$,.LOAD_CASE.,.PERMANENT_G.,.DEAD_LOAD_G.,1.2,$)`);
  const force = s.add("IFCSTRUCTURALLOADSINGLEFORCE('P',0.,0.,-10.,$,$,$)");
  const action = s.add(`IFCSTRUCTURALPOINTACTION('2ActionActionActionAc1',${o},'P at C',$,$,$,$,${force},.GLOBAL_COORDS.,.F.,$)`);
  s.add(`IFCRELCONNECTSSTRUCTURALACTIVITY('2ActsActsActsActsActs1',${o},$,$,${C},${action})`);
  s.add(`IFCRELASSIGNSTOGROUP('2LoadsLoadsLoadsLoads1',${o},$,$,(${action}),$,${gravity})`);
  const combination = s.add(`IFCSTRUCTURALLOADGROUP('2CombCombCombCombComb1',${o},'ULS',$,$,.LOAD_COMBINATION.,.PERMANENT_G.,.DEAD_LOAD_G.,$,$)`);
  s.add(`IFCRELASSIGNSTOGROUP('2CombinedCombinedComb1',${o},$,$,(${gravity}),$,${combination})`);
  return s.text();
}

describe("IFC roof import", () => {
  it("reads an IFC4 analysis model (mm, N, Pa) into our model; its analysis matches check-values Example 1a", async () => {
    const result = await readIfcRoof(encode(ifcTriangleAnalysisFile()));
    if ("message" in result) throw new Error(result.message);
    expect(result.problems).toEqual([]);
    expect(result.source).toBe("analysis model");
    const model = result.model!;
    expect(model.nodes).toEqual([
      { id: "A", x: 0, y: 0, z: 0 },
      { id: "B", x: 4, y: 0, z: 0 },
      { id: "C", x: 2, y: 0, z: 1.5 },
    ]);
    expect(model.members.map((m) => [m.id, m.i, m.j])).toEqual([
      ["AB", "A", "B"],
      ["AC", "A", "C"],
      ["BC", "B", "C"],
    ]);
    expect(model.supports).toEqual([
      { node: "A", ux: true, uy: true, uz: true },
      { node: "B", ux: false, uy: true, uz: true },
      { node: "C", ux: false, uy: true, uz: false },
    ]);
    // 2.1e11 Pa = 2.1e8 kPa; 7850 kg/m3 x 9.80665 m/s2 = 76.98 kN/m3; tube area pi(D^2 - d^2)/4 for D 88.9, d 80.9 mm.
    expect(model.materials).toEqual([{ id: "S355", E: 2.1e8, fy: 3.55e5, unitWeight: expect.closeTo(76.982, 3) }]);
    expect(model.sections[0]).toMatchObject({ id: "CHS 88.9x4", outerDiameter: 0.0889, wallThickness: 0.004, area: expect.closeTo((Math.PI * (0.0889 ** 2 - 0.0809 ** 2)) / 4, 9) });
    expect(model.loadCases).toEqual([{ id: "1a", name: "1a", category: "dead", selfWeight: false, nodalLoads: [{ node: "C", fx: 0, fy: 0, fz: -10 }] }]);
    expect(model.combinations).toEqual([{ id: "ULS", name: "ULS", factors: { "1a": 1.2 } }]);
    const analysis = analyzeModel(model);
    expect(analysis.status).toBe("ok");
    // check-values.md Example 1a (method of joints): AB +6.667, AC = BC -8.333 kN.
    expect(analysis.results["1a"].memberForces.AB).toBeCloseTo(6.667, 3);
    expect(analysis.results["1a"].memberForces.AC).toBeCloseTo(-8.333, 3);
    expect(analysis.results.ULS.memberForces.BC).toBeCloseTo(-10, 6);
  });

  it("reads an IFC2X3 analysis model (m, kN, Pa; profile properties, -1. supports, case coefficient) into the same model", async () => {
    const result = await readIfcRoof(encode(triangleIfc2x3File()));
    if ("message" in result) throw new Error(result.message);
    expect(result.problems).toEqual([]);
    expect(result.source).toBe("analysis model");
    const model = result.model!;
    expect(model.nodes).toEqual([
      { id: "A", x: 0, y: 0, z: 0 },
      { id: "B", x: 4, y: 0, z: 0 },
      { id: "C", x: 2, y: 0, z: 1.5 },
    ]);
    expect(model.supports).toEqual([
      { node: "A", ux: true, uy: true, uz: true },
      { node: "B", ux: false, uy: true, uz: true },
      { node: "C", ux: false, uy: true, uz: false },
    ]);
    expect(model.materials).toEqual([{ id: "S235", E: 2.1e8, fy: 2.35e5, unitWeight: expect.closeTo(76.982, 3) }]);
    expect(model.sections[0]).toMatchObject({ id: "CHS 88.9x4", material: "S235", outerDiameter: 0.0889, wallThickness: 0.004 });
    expect(model.members.map((m) => m.section)).toEqual(["CHS 88.9x4", "CHS 88.9x4", "CHS 88.9x4"]);
    expect(model.loadCases).toEqual([{ id: "1a", name: "1a", category: "dead", selfWeight: false, nodalLoads: [{ node: "C", fx: 0, fy: 0, fz: -10 }] }]);
    expect(model.combinations).toEqual([{ id: "ULS", name: "ULS", factors: { "1a": 1.2 } }]);
    const analysis = analyzeModel(model);
    // check-values.md Example 1a (method of joints): AB +6.667, AC = BC -8.333 kN; x 1.2 in the combination.
    expect(analysis.results["1a"].memberForces.AB).toBeCloseTo(6.667, 3);
    expect(analysis.results["1a"].memberForces.AC).toBeCloseTo(-8.333, 3);
    expect(analysis.results.ULS.memberForces.BC).toBeCloseTo(-10, 6);
  });

  it("IFC2X3: a finite spring stiffness is listed by the connection's GlobalId, not read as fixed", async () => {
    const result = await readIfcRoof(encode(triangleIfc2x3File().replace("IFCBOUNDARYNODECONDITION('B',0.,-1.,-1.,", "IFCBOUNDARYNODECONDITION('B',0.,-1.,5000.,")));
    if ("message" in result) throw new Error(result.message);
    expect(result.model).toBeUndefined();
    expect(result.problems).toEqual([{ where: "2ConnB000000000000000B", message: "spring stiffness 5000 is not read (our supports are fixed or free)" }]);
  });

  it("lists every problem with the element's GlobalId and stores no model", async () => {
    const broken = ifcTriangleAnalysisFile()
      .replace("IFCCIRCLEHOLLOWPROFILEDEF(.AREA.,'CHS 88.9x4',$,44.45,4.)", "IFCRECTANGLEPROFILEDEF(.AREA.,$,$,100.,50.)")
      .replace("IFCSTRUCTURALLOADSINGLEFORCE('P',0.,0.,-10000.,$,$,$)", "IFCSTRUCTURALLOADLINEARFORCE('q',0.,0.,-1.,$,$,$)");
    const result = await readIfcRoof(encode(broken));
    if ("message" in result) throw new Error(result.message);
    expect(result.model).toBeUndefined();
    expect(result.problems).toEqual([
      { where: "4MembAB00000000000000A", message: "profile IfcRectangleProfileDef is not a circular hollow section" },
      { where: "4MembAC00000000000000A", message: "profile IfcRectangleProfileDef is not a circular hollow section" },
      { where: "4MembBC00000000000000B", message: "profile IfcRectangleProfileDef is not a circular hollow section" },
      { where: "4ActionActionActionAc1", message: expect.stringContaining("point action not read") },
    ]);
  });

  it("says so when the file holds neither an analysis model nor members", async () => {
    const s = new StepText("IFC4");
    s.project(undefined);
    const result = await readIfcRoof(encode(s.text()));
    if ("message" in result) throw new Error(result.message);
    expect(result.problems).toEqual([{ where: "file", message: expect.stringContaining("no structural analysis model") }]);
  });
});
