import "server-only";
import { TransactionRollbackError } from "drizzle-orm";
import { finishJob } from "@/db/queries/jobs";
import { getRevisionNumber, insertAnalysisRun } from "@/db/queries/models";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { StoredReview } from "@/lib/models/analyse";
import { runCommand } from "./command";
import { encodeResultColumns } from "@/lib/models/result-columns";
import type { TrussModel } from "@/lib/analysis/model";
import { recheckCarriedDecisions } from "./recheck-carried-decisions";

/**
 * Stores a finished analysis with its job marked done, an audit event and a live event (open viewers refetch the
 * revision's results). A job that is no longer running (retried elsewhere, or its project removed) stores nothing.
 */
export async function storeAnalysis(input: {
  job: { id: string; projectId: string; revisionId: string };
  /** The revision's model: the columns follow its member and node order. */
  model: TrussModel;
  result: AnalysisResult;
  review: StoredReview | null;
  outcome: Record<string, unknown> | null;
}): Promise<boolean> {
  const { job } = input;
  const columns = encodeResultColumns(input.model, input.result, input.review);
  return runCommand(async ({ tx, audit, live }) => {
    const run = await insertAnalysisRun(tx, { revisionId: job.revisionId, result: input.result, review: input.review, columns });
    if (!(await finishJob(tx, { jobId: job.id, outcome: input.outcome }))) tx.rollback();
    await recheckCarriedDecisions(tx, { projectId: job.projectId, revisionId: job.revisionId });
    await audit({
      projectId: job.projectId,
      actorId: null,
      action: "analysis.store",
      subjectType: "model_revision",
      subjectId: job.revisionId,
      details: { jobId: job.id, analysisRunId: run.id, status: input.result.status },
    });
    await live({ projectId: job.projectId, kind: "revision", subjectId: job.revisionId, revision: await getRevisionNumber({ revisionId: job.revisionId, db: tx }) });
    return true;
  }).catch((error: unknown) => {
    if (error instanceof TransactionRollbackError) return false;
    throw error;
  });
}
