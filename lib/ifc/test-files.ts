// IFC STEP text written by the tests themselves (no third-party sample files): a tiny builder for the lines they need.
// Entity names and attribute order follow buildingSMART's IFC2X3 TC1 and IFC4 ADD2 TC1 schemas (ISO 16739 EXPRESS);
// the attribute lists were checked against web-ifc's schema classes, which are generated from those EXPRESS files.

/** Collects STEP lines and hands out their #ids. */
export class StepText {
  private lines: string[] = [];
  constructor(private schema: "IFC2X3" | "IFC4") {}
  add(entity: string): string {
    this.lines.push(`#${this.lines.length + 1}=${entity};`);
    return `#${this.lines.length}`;
  }
  point(x: number, y: number, z?: number): string {
    return this.add(`IFCCARTESIANPOINT((${[x, y, z].filter((v) => v !== undefined).map(real).join(",")}))`);
  }
  direction(x: number, y: number, z?: number): string {
    return this.add(`IFCDIRECTION((${[x, y, z].filter((v) => v !== undefined).map(real).join(",")}))`);
  }
  placement(origin: [number, number, number], axis?: [number, number, number], ref?: [number, number, number]): string {
    const o = this.point(...origin);
    const a = axis ? this.direction(...axis) : "$";
    const r = ref ? this.direction(...ref) : "$";
    return this.add(`IFCAXIS2PLACEMENT3D(${o},${a},${r})`);
  }
  localPlacement(relTo: string | undefined, origin: [number, number, number], axis?: [number, number, number], ref?: [number, number, number]): string {
    return this.add(`IFCLOCALPLACEMENT(${relTo ?? "$"},${this.placement(origin, axis, ref)})`);
  }
  /** Project with a length unit (MILLI or none) and any further unit lines, a model context; returns the context id. */
  project(lengthPrefix: "MILLI" | undefined, moreUnits: string[] = []): string {
    const length = this.add(`IFCSIUNIT(*,.LENGTHUNIT.,${lengthPrefix ? `.${lengthPrefix}.` : "$"},.METRE.)`);
    const more = moreUnits.map((u) => this.add(u));
    const units = this.add(`IFCUNITASSIGNMENT((${[length, ...more].join(",")}))`);
    const context = this.add(`IFCGEOMETRICREPRESENTATIONCONTEXT($,'Model',3,1.E-05,${this.placement([0, 0, 0])},$)`);
    const owner = this.schema === "IFC2X3" ? this.ownerHistory() : "$";
    this.add(`IFCPROJECT('0TestProject0000000001',${owner},'Test project',$,$,$,$,(${context}),${units})`);
    return context;
  }
  private owner?: string;
  /** IFC2X3 requires an owner history on rooted entities. */
  ownerHistory(): string {
    if (this.owner) return this.owner;
    const person = this.add(`IFCPERSON($,'Tester',$,$,$,$,$,$)`);
    const org = this.add(`IFCORGANIZATION($,'Tests',$,$,$)`);
    const pando = this.add(`IFCPERSONANDORGANIZATION(${person},${org},$)`);
    const app = this.add(`IFCAPPLICATION(${org},'1','tests','tests')`);
    this.owner = this.add(`IFCOWNERHISTORY(${pando},${app},$,.ADDED.,$,$,$,0)`);
    return this.owner;
  }
  get ownerRef(): string {
    return this.schema === "IFC2X3" ? this.ownerHistory() : "$";
  }
  /** Body shape: one extruded area solid of `profile` along the local z axis. */
  extrusion(context: string, profile: string, depth: number, position?: string): string {
    const solid = this.add(`IFCEXTRUDEDAREASOLID(${profile},${position ?? this.placement([0, 0, 0])},${this.direction(0, 0, 1)},${real(depth)})`);
    const rep = this.add(`IFCSHAPEREPRESENTATION(${context},'Body','SweptSolid',(${solid}))`);
    return this.add(`IFCPRODUCTDEFINITIONSHAPE($,$,(${rep}))`);
  }
  text(): string {
    return [
      "ISO-10303-21;",
      "HEADER;",
      "FILE_DESCRIPTION(('ViewDefinition [CoordinationView]'),'2;1');",
      "FILE_NAME('test.ifc','2026-01-01T00:00:00',('tests'),('tests'),'','','');",
      `FILE_SCHEMA(('${this.schema}'));`,
      "ENDSEC;",
      "DATA;",
      ...this.lines,
      "ENDSEC;",
      "END-ISO-10303-21;",
      "",
    ].join("\n");
  }
}

/** A STEP real: always with a decimal point. */
export const real = (v: number) => (Number.isInteger(v) ? `${v}.` : String(v));

// IFC4 in millimetres: a supply-air duct drawn as three IfcDuctSegments (the second one drawn backwards, the
// third behind an elbow joined through ports), a cable tray turned on edge, and a segment with an ellipse profile.
export function ifcDuctFile() {
  const s = new StepText("IFC4");
  const ctx = s.project("MILLI");
  const circle = s.add("IFCCIRCLEPROFILEDEF(.AREA.,$,$,200.)");
  const segment = (guid: string, name: string, origin: [number, number, number], axis: [number, number, number], depth: number, profile = circle) =>
    s.add(`IFCDUCTSEGMENT('${guid}',$,'${name}',$,$,${s.localPlacement(undefined, origin, axis, axis[2] === 0 ? [0, 0, 1] : [1, 0, 0])},${s.extrusion(ctx, profile, depth)},$,.RIGIDSEGMENT.)`);
  const a = segment("1AAAAAAAAAAAAAAAAAAA$1", "SA main 1", [0, 0, 3000], [1, 0, 0], 4000);
  const b = segment("1BBBBBBBBBBBBBBBBBBBB2", "SA main 2", [8000, 0, 3000], [-1, 0, 0], 4000);
  const c = segment("1CCCCCCCCCCCCCCCCCCCC3", "SA main 3", [8300, 300, 3000], [0, 1, 0], 5000);
  const elbow = s.add(`IFCDUCTFITTING('1ElbowElbowElbowElbow4',$,'Elbow',$,$,$,$,$,.BEND.)`);
  const port = (guid: string, owner: string) => {
    const p = s.add(`IFCDISTRIBUTIONPORT('${guid}',$,$,$,$,$,$,.SOURCEANDSINK.,.DUCT.,.AIRCONDITIONING.)`);
    s.add(`IFCRELNESTS('${guid.slice(0, 20)}Nx',$,$,$,${owner},(${p}))`);
    return p;
  };
  const p1 = port("1PortPortPortPortPort1", b);
  const p2 = port("1PortPortPortPortPort2", elbow);
  const p3 = port("1PortPortPortPortPort3", elbow);
  const p4 = port("1PortPortPortPortPort4", c);
  s.add(`IFCRELCONNECTSPORTS('1ConnConnConnConnConn1',$,$,$,${p1},${p2},$)`);
  s.add(`IFCRELCONNECTSPORTS('1ConnConnConnConnConn2',$,$,$,${p3},${p4},$)`);
  const system = s.add(`IFCDISTRIBUTIONSYSTEM('1SystemSystemSystemSy1',$,'Supply air',$,$,$,.VENTILATION.)`);
  s.add(`IFCRELASSIGNSTOGROUP('1GroupGroupGroupGroup1',$,$,$,(${a},${b},${c},${elbow}),$,${system})`);
  const covering = s.add(`IFCCOVERING('1InsulInsulInsulInsul1',$,'Lagging',$,$,$,$,$,.INSULATION.)`);
  s.add(`IFCRELCOVERSBLDGELEMENTS('1CoversCoversCoversCo1',$,$,$,${a},(${covering}))`);
  s.add(`IFCRELCOVERSBLDGELEMENTS('1CoversCoversCoversCo2',$,$,$,${b},(${covering}))`);
  s.add(`IFCRELCOVERSBLDGELEMENTS('1CoversCoversCoversCo3',$,$,$,${c},(${covering}))`);
  const thickness = s.add("IFCPROPERTYSINGLEVALUE('NominalThickness',$,IFCPOSITIVELENGTHMEASURE(50.),$)");
  const pset = s.add(`IFCPROPERTYSET('1PsetPsetPsetPsetPset1',$,'Pset_CoveringCommon',$,(${thickness}))`);
  s.add(`IFCRELDEFINESBYPROPERTIES('1DefsDefsDefsDefsDefs1',$,$,$,(${covering}),${pset})`);
  // Cable tray 300 x 100 along +y with its profile x axis (the 300 side) pointing up: rotation 90 degrees.
  const rectangle = s.add("IFCRECTANGLEPROFILEDEF(.AREA.,$,$,300.,100.)");
  const trayPlacement = s.localPlacement(undefined, [2000, 1000, 4000], [0, 1, 0], [0, 0, 1]);
  s.add(`IFCCABLECARRIERSEGMENT('2TrayTrayTrayTrayTray1',$,'Tray',$,$,${trayPlacement},${s.extrusion(ctx, rectangle, 6000)},$,.CABLETRAYSEGMENT.)`);
  const ellipse = s.add("IFCELLIPSEPROFILEDEF(.AREA.,$,$,100.,50.)");
  s.add(`IFCPIPESEGMENT('2BadSegment00000000001',$,'Odd',$,$,${s.localPlacement(undefined, [0, 0, 0])},${s.extrusion(ctx, ellipse, 1000)},$,.RIGIDSEGMENT.)`);
  return s.text();
}

const T = "IFCBOOLEAN(.T.)";
const F = "IFCBOOLEAN(.F.)";

// The 3-4-5 triangle of shared/reference/check-values.md Example 1 written as an IFC4 structural analysis model in
// millimetres and newtons (IFC's SI defaults for force and pressure), with case 1a (10 kN down at C) and a
// combination 1.2 x 1a.
export function ifcTriangleAnalysisFile() {
  const s = new StepText("IFC4");
  const ctx = s.project("MILLI");
  const vertexAt = (x: number, y: number, z: number) => s.add(`IFCVERTEXPOINT(${s.point(x, y, z)})`);
  const shape = (kind: string, item: string) => s.add(`IFCPRODUCTDEFINITIONSHAPE($,$,(${s.add(`IFCTOPOLOGYREPRESENTATION(${ctx},'Reference','${kind}',(${item}))`)}))`);
  const connection = (guid: string, name: string, at: [number, number, number], fixed: [string, string, string]) => {
    const condition = s.add(`IFCBOUNDARYNODECONDITION('${name}',${fixed.join(",")},${F},${F},${F})`);
    return s.add(`IFCSTRUCTURALPOINTCONNECTION('${guid}',$,'${name}',$,$,$,${shape("Vertex", vertexAt(...at))},${condition},$)`);
  };
  const A = connection("4ConnA000000000000000A", "A", [0, 0, 0], [T, T, T]);
  connection("4ConnB000000000000000B", "B", [4000, 0, 0], [F, T, T]);
  const C = connection("4ConnC000000000000000C", "C", [2000, 0, 1500], [F, T, F]);
  const member = (guid: string, name: string, a: [number, number, number], b: [number, number, number]) =>
    s.add(`IFCSTRUCTURALCURVEMEMBER('${guid}',$,'${name}',$,$,$,${shape("Edge", s.add(`IFCEDGE(${vertexAt(...a)},${vertexAt(...b)})`))},.RIGID_JOINED_MEMBER.,${s.direction(0, 1, 0)})`);
  const ab = member("4MembAB00000000000000A", "AB", [0, 0, 0], [4000, 0, 0]);
  const ac = member("4MembAC00000000000000A", "AC", [0, 0, 0], [2000, 0, 1500]);
  const bc = member("4MembBC00000000000000B", "BC", [4000, 0, 0], [2000, 0, 1500]);
  const steel = s.add("IFCMATERIAL('S355',$,'Steel')");
  const single = (name: string, value: string) => s.add(`IFCPROPERTYSINGLEVALUE('${name}',$,${value},$)`);
  s.add(`IFCMATERIALPROPERTIES('Pset_MaterialMechanical',$,(${single("YoungModulus", "IFCMODULUSOFELASTICITYMEASURE(2.1E11)")}),${steel})`);
  s.add(`IFCMATERIALPROPERTIES('Pset_MaterialSteel',$,(${single("YieldStress", "IFCPRESSUREMEASURE(3.55E8)")}),${steel})`);
  s.add(`IFCMATERIALPROPERTIES('Pset_MaterialCommon',$,(${single("MassDensity", "IFCMASSDENSITYMEASURE(7850.)")}),${steel})`);
  const tube = s.add("IFCCIRCLEHOLLOWPROFILEDEF(.AREA.,'CHS 88.9x4',$,44.45,4.)");
  const profileSet = s.add(`IFCMATERIALPROFILESET('CHS',$,(${s.add(`IFCMATERIALPROFILE('CHS',$,${steel},${tube},$,$)`)}),$)`);
  s.add(`IFCRELASSOCIATESMATERIAL('4AssocAssocAssocAsso1',$,$,$,(${ab},${ac},${bc}),${profileSet})`);
  const analysis = s.add(`IFCSTRUCTURALANALYSISMODEL('4AnalysisAnalysisAnal1',$,'Triangle',$,$,.LOADING_3D.,$,$,$,$)`);
  s.add(`IFCRELASSIGNSTOGROUP('4AssignAssignAssignAs1',$,$,$,(${ab},${ac},${bc},${A},${C}),$,${analysis})`);
  const gravity = s.add(`IFCSTRUCTURALLOADGROUP('4Case1aCase1aCase1aCa1',$,'1a',$,$,.LOAD_CASE.,.PERMANENT_G.,.DEAD_LOAD_G.,$,$)`);
  const force = s.add("IFCSTRUCTURALLOADSINGLEFORCE('P',0.,0.,-10000.,$,$,$)");
  const action = s.add(`IFCSTRUCTURALPOINTACTION('4ActionActionActionAc1',$,'P at C',$,$,$,$,${force},.GLOBAL_COORDS.,$)`);
  s.add(`IFCRELCONNECTSSTRUCTURALACTIVITY('4ActsActsActsActsActs1',$,$,$,${C},${action})`);
  s.add(`IFCRELASSIGNSTOGROUP('4LoadsLoadsLoadsLoads1',$,$,$,(${action}),$,${gravity})`);
  const combination = s.add(`IFCSTRUCTURALLOADGROUP('4CombCombCombCombComb1',$,'ULS',$,$,.LOAD_COMBINATION.,.PERMANENT_G.,.DEAD_LOAD_G.,$,$)`);
  s.add(`IFCRELASSIGNSTOGROUPBYFACTOR('4FactorFactorFactorFa1',$,$,$,(${gravity}),$,${combination},1.2)`);
  return s.text();
}
