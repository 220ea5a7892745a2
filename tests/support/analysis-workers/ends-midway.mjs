// An analysis thread (server/jobs/analysis-worker.ts's messages) that reports the analysis phase and then ends
// without an answer, as a thread killed mid-job would: the job must fail saying so and store nothing.
import { parentPort } from "node:worker_threads";

parentPort.postMessage({ kind: "progress", phase: "analysis", percent: 10 });
process.exit(7);
