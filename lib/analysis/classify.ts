import type { TrussModel } from "./model";

export type MemberClass = "top_chord" | "bottom_chord" | "diagonal" | "other";

/**
 * Classifies members by the node layers they join: the highest z layer is the top chord layer, the lowest
 * the bottom chord layer; a member between the two layers is a diagonal (web member). Layers are matched
 * within 1e-6 of the model's depth (at least 1 mm), so a sloped or cambered grid classifies as "other".
 */
export function classifyMembers(model: TrussModel): Record<string, MemberClass> {
  const z = new Map(model.nodes.map((n) => [n.id, n.z]));
  let top = -Infinity;
  let bottom = Infinity;
  for (const n of model.nodes) {
    top = Math.max(top, n.z);
    bottom = Math.min(bottom, n.z);
  }
  const tolerance = Math.max(1e-3, 1e-6 * (top - bottom));
  const layer = (id: string) => {
    const v = z.get(id);
    if (v === undefined || top - bottom <= tolerance) return "other";
    if (Math.abs(v - top) <= tolerance) return "top";
    if (Math.abs(v - bottom) <= tolerance) return "bottom";
    return "other";
  };
  const classes: Record<string, MemberClass> = {};
  for (const m of model.members) {
    const a = layer(m.i);
    const b = layer(m.j);
    classes[m.id] =
      a === "top" && b === "top"
        ? "top_chord"
        : a === "bottom" && b === "bottom"
          ? "bottom_chord"
          : (a === "top" && b === "bottom") || (a === "bottom" && b === "top")
            ? "diagonal"
            : "other";
  }
  return classes;
}
