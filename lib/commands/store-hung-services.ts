import "server-only";
import { TransactionRollbackError } from "drizzle-orm";
import { finishJob, type JobView } from "@/db/queries/jobs";
import { listRuns } from "@/db/queries/mep";
import type { TrussModel } from "@/lib/analysis/model";
import type { Clash, DetectionSummary } from "@/lib/clash/detect";
import { runsFingerprint } from "@/lib/mep/runs-fingerprint";
import { runRevisionCommand } from "./command";
import { storeDerivedRevision } from "./store-derived-revision";

/** What a finished hang-services job tells the browser: the new revision, the load hung, its clashes, and its analysis job to follow next. */
export type HangServicesOutcome = {
  revision: { id: string; number: number };
  totalLoad: number;
  hangers: number;
  detection: DetectionSummary;
  analysisJob: JobView;
};

/** Why a hanging stops when the runs it was queued for are no longer the revision's runs. */
export const runsChangedReason = (number: number) =>
  `the runs of revision ${number} changed after the hanging was queued (edited, added or removed), so it would not hang what was asked for; hang the services again to use the runs as they are now`;

/**
 * Stores what the hang-services job computed, in one transaction: the new revision with the hung-services load
 * case, the source's runs copied onto it with its clashes (detected by the job on the same runs) and their
 * decisions, its analysis job queued (comparing zero-force members with the source), the hanging job marked done,
 * an audit event and the live event. The runs are checked against the fingerprint the request kept, inside the
 * transaction: runs changed meanwhile throw (the job fails saying so) and nothing is stored. False (nothing stored)
 * when the job is no longer running.
 */
export async function storeHungServices(input: {
  job: { id: string; projectId: string; requestedBy: string | null };
  source: { id: string; number: number; name: string };
  runs: string;
  model: TrussModel;
  detected: Clash[];
  totalLoad: number;
  hangers: number;
}): Promise<boolean> {
  const { job, source } = input;
  return runRevisionCommand(async ({ tx, audit, live }) => {
    if (runsFingerprint(await listRuns({ db: tx, revisionId: source.id })) !== input.runs) throw new Error(runsChangedReason(source.number));
    // The new revision is the requester's work, done by the job (see server/jobs/hang-services.ts on removed members).
    const { revision, detection, analysisJob } = await storeDerivedRevision(tx, {
      projectId: job.projectId,
      createdBy: job.requestedBy,
      fromRevisionId: source.id,
      name: `${source.name} + hung services (from r${source.number})`,
      model: input.model,
      detected: input.detected,
    });
    const outcome: HangServicesOutcome = { revision, totalLoad: input.totalLoad, hangers: input.hangers, detection, analysisJob };
    if (!(await finishJob(tx, { jobId: job.id, outcome }))) tx.rollback();
    await audit({
      projectId: job.projectId,
      actorId: null,
      action: "services.store",
      subjectType: "model_revision",
      subjectId: revision.id,
      details: { jobId: job.id, fromRevisionId: source.id, requestedBy: job.requestedBy, totalLoad: input.totalLoad, analysisJobId: analysisJob.id, ...detection },
    });
    await live({ projectId: job.projectId, kind: "revision", subjectId: revision.id, revision: revision.number });
    return true;
  }).catch((error: unknown) => {
    if (error instanceof TransactionRollbackError) return false;
    throw error;
  });
}
