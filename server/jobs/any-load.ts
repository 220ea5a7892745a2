// The whole-roof "idle for any roof load" job (issue 15 item 9), for roofs whose review left it out: one solve per
// unit load at every top-layer node on the stored analysis, with progress to the jobs row the viewer polls, stored
// into that analysis's review in one transaction (lib/commands/store-any-load.ts). A failure stores nothing and
// leaves the job failed with its reason until someone retries it.
import { claimJob, failJob, setJobProgress } from "../../db/queries/jobs";
import { getAnalysisRunForAnyLoad } from "../../db/queries/models";
import { storeAnyLoad } from "../../lib/commands/store-any-load";
import { storedAnyLoad } from "../../lib/models/analyse";
import { idleForAnyLoadAsync } from "../../lib/review/any-load";
import { createReviewContext } from "../../lib/review/context";

/** What the job computes with; tests pass a failing certificate to check that nothing half-stored remains. */
export type AnyLoadSteps = { certify: typeof idleForAnyLoadAsync };
const defaultSteps: AnyLoadSteps = { certify: idleForAnyLoadAsync };

/** Works one any-load job; returns its final state ("skipped" when it was already done, failed or removed). */
export async function runAnyLoadJob(jobId: string, steps: AnyLoadSteps = defaultSteps): Promise<"done" | "failed" | "skipped"> {
  const job = await claimJob({ jobId });
  if (!job) return "skipped";
  const progress = (phase: string, percent: number) => setJobProgress({ jobId, phase, percent });
  try {
    const runId = typeof job.input.analysisRunId === "string" ? job.input.analysisRunId : null;
    const run = runId ? await getAnalysisRunForAnyLoad({ runId }) : null;
    if (!runId || !run || !run.hasReview || run.result.status !== "ok") throw new Error("the revision's stable analysis is gone; start the check again from the viewer");
    await progress("factorising", 5);
    const context = createReviewContext(run.model, run.result, { standard: run.standard });
    let shown = 5;
    const certificate = await steps.certify(context, {}, async (fraction) => {
      // unit loads solved: 10 … 90 %, written when the whole percent moves
      const percent = 10 + Math.floor(80 * fraction);
      if (percent > shown) await progress("unit loads", (shown = percent));
    });
    await progress("storing", 95);
    const stored = storedAnyLoad(run.model, certificate);
    return (await storeAnyLoad({ job, runId, anyLoad: stored.anyLoad, members: stored.members })) ? "done" : "skipped";
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    await failJob({ jobId, error: `The check stopped: ${reason}` });
    return "failed";
  }
}
