import "server-only";
import type { Transaction } from "@/db/client";
import { insertJob, type JobView } from "@/db/queries/jobs";
import { QUEUES, sendJob, type AnalysisJobData } from "@/lib/jobs/queue";

/**
 * Queues the analysis and review of a revision inside the caller's transaction: the jobs row the browser watches
 * and the pg-boss job the jobs process works commit together with the revision, or not at all.
 */
export async function enqueueAnalysis(
  tx: Transaction,
  input: { projectId: string; revisionId: string; requestedBy: string | null; compareWith?: string },
): Promise<JobView> {
  const job = await insertJob(tx, {
    projectId: input.projectId,
    kind: "analysis",
    revisionId: input.revisionId,
    input: input.compareWith ? { compareWith: input.compareWith } : {},
    requestedBy: input.requestedBy,
  });
  await sendJob(tx, QUEUES.analysis, { jobId: job.id } satisfies AnalysisJobData);
  return job;
}
