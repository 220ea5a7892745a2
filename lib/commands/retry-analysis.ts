import "server-only";
import { withTransaction } from "@/db/client";
import { recordAuditEvent } from "@/db/queries/audit";
import { requeueFailedJob, type JobView } from "@/db/queries/jobs";
import { ConflictError } from "@/lib/http/errors";
import { QUEUES, sendJob, type AnalysisJobData } from "@/lib/jobs/queue";

/** Puts a failed analysis or any-load job back in its queue, with an audit event; a job that has not failed is a 409. */
export async function retryAnalysis({ projectId, jobId, userId }: { projectId: string; jobId: string; userId: string }): Promise<JobView> {
  return withTransaction(async (tx) => {
    const job = await requeueFailedJob(tx, { projectId, jobId });
    if (!job) throw new ConflictError("Only a failed job can be retried.");
    await sendJob(tx, job.kind === "any_load" ? QUEUES.anyLoad : QUEUES.analysis, { jobId } satisfies AnalysisJobData);
    await recordAuditEvent({ db: tx, projectId, actorId: userId, action: "analysis.retry", subjectType: "model_revision", subjectId: job.revisionId, details: { jobId } });
    return job;
  });
}
