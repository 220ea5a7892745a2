import "server-only";
import type { JobView } from "@/db/queries/jobs";
import { requeueFailedJob } from "@/db/queries/jobs";
import { ConflictError } from "@/lib/http/errors";
import { QUEUES, sendJob } from "@/lib/jobs/queue";
import { runCommand } from "./command";

/** The queue that works each kind of job. */
const QUEUE_OF: Record<JobView["kind"], string> = { analysis: QUEUES.analysis, any_load: QUEUES.anyLoad, report: QUEUES.report, hang_services: QUEUES.hangServices };
/** The audit action of a retry: the whole-roof any-load check is part of the analysis's work. */
const RETRY_ACTION: Record<JobView["kind"], string> = { analysis: "analysis.retry", any_load: "analysis.retry", report: "report.retry", hang_services: "services.retry" };

/** Puts a failed job back in its queue, with an audit event; a job that has not failed is a 409. */
export async function retryJob({ projectId, jobId, userId }: { projectId: string; jobId: string; userId: string }): Promise<JobView> {
  return runCommand(async ({ tx, audit }) => {
    const job = await requeueFailedJob(tx, { projectId, jobId });
    if (!job) throw new ConflictError("Only a failed job can be retried.");
    await sendJob(tx, QUEUE_OF[job.kind], { jobId });
    await audit({ projectId, actorId: userId, action: RETRY_ACTION[job.kind], subjectType: "model_revision", subjectId: job.revisionId, details: { jobId } });
    return job;
  });
}
