import "server-only";
import { hasActiveJob, insertJob, type JobView } from "@/db/queries/jobs";
import { getRevisionForAnyLoad } from "@/db/queries/models";
import { ConflictError, NotFoundError } from "@/lib/http/errors";
import { QUEUES, sendJob, type AnalysisJobData } from "@/lib/jobs/queue";
import { runCommand } from "./command";

/**
 * Queues "idle for any roof load" for the whole roof of a revision (server/jobs/any-load.ts), for roofs whose review
 * left it out: the jobs row the viewer follows and the pg-boss job commit together, with an audit event. Refused
 * while the revision is unanalysed or unstable, already certified, or already being certified.
 */
export async function enqueueAnyLoad({ projectId, number, actorId }: { projectId: string; number: number; actorId: string }): Promise<JobView> {
  return runCommand(async ({ tx, audit }) => {
    const target = await getRevisionForAnyLoad(tx, { projectId, number });
    if (!target) throw new NotFoundError("No such revision.");
    if (!target.runId) throw new ConflictError(`Revision ${number} is not analysed yet; start the check once its analysis is stored.`);
    if (target.status !== "ok") throw new ConflictError(`Revision ${number} is unstable: no load can be checked on a mechanism. Make it stable first.`);
    if (target.certified) throw new ConflictError(`Revision ${number} already has "idle for any roof load" for every member.`);
    if (await hasActiveJob(tx, { revisionId: target.revisionId, kind: "any_load" })) throw new ConflictError(`"Idle for any roof load" is already being checked for revision ${number}.`);
    const job = await insertJob(tx, { projectId, kind: "any_load", revisionId: target.revisionId, input: { analysisRunId: target.runId }, requestedBy: actorId });
    await sendJob(tx, QUEUES.anyLoad, { jobId: job.id } satisfies AnalysisJobData);
    await audit({ projectId, actorId, action: "anyLoad.start", subjectType: "model_revision", subjectId: target.revisionId, details: { jobId: job.id, number } });
    return job;
  });
}
