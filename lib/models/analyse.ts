// The analysis stored with a new revision, run at save time so the viewer never waits for a solve.
import { analyzeModel, type AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import type { Project } from "@/db/schema";

/** Analyses a validated model and reviews its members against the project's design standard. */
export function analyseForStorage(model: TrussModel, standard: Project["designStandard"]): { result: AnalysisResult; review: unknown } {
  const result = analyzeModel(model);
  return { result, review: result.status === "ok" ? { standard } : null };
}
