// Entry of the analysis worker thread (analysis-thread.ts starts it). A worker thread loads its own modules, and the
// jobs process's code is TypeScript run through tsx: a thread started by `tsx server/jobs/main.ts` inherits tsx's
// loader, one started by vitest (the integration tests call the job directly) does not. Registering tsx's loader
// here (tsx/esm/api, its documented way) makes both start the same TypeScript body.
import { register } from "tsx/esm/api";

register();
await import("./analysis-worker.ts");
