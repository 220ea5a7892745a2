// Web Worker entry: keeps a long analysis off the viewer's main thread. Create it with
// new Worker(new URL("@/lib/analysis/analysis.worker.ts", import.meta.url)), or use analyzeInWorker.
import { handleAnalysisRequest, type AnalysisRequest } from "./worker-protocol";

const scope = self as unknown as DedicatedWorkerGlobalScope;
scope.onmessage = (event: MessageEvent<AnalysisRequest>) => scope.postMessage(handleAnalysisRequest(event.data));
