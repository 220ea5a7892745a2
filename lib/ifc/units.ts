import * as WebIFC from "web-ifc";
import { num, refId, refIds, text, type IfcReader } from "./reader";

const prefixes: Record<string, number> = { EXA: 1e18, PETA: 1e15, TERA: 1e12, GIGA: 1e9, MEGA: 1e6, KILO: 1e3, HECTO: 1e2, DECA: 1e1, DECI: 1e-1, CENTI: 1e-2, MILLI: 1e-3, MICRO: 1e-6, NANO: 1e-9 };

/** Factors from the file's units to ours (m, kN, kPa); IFC's defaults are SI without prefix. */
export interface UnitScale {
  length: number;
  force: number;
  pressure: number;
  /** Name of the file's length unit, for messages. */
  lengthName: string;
}

// SI unit factor to the SI base (metre, newton, pascal), then prefixes; conversion-based units (foot, inch, ...)
// carry their factor to an SI unit.
function unitFactor(reader: IfcReader, id: number | undefined, depth = 0): number | undefined {
  const unit = id === undefined ? undefined : reader.line(id);
  if (!unit || depth > 4) return undefined;
  if (unit.type === WebIFC.IFCSIUNIT) return prefixes[String(text(unit.Prefix) ?? "")] ?? 1;
  if (unit.type === WebIFC.IFCCONVERSIONBASEDUNIT) {
    const measure = reader.line(refId(unit.ConversionFactor) ?? -1);
    const value = num(measure?.ValueComponent);
    const base = unitFactor(reader, refId(measure?.UnitComponent), depth + 1);
    return value !== undefined && base !== undefined ? value * base : undefined;
  }
  return undefined;
}

/** Reads the project's unit assignment; lengths default to metres when the file assigns none. */
export function readUnits(reader: IfcReader): UnitScale {
  const scale: UnitScale = { length: 1, force: 1e-3, pressure: 1e-3, lengthName: "metre" };
  const project = reader.idsOf(WebIFC.IFCPROJECT).map((id) => reader.line(id))[0];
  const assignment = reader.line(refId(project?.UnitsInContext) ?? -1);
  for (const unitId of refIds(assignment?.Units)) {
    const unit = reader.line(unitId);
    const kind = text(unit?.UnitType);
    const factor = unitFactor(reader, unitId);
    if (factor === undefined) continue;
    if (kind === "LENGTHUNIT") {
      scale.length = factor;
      scale.lengthName = `${text(unit?.Prefix)?.toLowerCase() ?? ""}${text(unit?.Name)?.toLowerCase() ?? "unit"}`;
    }
    // Our model is in kN and kPa: one newton is 1e-3 kN, one pascal 1e-3 kPa.
    if (kind === "FORCEUNIT") scale.force = factor * 1e-3;
    if (kind === "PRESSUREUNIT") scale.pressure = factor * 1e-3;
  }
  return scale;
}
