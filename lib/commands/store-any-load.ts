import "server-only";
import { TransactionRollbackError } from "drizzle-orm";
import { finishJob } from "@/db/queries/jobs";
import { getRevisionNumber, setReviewAnyLoad } from "@/db/queries/models";
import type { StoredAnyLoad, StoredMemberReview } from "@/lib/models/analyse";
import { runCommand } from "./command";

/**
 * Stores a whole-roof "idle for any roof load" certificate in its analysis run's review with the job marked done, an
 * audit event and a live event (open viewers refetch the revision), in one transaction: a job no longer running, or
 * a run that is gone, stores nothing.
 */
export async function storeAnyLoad(input: {
  job: { id: string; projectId: string; revisionId: string };
  runId: string;
  anyLoad: StoredAnyLoad;
  members: Record<string, NonNullable<StoredMemberReview["anyLoad"]>>;
}): Promise<boolean> {
  const { job } = input;
  return runCommand(async ({ tx, audit, live }) => {
    if (!(await setReviewAnyLoad(tx, { runId: input.runId, anyLoad: input.anyLoad, members: input.members }))) tx.rollback();
    if (!(await finishJob(tx, { jobId: job.id, outcome: { idleForAnyLoad: input.anyLoad.idleForAnyLoad.length } }))) tx.rollback();
    await audit({
      projectId: job.projectId,
      actorId: null,
      action: "anyLoad.store",
      subjectType: "model_revision",
      subjectId: job.revisionId,
      details: { jobId: job.id, analysisRunId: input.runId, idleForAnyLoad: input.anyLoad.idleForAnyLoad.length },
    });
    await live({ projectId: job.projectId, kind: "revision", subjectId: job.revisionId, revision: await getRevisionNumber({ revisionId: job.revisionId, db: tx }) });
    return true;
  }).catch((error: unknown) => {
    if (error instanceof TransactionRollbackError) return false;
    throw error;
  });
}
