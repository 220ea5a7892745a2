// Overall stability of the roof per design result: the critical load factor αcr of the whole truss (linear
// buckling, lib/analysis/buckling.ts) and its modes, with the EN 1993-1-1 5.2.1(3) warning below 10.
import { ALPHA_CR_LIMIT, bucklingModes, describeDirection, type BucklingMode } from "@/lib/analysis";
import type { ReviewContext } from "./context";

export type ResultStability = {
  result: string;
  /** The lowest critical factor on this result's loads; null when no load factor buckles the truss (no compression). */
  alphaCr: number | null;
  /** The lowest modes found, ascending αcr (shape omitted when not asked for). */
  modes: (Omit<BucklingMode, "shape"> & { shape?: number[] })[];
  converged: boolean;
  iterations: number;
  warning: string | null;
};

export type OverallStability = {
  /** αcr below which a first-order analysis is not enough (EN 1993-1-1 5.2.1(3), eq. 5.1, elastic analysis). */
  limit: number;
  /** Relative change of the Ritz values at which the iteration stops (the accuracy of the factors). */
  tolerance: number;
  basis: string;
  results: ResultStability[];
  /** The design result with the lowest αcr, or null when none buckles. */
  lowest: { result: string; alphaCr: number } | null;
};

export const STABILITY_TOLERANCE = 1e-6;

const BASIS =
  "Linear buckling of the whole truss: (K + αcr·K_G) φ = 0 with the geometric stiffness K_G from each design result's member forces (first order), the lowest factors by subspace iteration on the stiffness factor. Joints are pins and members straight: this covers snap-through, sway and the loss of a joint's hold, not a member buckling between its ends (that is each member's buckling check). αcr ≥ 10 allows first-order analysis (EN 1993-1-1 5.2.1(3), eq. 5.1).";

function warningFor(result: string, alphaCr: number | null, converged: boolean, mode: Omit<BucklingMode, "shape"> | undefined): string | null {
  const where = mode ? ` The mode moves ${mode.joints.slice(0, 4).map((j) => `${j.node} (${describeDirection(j.direction)})`).join(", ")}${mode.joints.length > 4 ? ` and ${mode.joints.length - 4} more joints` : ""}.` : "";
  if (!converged) return `${result}: the critical load factor did not settle within the iteration limit${alphaCr === null ? "" : ` (last estimate αcr = ${alphaCr.toPrecision(3)})`}; treat the overall stability as unchecked.`;
  if (alphaCr === null) return null;
  if (alphaCr < 1) return `${result}: αcr = ${alphaCr.toPrecision(3)} < 1: the roof buckles as a whole before this combination's load is reached (linear buckling).${where} Stiffen or brace these joints.`;
  if (alphaCr < ALPHA_CR_LIMIT) return `${result}: αcr = ${alphaCr.toPrecision(3)} < ${ALPHA_CR_LIMIT}: second-order effects must be taken into account (EN 1993-1-1 5.2.1(3)); these first-order forces are not enough.${where}`;
  return null;
}

/** αcr and the lowest modes for every design result of the review. The context's factor is reused. */
export function overallStability(context: ReviewContext, options: { modes?: number; shapes?: boolean } = {}): OverallStability {
  const results = context.designResults.map((id): ResultStability => {
    const analysis = bucklingModes(context.structure, context.forces.get(id)!, { modes: options.modes ?? 3, tolerance: STABILITY_TOLERANCE });
    const modes = analysis.modes.map(({ shape, ...rest }) => (options.shapes === false ? rest : { ...rest, shape }));
    const alphaCr = modes[0]?.alphaCr ?? null;
    return { result: id, alphaCr, modes, converged: analysis.converged, iterations: analysis.iterations, warning: warningFor(id, alphaCr, analysis.converged, modes[0]) };
  });
  let lowest: OverallStability["lowest"] = null;
  for (const r of results) if (r.alphaCr !== null && (!lowest || r.alphaCr < lowest.alphaCr)) lowest = { result: r.result, alphaCr: r.alphaCr };
  return { limit: ALPHA_CR_LIMIT, tolerance: STABILITY_TOLERANCE, basis: BASIS, results, lowest };
}
