import "server-only";
import { TransactionRollbackError } from "drizzle-orm";
import { finishJob } from "@/db/queries/jobs";
import { getRevisionNumber, insertAnalysisRun, type JsonBytes, type StoredColumns } from "@/db/queries/models";
import { runCommand } from "./command";
import { recheckCarriedDecisions } from "./recheck-carried-decisions";

/** A computed analysis ready to store: its JSON documents as bytes and its columns (server/jobs/analysis-worker.ts). */
export type AnalysisToStore = {
  status: "ok" | "unstable";
  /** The analysis result of design.md and the member review (null when the model is unstable), as UTF-8 JSON. */
  resultJson: JsonBytes;
  reviewJson: JsonBytes | null;
  /** The same results as columns, in the revision's member and node order. */
  columns: StoredColumns;
};

/**
 * Stores a finished analysis with its job marked done, an audit event and a live event (open viewers refetch the
 * revision's results). A job that is no longer running (retried elsewhere, or its project removed) stores nothing.
 */
export async function storeAnalysis(input: AnalysisToStore & { job: { id: string; projectId: string; revisionId: string }; outcome: Record<string, unknown> | null }): Promise<boolean> {
  const { job, status, resultJson, reviewJson, columns } = input;
  return runCommand(async ({ tx, audit, live }) => {
    const run = await insertAnalysisRun(tx, { revisionId: job.revisionId, status, resultJson, reviewJson, columns });
    if (!(await finishJob(tx, { jobId: job.id, outcome: input.outcome }))) tx.rollback();
    await recheckCarriedDecisions(tx, { projectId: job.projectId, revisionId: job.revisionId });
    await audit({
      projectId: job.projectId,
      actorId: null,
      action: "analysis.store",
      subjectType: "model_revision",
      subjectId: job.revisionId,
      details: { jobId: job.id, analysisRunId: run.id, status },
    });
    await live({ projectId: job.projectId, kind: "revision", subjectId: job.revisionId, revision: await getRevisionNumber({ revisionId: job.revisionId, db: tx }) });
    return true;
  }).catch((error: unknown) => {
    if (error instanceof TransactionRollbackError) return false;
    throw error;
  });
}
