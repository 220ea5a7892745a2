// The state a review keeps between questions: the model, its analysis, one factored structure, design inputs.
import { prepareStructure, type AnalysisResult, type PreparedStructure, type TrussModel } from "@/lib/analysis";
import { resistanceTable, type ResistanceTable } from "./design-checks/member-check";
import type { ChsFabrication, DesignMethod, DesignStandard, MemberDesignInput } from "./design-checks/types";
import { designResultIds, governingUtilisations, memberDesignInputs } from "./member-design";

export type ReviewOptions = {
  standard: DesignStandard;
  /** Members under this |N| (kN) are low-force (passed through from the analysis; glossary "low-force"). */
  lowForceThreshold?: number;
  /** Serviceability deflection limit: span / this (250 unless told, deflection.ts). */
  deflectionLimit?: number;
  /** AISC only: LRFD (default) or ASD. */
  method?: DesignMethod;
  /** Fabrication of sections that state none; the model format's default (cold-formed) unless told. */
  fabrication?: ChsFabrication;
};

export type ReviewContext = {
  model: TrussModel;
  result: AnalysisResult;
  options: ReviewOptions;
  structure: PreparedStructure;
  inputs: MemberDesignInput[];
  memberIndex: Map<string, number>;
  /** Intact forces per result id, model member order. */
  forces: Map<string, Float64Array>;
  /** Intact displacements per load case (full 3n, m), from the analysis result. */
  displacements: Map<string, Float64Array>;
  designResults: string[];
  resistances: ResistanceTable;
  /** Intact governing utilisation per member over the design results. */
  utilisation: Float64Array;
};

/** Factors the model's stiffness once so what-ifs and influence maps reuse it. The model must be stable. */
export function createReviewContext(model: TrussModel, result: AnalysisResult, options: ReviewOptions): ReviewContext {
  if (result.status !== "ok") throw new Error("the model is a mechanism: nothing to review until it is stable");
  const structure = prepareStructure(model);
  const forces = new Map<string, Float64Array>();
  for (const [id, r] of Object.entries(result.results)) {
    forces.set(id, Float64Array.from(model.members, (m) => r.memberForces[m.id]));
  }
  const displacements = new Map<string, Float64Array>();
  for (const loadCase of model.loadCases) {
    const d = result.results[loadCase.id].displacements;
    displacements.set(loadCase.id, Float64Array.from(structure.nodeIds.flatMap((id) => [d[id].ux, d[id].uy, d[id].uz])));
  }
  const inputs = memberDesignInputs(model, options);
  const resistances = resistanceTable(options.standard, inputs);
  const designResults = designResultIds(model).filter((id) => forces.has(id));
  return {
    model,
    result,
    options,
    structure,
    inputs,
    memberIndex: new Map(model.members.map((m, e) => [m.id, e])),
    forces,
    displacements,
    designResults,
    resistances,
    utilisation: governingUtilisations(resistances, designResults.map((id) => forces.get(id)!)),
  };
}
