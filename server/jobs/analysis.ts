// The analysis job: solves a stored revision, reviews its members and stores both with the job marked done, in one
// transaction (lib/commands/store-analysis.ts). The computation runs in a worker thread (analysis-thread.ts), so the
// jobs process keeps answering meanwhile; progress goes to the jobs row the browser follows. A failure (a throw in
// the thread, its running out of heap, its end before answering) leaves the revision without analysis and the job
// failed with its reason, until someone retries it.
import { claimJob, failJob, setJobProgress } from "../../db/queries/jobs";
import { getNewestZeroInAll, getRevisionToAnalyse } from "../../db/queries/models";
import { storeAnalysis } from "../../lib/commands/store-analysis";
import { ANALYSIS_WORKER, computeInThread, type OnPhase } from "./analysis-thread";

export type AnalysisJobOptions = {
  /** The thread's entry: the analysis worker; tests give one that throws or ends midway. */
  worker?: URL;
  /** Called after each phase is written to the jobs row and before the next one is (tests follow the phases). */
  onPhase?: OnPhase;
};

/** Works one analysis job; returns its final state ("skipped" when it was already done, failed or removed). */
export async function runAnalysisJob(jobId: string, { worker = ANALYSIS_WORKER, onPhase }: AnalysisJobOptions = {}): Promise<"done" | "failed" | "skipped"> {
  const job = await claimJob({ jobId });
  if (!job) return "skipped";
  try {
    const revision = await getRevisionToAnalyse({ revisionId: job.revisionId });
    if (!revision) return "skipped";
    const compareWith = typeof job.input.compareWith === "string" ? job.input.compareWith : null;
    const zeroInAllBefore = compareWith ? await getNewestZeroInAll({ revisionId: compareWith }) : null;
    // the project's deflection limit as it is now; the stored review keeps it, so a later change alters no stored review
    const computed = await computeInThread(worker, { ...revision, zeroInAllBefore }, async (phase, percent) => {
      await setJobProgress({ jobId, phase, percent });
      await onPhase?.(phase, percent);
    });
    const outcome = { status: computed.status, zeroForce: computed.zeroForce };
    return (await storeAnalysis({ job, ...computed, outcome })) ? "done" : "skipped";
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    await failJob({ jobId, error: `The analysis stopped: ${reason}` });
    return "failed";
  }
}
