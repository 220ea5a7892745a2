import "server-only";
import { hasActiveJob, insertJob, type JobView } from "@/db/queries/jobs";
import { ConflictError } from "@/lib/http/errors";
import { QUEUES, sendJob, type ReportJobData } from "@/lib/jobs/queue";
import type { ReportJobInput } from "@/lib/report/schemas";
import { runCommand } from "./command";

/**
 * Asks the jobs process for a review report PDF: the jobs row the browser follows and the pg-boss job commit
 * together with the audit event, or not at all. The query was checked against the revision by the caller.
 */
export async function enqueueReport(input: { projectId: string; revisionId: string; query: ReportJobInput; requestedBy: string }): Promise<JobView> {
  return runCommand(async ({ tx, audit }) => {
    // One at a time per member and revision, so repeated clicks or a script cannot fill the job runner's queue.
    if (await hasActiveJob(tx, { revisionId: input.revisionId, kind: "report", requestedBy: input.requestedBy })) {
      throw new ConflictError(`A report of revision ${input.query.revision} you asked for is already being made: wait for it to finish, then ask again.`);
    }
    const job = await insertJob(tx, { projectId: input.projectId, kind: "report", revisionId: input.revisionId, input: input.query, requestedBy: input.requestedBy });
    await sendJob(tx, QUEUES.report, { jobId: job.id } satisfies ReportJobData);
    await audit({ projectId: input.projectId, actorId: input.requestedBy, action: "report.request", subjectType: "model_revision", subjectId: input.revisionId, details: { jobId: job.id, ...input.query } });
    return job;
  });
}
