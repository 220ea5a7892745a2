import * as WebIFC from "web-ifc";
import { num, refId, refIds, text, type IfcLine, type IfcReader } from "./reader";

/** Maps each related object id to the relation's relating object id, for one relation type. */
export function relatingOf(reader: IfcReader, relation: number, relatedKey: string, relatingKey: string): Map<number, number[]> {
  const map = new Map<number, number[]>();
  for (const id of reader.idsOf(relation)) {
    const rel = reader.line(id);
    if (!rel) continue;
    const relating = refId(rel[relatingKey]);
    if (relating === undefined) continue;
    const related = Array.isArray(rel[relatedKey]) ? refIds(rel[relatedKey]) : [refId(rel[relatedKey])].filter((r): r is number => r !== undefined);
    for (const r of related) map.set(r, [...(map.get(r) ?? []), relating]);
  }
  return map;
}

/** The type object of an occurrence (IfcRelDefinesByType), if any. */
export function typeObjects(reader: IfcReader): Map<number, number[]> {
  return relatingOf(reader, WebIFC.IFCRELDEFINESBYTYPE, "RelatedObjects", "RelatingType");
}

/** Property and quantity values of an object by name (IfcRelDefinesByProperties), lengths in the file's unit. */
export function propertyValues(reader: IfcReader, definitions: Map<number, number[]>, objectId: number): Map<string, number | string | boolean> {
  const values = new Map<string, number | string | boolean>();
  for (const defId of definitions.get(objectId) ?? []) {
    const def = reader.line(defId);
    if (!def) continue;
    for (const propId of [...refIds(def.HasProperties), ...refIds(def.Quantities)]) {
      const prop = reader.line(propId);
      const name = text(prop?.Name);
      if (!prop || !name) continue;
      const value = prop.type === WebIFC.IFCPROPERTYSINGLEVALUE ? (num(prop.NominalValue) ?? text(prop.NominalValue)) : num(prop.LengthValue);
      if (value !== undefined) values.set(name, value);
    }
  }
  return values;
}

/** Element ids joined through their ports (IfcRelConnectsPorts), ports found by IfcRelConnectsPortToElement or IfcRelNests. */
export function portLinks(reader: IfcReader): [number, number][] {
  const owner = new Map<number, number>();
  for (const id of reader.idsOf(WebIFC.IFCRELCONNECTSPORTTOELEMENT)) {
    const rel = reader.line(id);
    const port = refId(rel?.RelatingPort);
    const element = refId(rel?.RelatedElement);
    if (port !== undefined && element !== undefined) owner.set(port, element);
  }
  for (const id of reader.idsOf(WebIFC.IFCRELNESTS)) {
    const rel = reader.line(id);
    const element = refId(rel?.RelatingObject);
    if (element === undefined) continue;
    for (const port of refIds(rel?.RelatedObjects)) if (reader.line(port)?.type === WebIFC.IFCDISTRIBUTIONPORT) owner.set(port, element);
  }
  const links: [number, number][] = [];
  for (const id of reader.idsOf(WebIFC.IFCRELCONNECTSPORTS)) {
    const rel = reader.line(id);
    const a = owner.get(refId(rel?.RelatingPort) ?? -1);
    const b = owner.get(refId(rel?.RelatedPort) ?? -1);
    if (a !== undefined && b !== undefined && a !== b) links.push([a, b]);
  }
  return links;
}

/** A line's name for display: Name, else LongName, else the predefined type in lower case. */
export function nameOf(line: IfcLine | undefined): string | undefined {
  if (!line) return undefined;
  return text(line.Name) ?? text(line.LongName) ?? text(line.PredefinedType)?.toLowerCase().replace(/_/g, " ");
}
