// Runs one analysis job's computation in a worker thread (analysis-worker.ts) and hands back what it computed. The
// thread's progress is written in order, and the answer waits for those writes, so the browser never sees a phase
// after the job's end. A throw in the thread, its running out of heap (lib/limits.ts) or its exit before answering
// rejects with the reason; the thread is terminated either way, so its heap is returned before anything is stored.
import { Worker } from "node:worker_threads";
import { analysisThreadHeapMb } from "../../lib/limits";
import type { AnalysisComputed, AnalysisPhase, AnalysisWorkerInput, AnalysisWorkerMessage } from "./analysis-worker";

/** The thread's entry (it loads the TypeScript body through tsx in any host: see the file). */
export const ANALYSIS_WORKER = new URL("./analysis-worker-entry.mjs", import.meta.url);

/** Called after each phase change the thread reports, before the next is written; the job writes its progress here. */
export type OnPhase = (phase: AnalysisPhase, percent: number) => Promise<void>;

/** Computes in a new thread started from `entry` (the analysis worker; tests give one that fails). */
export async function computeInThread(entry: URL, input: AnalysisWorkerInput, onPhase: OnPhase): Promise<AnalysisComputed> {
  const worker = new Worker(entry, { workerData: input, resourceLimits: { maxOldGenerationSizeMb: analysisThreadHeapMb } });
  try {
    return await new Promise<AnalysisComputed>((resolve, reject) => {
      let answered = false;
      // Every step, the answer included, runs after the progress writes before it.
      let steps: Promise<unknown> = Promise.resolve();
      const then = (step: () => unknown) => {
        steps = steps.then(step);
        steps.catch(reject);
      };
      worker.on("message", (message: AnalysisWorkerMessage) => {
        if (message.kind === "progress") return then(() => onPhase(message.phase, message.percent));
        answered = true;
        then(() => resolve(message.computed));
      });
      worker.on("error", (error) => then(() => reject(error)));
      worker.on("exit", (code) => {
        if (!answered) then(() => reject(new Error(`its thread ended (exit code ${code}) before it finished`)));
      });
    });
  } finally {
    await worker.terminate();
  }
}
