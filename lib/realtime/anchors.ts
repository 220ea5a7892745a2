// Where a pin sits in the model shown now. Member and node ids are stable across revisions, so a pin made on
// revision 3 finds its member in revision 5; when the member or node is gone the pin is "detached".
import type { Anchor, Vec3 } from "./events";

export type AnchorModel = {
  nodes: readonly { id: string; x: number; y: number; z: number }[];
  members: readonly { id: string; i: string; j: string }[];
};

/**
 * The point of segment a–b nearest to p. A pin placed on a member keeps the point clicked on its axis; projecting it
 * onto the member as drawn now keeps the marker on the member even when a later revision moved its nodes.
 */
export function nearestOnSegment(p: Vec3, a: Vec3, b: Vec3): Vec3 {
  const d: Vec3 = [b[0] - a[0], b[1] - a[1], b[2] - a[2]];
  const lengthSq = d[0] * d[0] + d[1] * d[1] + d[2] * d[2];
  const t = lengthSq > 0 ? Math.min(1, Math.max(0, ((p[0] - a[0]) * d[0] + (p[1] - a[1]) * d[1] + (p[2] - a[2]) * d[2]) / lengthSq)) : 0;
  return [a[0] + d[0] * t, a[1] + d[1] * t, a[2] + d[2] * t];
}

/**
 * A point clicked in 3D as a pin keeps it: to the millimetre. The viewer draws from Float32 positions (a node at
 * 1.8 m reads 1.7999999523…), and a click is no more precise than a pixel, so millimetres lose nothing real.
 */
export function roundToMillimetre(p: Vec3): Vec3 {
  return [Math.round(p[0] * 1000) / 1000, Math.round(p[1] * 1000) / 1000, Math.round(p[2] * 1000) / 1000];
}

/**
 * Position of the anchor in model coordinates, or null when it is not in this model: a node pin on the node, a
 * member pin at the point clicked on it (its midpoint when none was kept).
 */
export function resolveAnchor(anchor: Anchor, model: AnchorModel, clashPoints: ReadonlyMap<string, Vec3> = new Map()): Vec3 | null {
  if (anchor.kind === "point") return anchor.point;
  if (anchor.kind === "clash") return clashPoints.get(anchor.id) ?? null;
  const node = (id: string): Vec3 | null => {
    const found = model.nodes.find((n) => n.id === id);
    return found ? [found.x, found.y, found.z] : null;
  };
  if (anchor.kind === "node") return node(anchor.id);
  const member = model.members.find((m) => m.id === anchor.id);
  const i = member && node(member.i);
  const j = member && node(member.j);
  if (!i || !j) return null;
  if (anchor.point) return nearestOnSegment(anchor.point, i, j);
  return [(i[0] + j[0]) / 2, (i[1] + j[1]) / 2, (i[2] + j[2]) / 2];
}

/** A short label of the anchor for lists ("member TC-12", "point 3.0, 4.5, 9.0"). */
export function anchorLabel(anchor: Anchor): string {
  if (anchor.kind === "point") return `point ${anchor.point.map((v) => v.toFixed(1)).join(", ")}`;
  if (anchor.kind === "member" && anchor.point) return `member ${anchor.id} at ${anchor.point.map((v) => v.toFixed(1)).join(", ")}`;
  return `${anchor.kind} ${anchor.id}`;
}
