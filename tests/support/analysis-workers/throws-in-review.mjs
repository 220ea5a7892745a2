// An analysis thread (server/jobs/analysis-worker.ts's messages) that reports the analysis and review phases, then
// throws, as a review running out of memory would: the job must fail with this reason and store nothing.
import { parentPort } from "node:worker_threads";

parentPort.postMessage({ kind: "progress", phase: "analysis", percent: 10 });
parentPort.postMessage({ kind: "progress", phase: "review", percent: 50 });
throw new Error("out of memory in the review");
