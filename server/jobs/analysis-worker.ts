// The analysis job's computation, in a worker thread of the jobs process (started by analysis-thread.ts through
// analysis-worker-entry.mjs): the solve, the member review and the bytes of what gets stored (the design-format
// JSON, the review JSON and the result columns). The jobs process's event loop stays free meanwhile for its health
// endpoint, the mail outbox and other jobs' progress. Only bytes go back, transferred rather than copied; the object
// graphs stay in this thread, whose heap is returned when it ends after the job.
import { parentPort, workerData } from "node:worker_threads";
import { analyzeModel, type TrussModel } from "../../lib/analysis";
import { zeroForceChange } from "../../lib/mep/services";
import { reviewForStorage } from "../../lib/models/analyse";
import { jsonBytes } from "../../lib/models/json-bytes";
import { encodeResultColumns, type ResultColumns, type RunColumns } from "../../lib/models/result-columns";
import type { DesignStandard } from "../../lib/review/design-checks/types";

/** What the thread is started with: the stored model as its JSON text (parsed here, not in the jobs process). */
export type AnalysisWorkerInput = {
  modelJson: string;
  standard: DesignStandard;
  deflectionLimit: number;
  /** Members zero in all results of the revision compared with (its newest analysis), or null for none. */
  zeroInAllBefore: string[] | null;
};

/** The phases the browser's progress bar shows, in order. */
export type AnalysisPhase = "analysis" | "review" | "storing";

/** What the thread computed, ready to store. */
export type AnalysisComputed = {
  status: "ok" | "unstable";
  /** UTF-8 JSON of the analysis result (design.md) and of the member review (null when the model is unstable). */
  resultJson: Uint8Array;
  reviewJson: Uint8Array | null;
  columns: { results: ResultColumns[]; run: RunColumns };
  zeroForce: { noLongerZero: string[]; newlyZero: string[] } | null;
};

export type AnalysisWorkerMessage = { kind: "progress"; phase: AnalysisPhase; percent: number } | { kind: "done"; computed: AnalysisComputed };

function compute(input: AnalysisWorkerInput, progress: (phase: AnalysisPhase, percent: number) => void): AnalysisComputed {
  const model = JSON.parse(input.modelJson) as TrussModel;
  progress("analysis", 10);
  const result = analyzeModel(model);
  progress("review", 50);
  const review = reviewForStorage(model, result, input.standard, input.deflectionLimit);
  progress("storing", 90);
  const columns = encodeResultColumns(model, result, review);
  const zeroForce = input.zeroInAllBefore && result.status === "ok" ? zeroForceChange({ zeroInAll: input.zeroInAllBefore }, result) : null;
  return { status: result.status, resultJson: jsonBytes(result), reviewJson: review && jsonBytes(review), columns, zeroForce };
}

/** Every buffer of the computed bytes, so postMessage moves them instead of copying. */
function buffersOf({ resultJson, reviewJson, columns }: AnalysisComputed): ArrayBuffer[] {
  const views = [resultJson, reviewJson, columns.run.utilisation, columns.run.verdicts, columns.run.zeroInAll, ...columns.results.flatMap((r) => [r.forces, r.zero, r.displacements])];
  return [...new Set(views.flatMap((view) => (view ? [view.buffer as ArrayBuffer] : [])))];
}

const port = parentPort;
if (!port) throw new Error("analysis-worker.ts runs as a worker thread of the jobs process (server/jobs/analysis-thread.ts).");
const post = (message: AnalysisWorkerMessage, transfer: ArrayBuffer[] = []) => port.postMessage(message, transfer);
const computed = compute(workerData as AnalysisWorkerInput, (phase, percent) => post({ kind: "progress", phase, percent }));
post({ kind: "done", computed }, buffersOf(computed));
