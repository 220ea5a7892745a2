import * as WebIFC from "web-ifc";
import type { TrussMaterial, TrussSection } from "@/lib/analysis/model";
import { STANDARD_GRAVITY } from "./export";
import { num, refId, refIds, text, type IfcLine, type IfcProblem, type IfcReader } from "./reader";
import { relatingOf } from "./relations";
import type { UnitScale } from "./units";

const round = (v: number, digits = 9) => Number(v.toPrecision(digits));

/**
 * Young's modulus, yield stress and mass density of each IfcMaterial: IFC4 material property sets
 * (Pset_MaterialMechanical.YoungModulus, Pset_MaterialSteel.YieldStress, Pset_MaterialCommon.MassDensity) or the
 * IFC2X3 entities IfcMechanicalSteelMaterialProperties and IfcGeneralMaterialProperties.
 */
export function readMaterialValues(reader: IfcReader): Map<number, Map<string, number>> {
  const values = new Map<number, Map<string, number>>();
  const set = (material: number | undefined, name: string, value: number | undefined) => {
    if (material === undefined || value === undefined) return;
    values.set(material, (values.get(material) ?? new Map()).set(name, value));
  };
  const types = [WebIFC.IFCMATERIALPROPERTIES, WebIFC.IFCMECHANICALSTEELMATERIALPROPERTIES, WebIFC.IFCMECHANICALMATERIALPROPERTIES, WebIFC.IFCGENERALMATERIALPROPERTIES];
  const seen = new Set<number>();
  for (const type of types) {
    for (const id of reader.idsOf(type)) {
      if (seen.has(id)) continue;
      seen.add(id);
      const line = reader.line(id);
      const material = refId(line?.Material);
      for (const name of ["YoungModulus", "YieldStress", "MassDensity"]) set(material, name, num(line?.[name]));
      for (const propId of refIds(line?.Properties)) {
        const prop = reader.line(propId);
        const name = text(prop?.Name);
        if (name) set(material, name, num(prop?.NominalValue));
      }
    }
  }
  return values;
}

/** Turns an IfcMaterial into our material (kPa, kN/m³), listing each missing value. */
export function toMaterial(reader: IfcReader, materialId: number, values: Map<number, Map<string, number>>, units: UnitScale, problems: IfcProblem[]): TrussMaterial | undefined {
  const line = reader.line(materialId);
  const id = text(line?.Name) ?? `material-${materialId}`;
  const v = values.get(materialId) ?? new Map<string, number>();
  const E = v.get("YoungModulus");
  const fy = v.get("YieldStress");
  const density = v.get("MassDensity");
  const missing = [E === undefined && "YoungModulus", fy === undefined && "YieldStress", density === undefined && "MassDensity"].filter(Boolean);
  if (missing.length > 0) {
    problems.push({ where: `material "${id}"`, message: `no ${missing.join(", ")} in its material properties` });
    return undefined;
  }
  // Mass density is taken in kg/m³ (IFC's SI default); unit weight = ρ g.
  return { id, E: round(E! * units.pressure), fy: round(fy! * units.pressure), unitWeight: round((density! * STANDARD_GRAVITY) / 1000) };
}

/**
 * The material and circular hollow profile associated with an element: IFC4 material profile set (or its usage), or
 * IFC2X3's IfcMaterial with the profile from IfcRelAssociatesProfileProperties (IfcGeneralProfileProperties or a
 * subtype, ProfileDefinition), which IFC2X3 has instead of profile sets.
 */
export function profileAndMaterial(reader: IfcReader, associations: Map<number, number[]>, element: number, profileProperties?: Map<number, number[]>): { profile?: IfcLine; material?: number } {
  const fromProperties = () => {
    for (const relating of profileProperties?.get(element) ?? []) {
      const profile = reader.line(refId(reader.line(relating)?.ProfileDefinition) ?? -1);
      if (profile) return profile;
    }
    return undefined;
  };
  for (const relating of associations.get(element) ?? []) {
    let line = reader.line(relating);
    if (line?.type === WebIFC.IFCMATERIALPROFILESETUSAGE) line = reader.line(refId(line.ForProfileSet) ?? -1);
    if (line?.type === WebIFC.IFCMATERIALPROFILESET) {
      const first = reader.line(refIds(line.MaterialProfiles)[0] ?? -1);
      return { profile: reader.line(refId(first?.Profile) ?? -1), material: refId(first?.Material) };
    }
    if (line?.type === WebIFC.IFCMATERIAL) return { material: line.expressID, profile: fromProperties() };
  }
  return { profile: fromProperties() };
}

/** IFC2X3 profile associations (element → IfcGeneralProfileProperties); the relation is gone from IFC4. */
export function profilePropertiesOf(reader: IfcReader): Map<number, number[]> | undefined {
  return reader.schema === "IFC2X3" ? relatingOf(reader, WebIFC.IFCRELASSOCIATESPROFILEPROPERTIES, "RelatedObjects", "RelatingProfileProperties") : undefined;
}

/** Our section from a circular hollow profile (m): A = π(D² − d²)/4, r = √(D² + d²)/4 (closed-form for a tube). */
export function tubeSection(id: string, material: string, outerDiameter: number, wallThickness: number): TrussSection {
  const inner = outerDiameter - 2 * wallThickness;
  return {
    id,
    material,
    area: round((Math.PI * (outerDiameter ** 2 - inner ** 2)) / 4),
    radiusOfGyration: round(Math.sqrt(outerDiameter ** 2 + inner ** 2) / 4),
    outerDiameter: round(outerDiameter),
    wallThickness: round(wallThickness),
  };
}
