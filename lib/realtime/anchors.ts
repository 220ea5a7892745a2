// Where a pin sits in the model shown now. Member and node ids are stable across revisions, so a pin made on
// revision 3 finds its member in revision 5; when the member or node is gone the pin is "detached".
import type { Anchor, Vec3 } from "./events";

export type AnchorModel = {
  nodes: readonly { id: string; x: number; y: number; z: number }[];
  members: readonly { id: string; i: string; j: string }[];
};

/** Position of the anchor in model coordinates (a member's midpoint), or null when it is not in this model. */
export function resolveAnchor(anchor: Anchor, model: AnchorModel, clashPoints: ReadonlyMap<string, Vec3> = new Map()): Vec3 | null {
  if (anchor.kind === "point") return anchor.point;
  if (anchor.kind === "clash") return clashPoints.get(anchor.id) ?? null;
  const node = (id: string) => model.nodes.find((n) => n.id === id);
  if (anchor.kind === "node") {
    const found = node(anchor.id);
    return found ? [found.x, found.y, found.z] : null;
  }
  const member = model.members.find((m) => m.id === anchor.id);
  const i = member && node(member.i);
  const j = member && node(member.j);
  if (!i || !j) return null;
  return [(i.x + j.x) / 2, (i.y + j.y) / 2, (i.z + j.z) / 2];
}

/** A short label of the anchor for lists ("member TC-12", "point 3.0, 4.5, 9.0"). */
export function anchorLabel(anchor: Anchor): string {
  if (anchor.kind === "point") return `point ${anchor.point.map((v) => v.toFixed(1)).join(", ")}`;
  return `${anchor.kind} ${anchor.id}`;
}
