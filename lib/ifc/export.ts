import type { TrussModel } from "@/lib/analysis/model";
import { forceStateIn } from "@/lib/vocabulary/force-state";
import { memberGlobalId, stableGlobalId } from "./guid";
import { cross, length, scale, sub, unit, type Vec3 } from "./placement";
import { enumValue, list, real, StepWriter, str } from "./step";

/** Standard gravity (m/s²), to write our unit weight (kN/m³) as IFC's mass density (kg/m³). */
export const STANDARD_GRAVITY = 9.80665;

/** An opening the structural engineer accepted: where the run passes the member, along which direction, how wide. */
export interface ExportOpening {
  clashKey: string;
  memberId: string;
  runId: string;
  point: Vec3;
  direction: Vec3;
  /** Diameter of the cut (m): the run's outer size with insulation and clearance. */
  diameter: number;
  conditions: string;
}

/** One result's member forces (kN, tension positive) and its zero-force members. */
export interface ExportResult {
  id: string;
  name: string;
  memberForces: Record<string, number>;
  zeroForceMembers: string[];
}

export interface IfcExportInput {
  model: TrussModel;
  /** Names the project and keeps the GlobalIds of project, site and building stable across exports. */
  projectName: string;
  fileName: string;
  /** ISO time written in the header (passed in so the output is reproducible). */
  time: string;
  result?: ExportResult;
  openings: ExportOpening[];
}

/** The force state of a member in a result, in our words (zero-force as the model's classification says). */
/** A reference direction not parallel to `axis`, as IfcAxis2Placement3D needs. */
const refFor = (axis: Vec3): Vec3 => (Math.abs(axis[2]) < 0.9 ? unit(cross([0, 0, 1], axis)) : [1, 0, 0]);

/**
 * Writes a model revision as IFC4: each member an IfcMember with a circular hollow profile (material profile set,
 * material with mechanical properties), the chosen result's force state as property set Strutroom_ForceState, and
 * accepted openings as IfcOpeningElement voiding their member.
 */
export function exportIfc(input: IfcExportInput): string {
  const { model } = input;
  const w = new StepWriter();
  const gid = (what: string) => str(stableGlobalId(`strutroom ${input.projectName} ${what}`));
  const point = (p: Vec3) => w.add(`IFCCARTESIANPOINT(${list(p.map(real))})`);
  const direction = (d: Vec3) => w.add(`IFCDIRECTION(${list(d.map(real))})`);
  const axis2 = (origin: Vec3, axis?: Vec3, ref?: Vec3) => w.add(`IFCAXIS2PLACEMENT3D(${point(origin)},${axis ? direction(axis) : "$"},${ref ? direction(ref) : "$"})`);
  const origin = axis2([0, 0, 0]);

  const units = w.add(
    `IFCUNITASSIGNMENT(${list([
      w.add("IFCSIUNIT(*,.LENGTHUNIT.,$,.METRE.)"),
      w.add("IFCSIUNIT(*,.FORCEUNIT.,.KILO.,.NEWTON.)"),
      w.add("IFCSIUNIT(*,.PRESSUREUNIT.,.KILO.,.PASCAL.)"),
      w.add("IFCSIUNIT(*,.PLANEANGLEUNIT.,$,.RADIAN.)"),
    ])})`,
  );
  const context = w.add(`IFCGEOMETRICREPRESENTATIONCONTEXT($,'Model',3,1.E-05,${origin},$)`);
  const project = w.add(`IFCPROJECT(${gid("project")},$,${str(input.projectName)},$,$,$,$,(${context}),${units})`);
  const sitePlacement = w.add(`IFCLOCALPLACEMENT($,${origin})`);
  const site = w.add(`IFCSITE(${gid("site")},$,'Site',$,$,${sitePlacement},$,$,.ELEMENT.,$,$,$,$,$)`);
  const buildingPlacement = w.add(`IFCLOCALPLACEMENT(${sitePlacement},${origin})`);
  const building = w.add(`IFCBUILDING(${gid("building")},$,${str(model.name || input.projectName)},$,$,${buildingPlacement},$,$,.ELEMENT.,$,$,$)`);
  w.add(`IFCRELAGGREGATES(${gid("project site")},$,$,$,${project},(${site}))`);
  w.add(`IFCRELAGGREGATES(${gid("site building")},$,$,$,${site},(${building}))`);

  // Materials with their mechanical properties (units: kPa, kg/m³).
  const materials = new Map<string, string>();
  for (const m of model.materials) {
    const material = w.add(`IFCMATERIAL(${str(m.id)},$,'Steel')`);
    materials.set(m.id, material);
    const single = (name: string, value: string) => w.add(`IFCPROPERTYSINGLEVALUE(${str(name)},$,${value},$)`);
    w.add(`IFCMATERIALPROPERTIES('Pset_MaterialMechanical',$,(${single("YoungModulus", `IFCMODULUSOFELASTICITYMEASURE(${real(m.E)})`)}),${material})`);
    w.add(`IFCMATERIALPROPERTIES('Pset_MaterialSteel',$,(${single("YieldStress", `IFCPRESSUREMEASURE(${real(m.fy)})`)}),${material})`);
    w.add(`IFCMATERIALPROPERTIES('Pset_MaterialCommon',$,(${single("MassDensity", `IFCMASSDENSITYMEASURE(${real((m.unitWeight * 1000) / STANDARD_GRAVITY)})`)}),${material})`);
  }
  const profileSets = new Map<string, string>();
  const profiles = new Map<string, string>();
  for (const s of model.sections) {
    const profile = w.add(`IFCCIRCLEHOLLOWPROFILEDEF(.AREA.,${str(s.id)},$,${real(s.outerDiameter / 2)},${real(s.wallThickness)})`);
    profiles.set(s.id, profile);
    const materialProfile = w.add(`IFCMATERIALPROFILE(${str(s.id)},$,${materials.get(s.material) ?? "$"},${profile},$,$)`);
    profileSets.set(s.id, w.add(`IFCMATERIALPROFILESET(${str(s.id)},$,(${materialProfile}),$)`));
  }

  const nodes = new Map(model.nodes.map((n) => [n.id, [n.x, n.y, n.z] as Vec3]));
  const members = new Map<string, string>();
  const bySection = new Map<string, string[]>();
  const extrudeDirection = direction([0, 0, 1]);
  for (const m of model.members) {
    const a = nodes.get(m.i)!;
    const b = nodes.get(m.j)!;
    const axis = unit(sub(b, a));
    const placement = w.add(`IFCLOCALPLACEMENT(${buildingPlacement},${axis2(a, axis, refFor(axis))})`);
    const solid = w.add(`IFCEXTRUDEDAREASOLID(${profiles.get(m.section)},${origin},${extrudeDirection},${real(length(sub(b, a)))})`);
    const shape = w.add(`IFCPRODUCTDEFINITIONSHAPE($,$,(${w.add(`IFCSHAPEREPRESENTATION(${context},'Body','SweptSolid',(${solid}))`)}))`);
    const member = w.add(`IFCMEMBER(${str(memberGlobalId(m.id))},$,${str(m.id)},$,$,${placement},${shape},${str(m.id)},.MEMBER.)`);
    members.set(m.id, member);
    bySection.set(m.section, [...(bySection.get(m.section) ?? []), member]);
    if (input.result) {
      const r = input.result;
      const props = [
        w.add(`IFCPROPERTYSINGLEVALUE('ResultId',$,IFCIDENTIFIER(${str(r.id)}),$)`),
        w.add(`IFCPROPERTYSINGLEVALUE('ResultName',$,IFCLABEL(${str(r.name)}),$)`),
        w.add(`IFCPROPERTYSINGLEVALUE('AxialForce',$,IFCFORCEMEASURE(${real(r.memberForces[m.id] ?? 0)}),$)`),
        w.add(`IFCPROPERTYSINGLEVALUE('ForceState',$,IFCLABEL(${str(forceStateIn(r, m.id))}),$)`),
      ];
      const pset = w.add(`IFCPROPERTYSET(${gid(`force state ${m.id}`)},$,'Strutroom_ForceState',$,${list(props)})`);
      w.add(`IFCRELDEFINESBYPROPERTIES(${gid(`force state rel ${m.id}`)},$,$,$,(${member}),${pset})`);
    }
  }
  for (const [sectionId, related] of bySection) {
    w.add(`IFCRELASSOCIATESMATERIAL(${gid(`material ${sectionId}`)},$,$,$,${list(related)},${profileSets.get(sectionId)})`);
  }
  if (members.size > 0) w.add(`IFCRELCONTAINEDINSPATIALSTRUCTURE(${gid("contained")},$,$,$,${list([...members.values()])},${building})`);

  for (const o of input.openings) {
    const member = members.get(o.memberId);
    if (!member) continue;
    const memberSection = model.sections.find((s) => s.id === model.members.find((m) => m.id === o.memberId)?.section);
    // The cut runs along the service through the member: long enough to pass the tube's whole diameter.
    const depth = Math.max(memberSection?.outerDiameter ?? 0, o.diameter) * 2;
    const d = unit(o.direction);
    const start = sub(o.point, scale(d, depth / 2));
    const placement = w.add(`IFCLOCALPLACEMENT(${buildingPlacement},${axis2(start, d, refFor(d))})`);
    const circle = w.add(`IFCCIRCLEPROFILEDEF(.AREA.,$,$,${real(o.diameter / 2)})`);
    const solid = w.add(`IFCEXTRUDEDAREASOLID(${circle},${origin},${extrudeDirection},${real(depth)})`);
    const shape = w.add(`IFCPRODUCTDEFINITIONSHAPE($,$,(${w.add(`IFCSHAPEREPRESENTATION(${context},'Body','SweptSolid',(${solid}))`)}))`);
    const opening = w.add(`IFCOPENINGELEMENT(${gid(`opening ${o.clashKey}`)},$,${str(`Opening for ${o.runId}`)},$,$,${placement},${shape},${str(o.clashKey)},${enumValue("OPENING")})`);
    w.add(`IFCRELVOIDSELEMENT(${gid(`voids ${o.clashKey}`)},$,$,$,${member},${opening})`);
    const props = [
      w.add(`IFCPROPERTYSINGLEVALUE('ClashId',$,IFCIDENTIFIER(${str(o.clashKey)}),$)`),
      w.add(`IFCPROPERTYSINGLEVALUE('RunId',$,IFCIDENTIFIER(${str(o.runId)}),$)`),
      w.add(`IFCPROPERTYSINGLEVALUE('Conditions',$,IFCTEXT(${str(o.conditions)}),$)`),
    ];
    const pset = w.add(`IFCPROPERTYSET(${gid(`opening pset ${o.clashKey}`)},$,'Strutroom_OpeningAcceptance',$,${list(props)})`);
    w.add(`IFCRELDEFINESBYPROPERTIES(${gid(`opening rel ${o.clashKey}`)},$,$,$,(${opening}),${pset})`);
  }
  return w.file("IFC4", input.fileName, input.time);
}
