// Serviceability: the largest vertical deflection of each serviceability combination against span / limit.
import type { AnalysisResult, TrussModel } from "@/lib/analysis";

/**
 * Default deflection limit: span/250 for a roof (common practice, from memory; EN 1990 A1.4 leaves the values to
 * the project and National Annex). Editable per project through the review options.
 */
export const DEFAULT_DEFLECTION_LIMIT = 250;

export type DeflectionCheck = {
  combination: string;
  /** Largest downward or upward vertical displacement of a node (m, signed, z up). */
  deflection: number;
  node: string | null;
  span: number;
  limit: number;
  allowed: number;
  utilisation: number;
  steps: string[];
};

/**
 * The span a deflection is measured against: the shorter plan side of the rectangle around the supported nodes
 * (the short span of a perimeter-supported grid); every node's when the supports lie on a line.
 */
export function deflectionSpan(model: TrussModel): number {
  const supported = new Set(model.supports.map((s) => s.node));
  const side = (nodes: TrussModel["nodes"]) => {
    const xs = nodes.map((n) => n.x);
    const ys = nodes.map((n) => n.y);
    const dx = Math.max(...xs) - Math.min(...xs);
    const dy = Math.max(...ys) - Math.min(...ys);
    return Math.min(dx, dy) > 1e-9 ? Math.min(dx, dy) : Math.max(dx, dy);
  };
  const onSupports = side(model.nodes.filter((n) => supported.has(n.id)));
  return onSupports > 1e-9 ? onSupports : side(model.nodes);
}

/** Checks every serviceability combination (kind "serviceability") for vertical deflection ≤ span / limit. */
export function checkDeflections(model: TrussModel, result: AnalysisResult, limit = DEFAULT_DEFLECTION_LIMIT): DeflectionCheck[] {
  const span = deflectionSpan(model);
  const allowed = span / limit;
  return model.combinations
    .filter((c) => c.kind === "serviceability" && result.results[c.id])
    .map((c) => {
      let deflection = 0;
      let node: string | null = null;
      for (const [id, d] of Object.entries(result.results[c.id].displacements)) {
        if (Math.abs(d.uz) > Math.abs(deflection)) {
          deflection = d.uz;
          node = id;
        }
      }
      return {
        combination: c.id,
        deflection,
        node,
        span,
        limit,
        allowed,
        utilisation: Math.abs(deflection) / allowed,
        steps: [
          `span L = ${span.toPrecision(4)} m (shorter plan side of the supported nodes)`,
          `allowed = L/${limit} = ${(1000 * allowed).toPrecision(4)} mm`,
          `largest vertical displacement ${(1000 * deflection).toPrecision(4)} mm at node ${node ?? "–"}`,
          `utilisation = |δ| / allowed = ${(Math.abs(deflection) / allowed).toPrecision(4)}`,
        ],
      };
    });
}
