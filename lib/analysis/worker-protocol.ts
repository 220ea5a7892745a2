import { analyzeModel, type AnalysisResult } from "./analyze";
import { validateModel, type ModelProblem } from "./model";

/** Message to the analysis Web Worker: a raw model (validated inside the worker) and options. */
export type AnalysisRequest = { id: number; model: unknown; lowForceThreshold?: number };

/** The worker's answer to the request with the same id. */
export type AnalysisResponse = { id: number; ok: true; result: AnalysisResult } | { id: number; ok: false; problems: ModelProblem[] };

/** Validates and analyses one request; pure, so the worker stays a thin wrapper around it. */
export function handleAnalysisRequest(request: AnalysisRequest): AnalysisResponse {
  const checked = validateModel(request.model);
  if (!checked.ok) return { id: request.id, ok: false, problems: checked.problems };
  return { id: request.id, ok: true, result: analyzeModel(checked.model, { lowForceThreshold: request.lowForceThreshold }) };
}
