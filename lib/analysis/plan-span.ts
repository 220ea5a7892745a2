import type { TrussModel } from "./model";

/**
 * The span deflections are measured against: the shorter plan side of the rectangle around the supported nodes
 * (the short span of a perimeter-supported grid); the longer side when the supports lie on a line, and every
 * node's rectangle when they sit at one point.
 */
export function planSpan(model: TrussModel): number {
  const supported = new Set(model.supports.map((s) => s.node));
  const side = (nodes: TrussModel["nodes"]) => {
    if (nodes.length === 0) return 0;
    const xs = nodes.map((n) => n.x);
    const ys = nodes.map((n) => n.y);
    const dx = Math.max(...xs) - Math.min(...xs);
    const dy = Math.max(...ys) - Math.min(...ys);
    return Math.min(dx, dy) > 1e-9 ? Math.min(dx, dy) : Math.max(dx, dy);
  };
  const onSupports = side(model.nodes.filter((n) => supported.has(n.id)));
  return onSupports > 1e-9 ? onSupports : side(model.nodes);
}
