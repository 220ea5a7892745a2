import "server-only";
import { TransactionRollbackError } from "drizzle-orm";
import { finishJob } from "@/db/queries/jobs";
import { runCommand } from "./command";
import { withStoredFiles } from "./stored-files";

/** What a finished report job tells the browser: the stored PDF to download and its size. */
export type ReportOutcome = { attachmentId: string; filename: string; bytes: number; pages: number };

/**
 * Stores a finished report PDF (object storage, then its record) with its job marked done, an audit event and a live
 * event of kind "report" (every open report page refreshes its list of the revision's reports), in one transaction. A job that is no longer running stores nothing: the record rolls back and the stored object is
 * removed again (withStoredFiles), so no file is left that no job points at.
 */
export async function storeReport(input: {
  job: { id: string; projectId: string; revisionId: string; revisionNumber: number; requestedBy: string };
  filename: string;
  pdf: Uint8Array;
  pages: number;
}): Promise<ReportOutcome | null> {
  const { job } = input;
  return withStoredFiles({ projectId: job.projectId, userId: job.requestedBy, purpose: "report", files: [{ filename: input.filename, bytes: input.pdf }] }, (record) =>
    runCommand(async ({ tx, audit, live }) => {
      const [file] = await record(tx, { revisionId: job.revisionId });
      const outcome: ReportOutcome = { attachmentId: file.id, filename: input.filename, bytes: input.pdf.byteLength, pages: input.pages };
      if (!(await finishJob(tx, { jobId: job.id, outcome }))) tx.rollback();
      await audit({ projectId: job.projectId, actorId: job.requestedBy, action: "report.store", subjectType: "model_revision", subjectId: job.revisionId, details: { jobId: job.id, attachmentId: file.id } });
      await live({ projectId: job.projectId, kind: "report", subjectId: job.id, revision: job.revisionNumber });
      return outcome;
    }),
  ).catch((error: unknown) => {
    if (error instanceof TransactionRollbackError) return null;
    throw error;
  });
}
