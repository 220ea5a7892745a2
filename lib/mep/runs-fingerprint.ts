// A hanging is queued for the runs as they were when someone asked; the job runs later. It keeps this short
// fingerprint of those runs (not the runs: up to 2,000 of them would bloat every jobs row) and hangs only if the
// revision's runs still have it, so an edit in between never slips into a hanging nobody saw.
import { createHash } from "node:crypto";
import type { Run } from "./schemas";

/** SHA-256 of the runs as hanging and clash detection read them, in their stored (id) order. */
export function runsFingerprint(runs: Run[]): string {
  return createHash("sha256").update(JSON.stringify(runs)).digest("hex");
}
