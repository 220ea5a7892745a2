// The hang-services job: hangs the source revision's runs from its bottom layer as a load case, detects the clashes
// of those runs on the new model, then stores the new revision with its runs and clashes and queues its analysis, in
// one transaction (lib/commands/store-hung-services.ts). The analysis is a second job, chained: the browser follows
// this job, then that one, on the same progress bar. A failure stores nothing and leaves the job failed with its
// reason until someone retries it.
//
// A member removed after queueing: the request was checked (model.edit + analysis.run) when it was made, and the
// job is then the team's work, as an analysis queued by them is: it still runs, the new revision names them as its
// author (history stays true), and the team sees it like any revision. Whoever may hang the services may retry it.
import { claimJob, failJob, setJobProgress } from "../../db/queries/jobs";
import { getRevisionForHanging, listRuns } from "../../db/queries/mep";
import { getDb } from "../../db/client";
import { detectClashes } from "../../lib/clash/detect";
import { readStoredJobInput } from "../../lib/jobs/stored-input";
import { runsFingerprint } from "../../lib/mep/runs-fingerprint";
import { hangJobInputSchema } from "../../lib/mep/schemas";
import { hangServices } from "../../lib/mep/services";
import { runsChangedReason, storeHungServices } from "../../lib/commands/store-hung-services";

/** What the job computes with; tests pass a failing step to check that nothing half-stored remains. */
type MaybeAsync<F extends (...args: never[]) => unknown> = (...args: Parameters<F>) => ReturnType<F> | Promise<ReturnType<F>>;
export type HangSteps = { hang: MaybeAsync<typeof hangServices>; detect: MaybeAsync<typeof detectClashes> };
const defaultSteps: HangSteps = { hang: hangServices, detect: detectClashes };

/** Works one hang-services job; returns its final state ("skipped" when it was already done, failed or removed). */
export async function runHangServicesJob(jobId: string, steps: HangSteps = defaultSteps): Promise<"done" | "failed" | "skipped"> {
  const job = await claimJob({ jobId });
  if (!job) return "skipped";
  const progress = (phase: string, percent: number) => setJobProgress({ jobId, phase, percent });
  try {
    const input = readStoredJobInput(hangJobInputSchema, job.input, "hang the services again from the clashes page.");
    // The jobs row goes with its revision (on delete cascade), so a missing revision here was removed mid-run.
    const source = await getRevisionForHanging({ revisionId: job.revisionId });
    if (!source) throw new Error("the revision whose services were to be hung is gone");
    const runs = await listRuns({ db: getDb(), revisionId: source.id });
    if (runsFingerprint(runs) !== input.runs) throw new Error(runsChangedReason(source.number));
    await progress("hanging", 10);
    const hung = await steps.hang(source.model, runs, input.hangerSpacing);
    await progress("clashes", 40);
    const detected = await steps.detect(hung.model, runs);
    await progress("storing", 70);
    const stored = await storeHungServices({
      job,
      source: { id: source.id, number: source.number, name: source.model.name },
      runs: input.runs,
      model: hung.model,
      detected,
      totalLoad: hung.totalLoad,
      hangers: hung.hangers.length,
    });
    return stored ? "done" : "skipped";
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    await failJob({ jobId, error: `Hanging the services stopped: ${reason}` });
    return "failed";
  }
}
