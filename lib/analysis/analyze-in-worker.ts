import type { AnalysisResponse } from "./worker-protocol";

let nextRequest = 1;

/**
 * Runs validation and analysis in a dedicated Web Worker (browser only); resolves with the worker's answer.
 * Import it from "@/lib/analysis/analyze-in-worker" in client code; index.ts leaves it out so server bundles
 * never see the worker URL.
 */
export function analyzeInWorker(model: unknown, options: { lowForceThreshold?: number } = {}): Promise<AnalysisResponse> {
  const worker = new Worker(new URL("./analysis.worker.ts", import.meta.url), { type: "module" });
  const id = nextRequest++;
  return new Promise<AnalysisResponse>((resolve, reject) => {
    worker.onmessage = (event: MessageEvent<AnalysisResponse>) => {
      if (event.data.id !== id) return;
      worker.terminate();
      resolve(event.data);
    };
    worker.onerror = (event) => {
      worker.terminate();
      reject(new Error(event.message || "analysis worker failed"));
    };
    worker.postMessage({ id, model, lowForceThreshold: options.lowForceThreshold });
  }).finally(() => worker.terminate());
}
