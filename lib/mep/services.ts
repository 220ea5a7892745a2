// The loop back to analysis: the runs' weight as a hung-services load case added to the model.
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import { servicesLoadCase, type Hanger } from "@/lib/review/services-load";
import type { Run } from "./schemas";

export const HUNG_SERVICES_CASE = "services-runs";

/**
 * The model with the runs hung from the bottom layer as load case "services-runs" (replacing an earlier one).
 * In each combination the new case takes the factor of the model's other "services" case there (the runs are
 * services of the same kind). If the model has no other services case, it takes the dead load's factor where that
 * is unfavourable (> 1) and is left out where the dead load is favourable — services may not yet be hung, so they
 * are not relied on to hold the roof down (common practice, the same rule the roof generator follows).
 */
export function hangServices(model: TrussModel, runs: Run[], hangerSpacing: number): { model: TrussModel; hangers: Hanger[]; totalLoad: number } {
  const { loadCase, hangers, totalLoad } = servicesLoadCase(model, runs, { hangerSpacing, id: HUNG_SERVICES_CASE });
  const loadCases = model.loadCases.filter((c) => c.id !== HUNG_SERVICES_CASE);
  const servicesCases = loadCases.filter((c) => c.category === "services").map((c) => c.id);
  const deadCases = loadCases.filter((c) => c.category === "dead").map((c) => c.id);
  const combinations = model.combinations.map((combination) => {
    const factors = Object.fromEntries(Object.entries(combination.factors).filter(([id]) => id !== HUNG_SERVICES_CASE));
    const fromServices = servicesCases.map((id) => factors[id]).find((f) => f !== undefined);
    const fromDead = deadCases.map((id) => factors[id]).find((f) => f !== undefined);
    const factor = servicesCases.length > 0 ? fromServices : fromDead !== undefined && fromDead > 1 ? fromDead : undefined;
    return { ...combination, factors: factor ? { ...factors, [HUNG_SERVICES_CASE]: factor } : factors };
  });
  return { model: { ...model, loadCases: [...loadCases, loadCase], combinations }, hangers, totalLoad };
}

/** How the set of members that are zero in every combination changes between two analyses. */
export function zeroForceChange(before: Pick<AnalysisResult, "zeroInAll">, after: Pick<AnalysisResult, "zeroInAll">): { noLongerZero: string[]; newlyZero: string[] } {
  const was = new Set(before.zeroInAll);
  const now = new Set(after.zeroInAll);
  return { noLongerZero: before.zeroInAll.filter((id) => !now.has(id)), newlyZero: after.zeroInAll.filter((id) => !was.has(id)) };
}
