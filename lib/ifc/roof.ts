import * as WebIFC from "web-ifc";
import { validateModel, type LoadCase, type LoadCategory, type TrussMaterial, type TrussModel, type TrussSection } from "@/lib/analysis/model";
import { profileAndMaterial, profilePropertiesOf, readMaterialValues, toMaterial, tubeSection } from "./materials";
import { applyPoint, distance, objectPlacement, pointOf, scale, type Vec3 } from "./placement";
import { relatingOf } from "./relations";
import { num, plain, refId, refIds, text, whereOf, type IfcLine, type IfcProblem, type IfcReader } from "./reader";
import { readSweptAxis } from "./swept";
import { readUnits, type UnitScale } from "./units";

/** Member ends and connections closer than this (m) are one node. */
export const NODE_TOLERANCE = 0.005;

export interface IfcRoofResult {
  /** Present when every problem is solved; validated against the model format. */
  model?: TrussModel;
  problems: IfcProblem[];
  /** What the roof was read from. */
  source: "analysis model" | "physical members" | "nothing";
  /** Things read with a default the user should know about (not problems). */
  notes: string[];
}

const round = (v: number) => Math.round(v * 1e6) / 1e6;

/** Nodes merged within NODE_TOLERANCE through a grid of tolerance-sized cells. */
class NodeSet {
  nodes: { id: string; p: Vec3 }[] = [];
  private cells = new Map<string, number[]>();
  private cell = (p: Vec3) => p.map((v) => Math.floor(v / NODE_TOLERANCE));
  find(p: Vec3): string | undefined {
    const [cx, cy, cz] = this.cell(p);
    for (let dx = -1; dx <= 1; dx++)
      for (let dy = -1; dy <= 1; dy++)
        for (let dz = -1; dz <= 1; dz++) for (const k of this.cells.get(`${cx + dx},${cy + dy},${cz + dz}`) ?? []) if (distance(this.nodes[k].p, p) <= NODE_TOLERANCE) return this.nodes[k].id;
    return undefined;
  }
  add(id: string, p: Vec3): string {
    const existing = this.find(p);
    if (existing !== undefined) return existing;
    const key = this.cell(p).join(",");
    this.cells.set(key, [...(this.cells.get(key) ?? []), this.nodes.length]);
    this.nodes.push({ id, p });
    return id;
  }
}

/** Names when they are present and unique, otherwise GlobalIds: ids stay stable across re-imports. */
function idsFor(lines: IfcLine[]): Map<number, string> {
  const counts = new Map<string, number>();
  for (const l of lines) {
    const name = text(l.Name);
    if (name) counts.set(name, (counts.get(name) ?? 0) + 1);
  }
  return new Map(lines.map((l) => [l.expressID, text(l.Name) && counts.get(text(l.Name)!) === 1 ? text(l.Name)! : whereOf(l)]));
}

/** A vertex point of a topology representation (IfcVertexPoint → IfcCartesianPoint), in world coordinates. */
function vertex(reader: IfcReader, id: number | undefined, placement: ReturnType<typeof objectPlacement>, units: UnitScale): Vec3 | undefined {
  const v = id === undefined ? undefined : reader.line(id);
  const p = pointOf(reader, refId(v?.VertexGeometry));
  return p ? scale(applyPoint(placement, p), units.length) : undefined;
}

function topologyItems(reader: IfcReader, product: IfcLine): IfcLine[] {
  const shape = reader.line(refId(product.Representation) ?? -1);
  return refIds(shape?.Representations)
    .flatMap((r) => refIds(reader.line(r)?.Items))
    .map((id) => reader.line(id))
    .filter((l): l is IfcLine => l !== undefined);
}

class SectionSet {
  sections: TrussSection[] = [];
  materials: TrussMaterial[] = [];
  private byKey = new Map<string, string>();
  private materialIds = new Map<number, string | undefined>();
  constructor(
    private reader: IfcReader,
    private units: UnitScale,
    private problems: IfcProblem[],
  ) {}
  private values = new Map<number, Map<string, number>>();
  private loaded = false;
  material(materialId: number): string | undefined {
    if (!this.loaded) [this.values, this.loaded] = [readMaterialValues(this.reader), true];
    if (!this.materialIds.has(materialId)) {
      const m = toMaterial(this.reader, materialId, this.values, this.units, this.problems);
      if (m && this.materials.some((x) => x.id === m.id)) m.id = `${m.id}-${materialId}`;
      if (m) this.materials.push(m);
      this.materialIds.set(materialId, m?.id);
    }
    return this.materialIds.get(materialId);
  }
  /** The section id for a tube of this size and material, added on first use. */
  tube(name: string | undefined, materialId: number, radius: number, wall: number): string | undefined {
    const material = this.material(materialId);
    if (material === undefined) return undefined;
    const D = round(2 * radius * this.units.length);
    const t = round(wall * this.units.length);
    const key = `${material}|${D}|${t}`;
    const known = this.byKey.get(key);
    if (known) return known;
    let id = name ?? `CHS ${round(D * 1000)}x${round(t * 1000)} ${material}`;
    if (this.sections.some((s) => s.id === id)) id = `${id} (${this.sections.length + 1})`;
    this.sections.push(tubeSection(id, material, D, t));
    this.byKey.set(key, id);
    return id;
  }
}

function memberSection(reader: IfcReader, sections: SectionSet, associations: Map<number, number[]>, line: IfcLine, problems: IfcProblem[], profileProperties?: Map<number, number[]>): string | undefined {
  const { profile: tube, material } = profileAndMaterial(reader, associations, line.expressID, profileProperties);
  if (!tube || tube.type !== WebIFC.IFCCIRCLEHOLLOWPROFILEDEF) {
    problems.push({ where: whereOf(line), message: tube ? `profile ${reader.typeName(tube)} is not a circular hollow section` : "no circular hollow profile (material profile set) is associated" });
    return undefined;
  }
  if (material === undefined) {
    problems.push({ where: whereOf(line), message: "no material is associated" });
    return undefined;
  }
  const radius = num(tube.Radius);
  const wall = num(tube.WallThickness);
  if (!(radius! > 0) || !(wall! > 0) || wall! >= radius!) {
    problems.push({ where: whereOf(line), message: "the circular hollow profile has no valid radius and wall thickness" });
    return undefined;
  }
  return sections.tube(text(tube.ProfileName), material, radius!, wall!);
}

/**
 * Whether a boundary condition fixes a direction. IFC4: TRUE fixed, FALSE free, a number a spring. IFC2X3 has only
 * numbers: -1. is infinite stiffness (fixed), 0. free, anything else a spring (IFC2X3 IfcBoundaryNodeCondition
 * conventions, restated in the IFC4 change note of IfcBoundaryNodeCondition).
 */
const restrained = (value: unknown, schema: string, where: string, problems: IfcProblem[]): boolean => {
  const v = plain(value);
  if (v === undefined || v === false || v === "F" || v === 0) return false;
  if (v === true || v === "T" || (schema === "IFC2X3" && v === -1)) return true;
  problems.push({ where, message: `spring stiffness ${String(v)} is not read (our supports are fixed or free)` });
  return false;
};

const categories: Record<string, LoadCategory> = { DEAD_LOAD_G: "dead", COMPLETION_G1: "dead", LIVE_LOAD_Q: "live", SNOW_S: "snow", WIND_W: "wind" };

function readAnalysisModel(reader: IfcReader, units: UnitScale, problems: IfcProblem[], notes: string[]): Omit<TrussModel, "format" | "name"> {
  const associations = relatingOf(reader, WebIFC.IFCRELASSOCIATESMATERIAL, "RelatedObjects", "RelatingMaterial");
  const profileProperties = profilePropertiesOf(reader);
  const sections = new SectionSet(reader, units, problems);
  const nodes = new NodeSet();
  const connections = reader.idsOf(WebIFC.IFCSTRUCTURALPOINTCONNECTION).map((id) => reader.line(id)).filter((l): l is IfcLine => l !== undefined);
  const connectionIds = idsFor(connections);
  const connectionNode = new Map<number, string>();
  const supports: TrussModel["supports"] = [];
  for (const c of connections) {
    const item = topologyItems(reader, c).find((i) => i.type === WebIFC.IFCVERTEXPOINT);
    const p = item ? vertex(reader, item.expressID, objectPlacement(reader, refId(c.ObjectPlacement)), units) : undefined;
    if (!p) {
      problems.push({ where: whereOf(c), message: "the point connection has no vertex point" });
      continue;
    }
    const node = nodes.add(connectionIds.get(c.expressID)!, p);
    connectionNode.set(c.expressID, node);
    const condition = reader.line(refId(c.AppliedCondition) ?? -1);
    if (!condition) continue;
    const where = whereOf(c);
    const ux = restrained(condition.TranslationalStiffnessX ?? condition.LinearStiffnessX, reader.schema, where, problems);
    const uy = restrained(condition.TranslationalStiffnessY ?? condition.LinearStiffnessY, reader.schema, where, problems);
    const uz = restrained(condition.TranslationalStiffnessZ ?? condition.LinearStiffnessZ, reader.schema, where, problems);
    if ((ux || uy || uz) && !supports.some((s) => s.node === node)) supports.push({ node, ux, uy, uz });
  }
  const curveMembers = reader.idsOf(WebIFC.IFCSTRUCTURALCURVEMEMBER).map((id) => reader.line(id)).filter((l): l is IfcLine => l !== undefined);
  const memberIds = idsFor(curveMembers);
  const members: TrussModel["members"] = [];
  let generated = 0;
  for (const line of curveMembers) {
    const edge = topologyItems(reader, line).find((i) => i.EdgeStart !== undefined);
    const placement = objectPlacement(reader, refId(line.ObjectPlacement));
    const a = edge ? vertex(reader, refId(edge.EdgeStart), placement, units) : undefined;
    const b = edge ? vertex(reader, refId(edge.EdgeEnd), placement, units) : undefined;
    if (!a || !b) {
      problems.push({ where: whereOf(line), message: "the curve member has no edge with two vertex points" });
      continue;
    }
    const section = memberSection(reader, sections, associations, line, problems, profileProperties);
    if (section === undefined) continue;
    const i = nodes.add(`N${++generated}`, a);
    const j = nodes.add(`N${++generated}`, b);
    members.push({ id: memberIds.get(line.expressID)!, i, j, section });
  }

  // Loads: point actions on connections, grouped into load cases; combinations by factor (IFC4).
  const groups = reader.idsOf(WebIFC.IFCSTRUCTURALLOADGROUP).map((id) => reader.line(id)).filter((l): l is IfcLine => l !== undefined);
  const groupIds = idsFor(groups);
  const assigned = relatingOf(reader, WebIFC.IFCRELASSIGNSTOGROUP, "RelatedObjects", "RelatingGroup");
  const actionOn = relatingOf(reader, WebIFC.IFCRELCONNECTSSTRUCTURALACTIVITY, "RelatedStructuralActivity", "RelatingElement");
  const loadCases: LoadCase[] = groups
    .filter((g) => text(g.PredefinedType) !== "LOAD_COMBINATION")
    .map((g) => ({ id: groupIds.get(g.expressID)!, name: text(g.Name) ?? groupIds.get(g.expressID)!, category: categories[text(g.ActionSource) ?? ""] ?? "other", selfWeight: false, nodalLoads: [] }));
  for (const actionId of reader.idsOf(WebIFC.IFCSTRUCTURALPOINTACTION)) {
    const action = reader.line(actionId)!;
    const load = reader.line(refId(action.AppliedLoad) ?? -1);
    const node = connectionNode.get((actionOn.get(actionId) ?? [])[0] ?? -1);
    const group = (assigned.get(actionId) ?? []).map((g) => groupIds.get(g)).find((g) => g !== undefined);
    const loadCase = loadCases.find((c) => c.id === group);
    if (!load || load.type !== WebIFC.IFCSTRUCTURALLOADSINGLEFORCE || node === undefined || !loadCase) {
      problems.push({ where: whereOf(action), message: "point action not read: it needs a single force on a point connection, in a load case" });
      continue;
    }
    const f = (v: unknown) => round((num(v) ?? 0) * units.force);
    loadCase.nodalLoads.push({ node, fx: f(load.ForceX), fy: f(load.ForceY), fz: f(load.ForceZ) });
  }
  const skippedActions = reader.idsOf(WebIFC.IFCSTRUCTURALACTION).length - reader.idsOf(WebIFC.IFCSTRUCTURALPOINTACTION).length;
  if (skippedActions > 0) notes.push(`${skippedActions} member or surface actions were not read (point actions on connections are)`);
  const combinations: TrussModel["combinations"] = groups
    .filter((g) => text(g.PredefinedType) === "LOAD_COMBINATION")
    .map((g) => ({ id: groupIds.get(g.expressID)!, name: text(g.Name) ?? groupIds.get(g.expressID)!, factors: {} }));
  // IFC2X3 has no assignment by factor: a load case assigned to a combination enters it with its own Coefficient.
  for (const [caseRef, groupRefs] of assigned) {
    const caseId = loadCases.find((c) => c.id === groupIds.get(caseRef))?.id;
    if (caseId === undefined) continue;
    for (const groupRef of groupRefs) {
      const combination = combinations.find((c) => c.id === groupIds.get(groupRef));
      if (combination) combination.factors[caseId] = num(reader.line(caseRef)?.Coefficient) ?? 1;
    }
  }
  for (const relId of reader.idsOf(WebIFC.IFCRELASSIGNSTOGROUPBYFACTOR)) {
    const rel = reader.line(relId)!;
    const combination = combinations.find((c) => c.id === groupIds.get(refId(rel.RelatingGroup) ?? -1));
    if (!combination) continue;
    for (const caseRef of refIds(rel.RelatedObjects)) {
      const caseId = groupIds.get(caseRef);
      if (caseId !== undefined) combination.factors[caseId] = num(rel.Factor) ?? 1;
    }
  }
  if (loadCases.length === 0) notes.push("no load groups: the model has no load cases");
  return {
    materials: sections.materials,
    sections: sections.sections,
    nodes: nodes.nodes.map((n) => ({ id: n.id, x: round(n.p[0]), y: round(n.p[1]), z: round(n.p[2]) })),
    members,
    supports,
    loadCases,
    combinations,
  };
}

function readPhysicalMembers(reader: IfcReader, units: UnitScale, problems: IfcProblem[], notes: string[]): Omit<TrussModel, "format" | "name"> {
  const associations = relatingOf(reader, WebIFC.IFCRELASSOCIATESMATERIAL, "RelatedObjects", "RelatingMaterial");
  const profileProperties = profilePropertiesOf(reader);
  const sections = new SectionSet(reader, units, problems);
  const nodes = new NodeSet();
  const lines = reader.idsOf(WebIFC.IFCMEMBER).map((id) => reader.line(id)).filter((l): l is IfcLine => l !== undefined);
  const ids = idsFor(lines);
  const members: TrussModel["members"] = [];
  for (const line of lines) {
    const axis = readSweptAxis(reader, line);
    if (typeof axis === "string") {
      problems.push({ where: whereOf(line), message: axis });
      continue;
    }
    const section = memberSection(reader, sections, associations, line, problems, profileProperties);
    if (section === undefined) continue;
    const i = nodes.add(`N${nodes.nodes.length + 1}`, scale(axis.start, units.length));
    const j = nodes.add(`N${nodes.nodes.length + 1}`, scale(axis.end, units.length));
    members.push({ id: ids.get(line.expressID)!, i, j, section });
  }
  notes.push(`nodes merged within ${NODE_TOLERANCE * 1000} mm; physical members carry no supports or loads: add them before analysing`);
  return {
    materials: sections.materials,
    sections: sections.sections,
    nodes: nodes.nodes.map((n) => ({ id: n.id, x: round(n.p[0]), y: round(n.p[1]), z: round(n.p[2]) })),
    members,
    supports: [],
    loadCases: [],
    combinations: [],
  };
}

/** Reads the roof of an open IFC model into our model format: the analysis model if present, else IfcMember tubes. */
export function readRoof(reader: IfcReader): IfcRoofResult {
  const units = readUnits(reader);
  const problems: IfcProblem[] = [];
  const notes: string[] = [];
  const project = reader.idsOf(WebIFC.IFCPROJECT).map((id) => reader.line(id))[0];
  const name = (project && text(project.Name)) ?? "Roof from IFC";
  const hasAnalysis = reader.idsOf(WebIFC.IFCSTRUCTURALCURVEMEMBER).length > 0;
  const hasMembers = reader.idsOf(WebIFC.IFCMEMBER).length > 0;
  if (!hasAnalysis && !hasMembers) {
    return { problems: [{ where: "file", message: "no structural analysis model (IfcStructuralCurveMember) and no IfcMember elements" }], source: "nothing", notes };
  }
  const tables = hasAnalysis ? readAnalysisModel(reader, units, problems, notes) : readPhysicalMembers(reader, units, problems, notes);
  const source = hasAnalysis ? "analysis model" : "physical members";
  if (problems.length > 0) return { problems, source, notes };
  const checked = validateModel({ format: "truss-model/1", name, ...tables });
  if (!checked.ok) return { problems: checked.problems, source, notes };
  return { model: checked.model, problems, source, notes };
}
