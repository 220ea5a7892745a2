// The analysis job: solves a stored revision, reviews its members and stores both with the job marked done, in one
// transaction (lib/commands/store-analysis.ts). Progress goes to the jobs row the browser polls. A failure leaves
// the revision without analysis and the job failed with its reason, until someone retries it.
import { claimJob, failJob, setJobProgress } from "../../db/queries/jobs";
import { getLatestAnalysisForRevision } from "../../db/queries/mep";
import { getRevisionForAnalysis } from "../../db/queries/models";
import { analyzeModel } from "../../lib/analysis";
import { storeAnalysis } from "../../lib/commands/store-analysis";
import { zeroForceChange } from "../../lib/mep/services";
import { reviewForStorage } from "../../lib/models/analyse";

/** What the job computes with; tests pass a failing analysis to check that nothing half-stored remains. */
type MaybeAsync<F extends (...args: never[]) => unknown> = (...args: Parameters<F>) => ReturnType<F> | Promise<ReturnType<F>>;
export type AnalysisSteps = { analyse: MaybeAsync<typeof analyzeModel>; review: MaybeAsync<typeof reviewForStorage> };
const defaultSteps: AnalysisSteps = { analyse: analyzeModel, review: reviewForStorage };

/** Works one analysis job; returns its final state ("skipped" when it was already done, failed or removed). */
export async function runAnalysisJob(jobId: string, steps: AnalysisSteps = defaultSteps): Promise<"done" | "failed" | "skipped"> {
  const job = await claimJob({ jobId });
  if (!job) return "skipped";
  const progress = (phase: string, percent: number) => setJobProgress({ jobId, phase, percent });
  try {
    const revision = await getRevisionForAnalysis({ revisionId: job.revisionId });
    if (!revision) return "skipped";
    await progress("analysis", 10);
    const result = await steps.analyse(revision.model);
    await progress("review", 50);
    // the project's deflection limit as it is now; the stored review keeps it, so a later change alters no stored review
    const review = await steps.review(revision.model, result, revision.standard, revision.deflectionLimit);
    await progress("storing", 90);
    const compareWith = typeof job.input.compareWith === "string" ? job.input.compareWith : null;
    const before = compareWith ? await getLatestAnalysisForRevision({ revisionId: compareWith }) : null;
    const outcome = {
      status: result.status,
      zeroForce: before?.result.status === "ok" && result.status === "ok" ? zeroForceChange(before.result, result) : null,
    };
    return (await storeAnalysis({ job, model: revision.model, result, review, outcome })) ? "done" : "skipped";
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    await failJob({ jobId, error: `The analysis stopped: ${reason}` });
    return "failed";
  }
}
