import "server-only";
import { hasActiveJob, insertJob, type JobView } from "@/db/queries/jobs";
import { listRuns } from "@/db/queries/mep";
import { ConflictError, ValidationError } from "@/lib/http/errors";
import { QUEUES, sendJob, type AnalysisJobData } from "@/lib/jobs/queue";
import { runsFingerprint } from "@/lib/mep/runs-fingerprint";
import type { HangJobInput } from "@/lib/mep/schemas";
import { runCommand } from "./command";

/**
 * Queues "hang the services" for a revision (server/jobs/hang-services.ts): the jobs row the browser follows and the
 * pg-boss job commit together, with an audit event and the job's live event. The job keeps the fingerprint of the
 * runs as they are now and hangs only those. Refused when the revision has no runs (400) or its services are already
 * being hung (409: a double click, or a second engineer, would otherwise make two identical revisions).
 */
export async function enqueueHangServices(input: { projectId: string; revision: { id: string; number: number }; hangerSpacing: number; actorId: string }): Promise<JobView> {
  const { projectId, revision, actorId } = input;
  return runCommand(async ({ tx, audit, live }) => {
    const runs = await listRuns({ db: tx, revisionId: revision.id });
    if (runs.length === 0) throw new ValidationError([{ path: "revision", message: "This revision has no runs to hang." }], "This revision has no runs to hang.");
    if (await hasActiveJob(tx, { revisionId: revision.id, kind: "hang_services" })) throw new ConflictError(`The services of revision ${revision.number} are already being hung; wait for that job to finish.`);
    const jobInput: HangJobInput = { hangerSpacing: input.hangerSpacing, runs: runsFingerprint(runs) };
    const job = await insertJob(tx, { projectId, kind: "hang_services", revisionId: revision.id, input: jobInput, requestedBy: actorId });
    await sendJob(tx, QUEUES.hangServices, { jobId: job.id } satisfies AnalysisJobData);
    await audit({ projectId, actorId, action: "services.hang", subjectType: "model_revision", subjectId: revision.id, details: { jobId: job.id, number: revision.number, ...jobInput } });
    await live({ projectId, kind: "job", subjectId: job.id, revision: revision.number });
    return job;
  });
}
