import * as WebIFC from "web-ifc";
import { add, applyPoint, applyVector, axisPlacement, compose, directionOf, identity, objectPlacement, pointOf, scale, type Frame, type Vec3 } from "./placement";
import { num, refId, refIds, text, type IfcLine, type IfcReader } from "./reader";

/** The cross-section of a swept solid, in the file's length unit; `xAxis` is the profile's x axis in the world. */
export type SweptProfile =
  | { kind: "circle"; radius: number }
  | { kind: "hollow-circle"; radius: number; wallThickness: number }
  | { kind: "rectangle"; xDim: number; yDim: number; xAxis: Vec3 };

/** A straight extrusion read as a centreline: start and end in world coordinates (file length unit). */
export interface SweptAxis {
  start: Vec3;
  end: Vec3;
  profile: SweptProfile;
}

function readProfile(reader: IfcReader, id: number | undefined, frame: Frame): { profile: SweptProfile; centre: Vec3 } | string {
  const line = id === undefined ? undefined : reader.line(id);
  if (!line) return "the swept solid has no profile";
  const position = axisPlacement(reader, refId(line.Position));
  const centre = position.origin;
  const radius = num(line.Radius);
  if (line.type === WebIFC.IFCCIRCLEHOLLOWPROFILEDEF) {
    const wallThickness = num(line.WallThickness);
    if (!(radius! > 0) || !(wallThickness! > 0) || wallThickness! >= radius!) return "the hollow circle profile has no valid radius and wall thickness";
    return { profile: { kind: "hollow-circle", radius: radius!, wallThickness: wallThickness! }, centre };
  }
  if (line.type === WebIFC.IFCCIRCLEPROFILEDEF) {
    if (!(radius! > 0)) return "the circle profile has no positive radius";
    return { profile: { kind: "circle", radius: radius! }, centre };
  }
  if (line.type === WebIFC.IFCRECTANGLEPROFILEDEF || line.type === WebIFC.IFCRECTANGLEHOLLOWPROFILEDEF) {
    const xDim = num(line.XDim);
    const yDim = num(line.YDim);
    if (!(xDim! > 0) || !(yDim! > 0)) return "the rectangle profile has no positive dimensions";
    return { profile: { kind: "rectangle", xDim: xDim!, yDim: yDim!, xAxis: applyVector(frame, position.x) }, centre };
  }
  return `profile ${reader.typeName(line)} is not read (circle, hollow circle and rectangle are)`;
}

// IfcCartesianTransformationOperator3D as a frame; a scaled target would distort lengths, so it is refused.
function mappingTarget(reader: IfcReader, id: number | undefined): Frame | string {
  const line = id === undefined ? undefined : reader.line(id);
  if (!line) return identity;
  const factor = num(line.Scale) ?? 1;
  if (Math.abs(factor - 1) > 1e-9) return "a scaled mapped representation is not read";
  const point = pointOf(reader, refId(line.LocalOrigin)) ?? [0, 0, 0];
  const x = directionOf(reader, refId(line.Axis1), [1, 0, 0]);
  const y = directionOf(reader, refId(line.Axis2), [0, 1, 0]);
  const z = directionOf(reader, refId(line.Axis3), [0, 0, 1]);
  return { origin: point, x, y, z };
}

function readItem(reader: IfcReader, item: IfcLine, frame: Frame, depth: number): SweptAxis | string {
  if (depth > 8) return "the body representation nests too deeply";
  if (item.type === WebIFC.IFCEXTRUDEDAREASOLID) {
    const solid = compose(frame, axisPlacement(reader, refId(item.Position)));
    const depthValue = num(item.Depth);
    if (!(depthValue! > 0)) return "the extrusion has no positive depth";
    const direction = directionOf(reader, refId(item.ExtrudedDirection), [0, 0, 1]);
    const read = readProfile(reader, refId(item.SweptArea), solid);
    if (typeof read === "string") return read;
    const local = read.centre;
    const start = applyPoint(solid, local);
    const end = applyPoint(solid, add(local, scale(direction, depthValue!)));
    return { start, end, profile: read.profile };
  }
  if (item.type === WebIFC.IFCBOOLEANCLIPPINGRESULT || item.type === WebIFC.IFCBOOLEANRESULT) {
    // Clipped ends (mitres at bends) keep the first operand's axis: the centreline is that of the uncut solid.
    const first = reader.line(refId(item.FirstOperand) ?? -1);
    return first ? readItem(reader, first, frame, depth + 1) : "the boolean result has no first operand";
  }
  if (item.type === WebIFC.IFCMAPPEDITEM) {
    const source = reader.line(refId(item.MappingSource) ?? -1);
    const target = mappingTarget(reader, refId(item.MappingTarget));
    if (typeof target === "string") return target;
    const origin = axisPlacement(reader, refId(source?.MappingOrigin));
    const mapped = reader.line(refId(source?.MappedRepresentation) ?? -1);
    const items = refIds(mapped?.Items).map((id) => reader.line(id)).filter((l): l is IfcLine => l !== undefined);
    if (items.length !== 1) return "the mapped representation does not hold exactly one solid";
    return readItem(reader, items[0], compose(compose(frame, target), origin), depth + 1);
  }
  return `body item ${reader.typeName(item)} is not read (extruded area solids are)`;
}

/** Reads a product's body as one straight extrusion (placement, direction, depth, profile), or says why not. */
export function readSweptAxis(reader: IfcReader, product: IfcLine): SweptAxis | string {
  const frame = objectPlacement(reader, refId(product.ObjectPlacement));
  const shape = reader.line(refId(product.Representation) ?? -1);
  const representations = refIds(shape?.Representations).map((id) => reader.line(id)).filter((l): l is IfcLine => l !== undefined);
  const body = representations.find((r) => text(r.RepresentationIdentifier) === "Body") ?? representations.find((r) => refIds(r.Items).length > 0);
  if (!body) return "it has no body representation";
  const items = refIds(body.Items).map((id) => reader.line(id)).filter((l): l is IfcLine => l !== undefined);
  if (items.length !== 1) return `its body holds ${items.length} items; one extruded solid is read`;
  return readItem(reader, items[0], frame, 0);
}
