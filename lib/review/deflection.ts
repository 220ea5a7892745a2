// Serviceability: the largest vertical deflection of each serviceability combination against span / limit.
import type { AnalysisResult, TrussModel } from "@/lib/analysis";
import { planSpan } from "@/lib/analysis/plan-span";
import { DEFAULT_DEFLECTION_LIMIT } from "@/lib/projects/deflection-limit";

export { DEFAULT_DEFLECTION_LIMIT };

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

/** The span deflections are measured against (lib/analysis/plan-span.ts). */
export const deflectionSpan = planSpan;

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
