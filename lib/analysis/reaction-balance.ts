// Global equilibrium of one result: the support reactions must balance the applied load (ΣF = 0). The applied load
// is summed from the model (nodal loads and self-weight of each load case, times the combination's factors), not
// from the solver's load vector, so the check is independent of the solve it checks.
import type { CaseResult } from "./analyze";
import type { TrussModel } from "./model";

/** The relative imbalance a result may show and still balance (issue 15 item 8). */
export const BALANCE_TOLERANCE = 1e-9;

export type Vector3 = { fx: number; fy: number; fz: number };

export type ReactionBalance = {
  /** Total applied load (kN) of the result. */
  applied: Vector3;
  /** Sum of the support reactions (kN). */
  reactions: Vector3;
  /** |applied + reactions| / max(|applied|, largest |reaction|): 0 for perfect balance. */
  relative: number;
  balanced: boolean;
  /** The "reactions balance" line shown on screen and in the report. */
  text: string;
};

function loadCaseTotal(model: TrussModel, loadCaseId: string): Vector3 {
  const loadCase = model.loadCases.find((c) => c.id === loadCaseId);
  const total = { fx: 0, fy: 0, fz: 0 };
  if (!loadCase) return total;
  for (const load of loadCase.nodalLoads) {
    total.fx += load.fx;
    total.fy += load.fy;
    total.fz += load.fz;
  }
  if (loadCase.selfWeight) {
    const nodes = new Map(model.nodes.map((n) => [n.id, n]));
    const materials = new Map(model.materials.map((m) => [m.id, m]));
    const sections = new Map(model.sections.map((s) => [s.id, s]));
    for (const member of model.members) {
      const a = nodes.get(member.i);
      const b = nodes.get(member.j);
      const section = sections.get(member.section);
      if (!a || !b || !section) continue;
      total.fz -= section.area * (materials.get(section.material)?.unitWeight ?? 0) * Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z);
    }
  }
  return total;
}

/** The applied load of a load case or combination (factors times the load cases' totals). */
export function appliedLoad(model: TrussModel, resultId: string): Vector3 {
  const combination = model.combinations.find((c) => c.id === resultId);
  const factors = combination ? combination.factors : { [resultId]: 1 };
  const total = { fx: 0, fy: 0, fz: 0 };
  for (const [caseId, factor] of Object.entries(factors)) {
    const c = loadCaseTotal(model, caseId);
    total.fx += factor * c.fx;
    total.fy += factor * c.fy;
    total.fz += factor * c.fz;
  }
  return total;
}

const kn = (v: Vector3) => `(${[v.fx, v.fy, v.fz].map((x) => (Math.abs(x) < 0.005 ? 0 : x).toFixed(2)).join(", ")}) kN`;

/** Checks ΣR + ΣF = 0 for one result, relative to the larger of the applied load and the largest reaction. */
export function reactionBalance(model: TrussModel, resultId: string, result: Pick<CaseResult, "reactions">): ReactionBalance {
  const applied = appliedLoad(model, resultId);
  const reactions = { fx: 0, fy: 0, fz: 0 };
  let largest = 0;
  for (const r of Object.values(result.reactions)) {
    reactions.fx += r.fx;
    reactions.fy += r.fy;
    reactions.fz += r.fz;
    largest = Math.max(largest, Math.hypot(r.fx, r.fy, r.fz));
  }
  const scale = Math.max(Math.hypot(applied.fx, applied.fy, applied.fz), largest);
  const imbalance = Math.hypot(applied.fx + reactions.fx, applied.fy + reactions.fy, applied.fz + reactions.fz);
  const relative = scale === 0 ? 0 : imbalance / scale;
  const balanced = relative <= BALANCE_TOLERANCE;
  const text =
    `Reactions balance: sum of reactions ${kn(reactions)} against applied load ${kn(applied)}; ` +
    `relative imbalance ${relative.toExponential(1)} ${balanced ? "<=" : ">"} ${BALANCE_TOLERANCE.toExponential(0)}${balanced ? "" : ": NOT BALANCED, do not use these results"}.`;
  return { applied, reactions, relative, balanced, text };
}

/** The node that moves most in a result, with its displacement (m); null without displacements. */
export function largestDisplacement(result: Pick<CaseResult, "displacements">): { node: string; ux: number; uy: number; uz: number; size: number } | null {
  let best: { node: string; ux: number; uy: number; uz: number; size: number } | null = null;
  for (const [node, d] of Object.entries(result.displacements)) {
    const size = Math.hypot(d.ux, d.uy, d.uz);
    if (!best || size > best.size) best = { node, ...d, size };
  }
  return best;
}
