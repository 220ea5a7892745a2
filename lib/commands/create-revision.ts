import "server-only";
import { linkModelFiles } from "@/db/queries/attachments";
import { insertRevision } from "@/db/queries/models";
import type { JobView } from "@/db/queries/jobs";
import type { TrussModel } from "@/lib/analysis/model";
import { ConflictError } from "@/lib/http/errors";
import { withStoredFiles, type ReceivedFile } from "@/lib/commands/stored-files";
import { carryPreviousRunsForward } from "./carry-runs-forward";
import { runRevisionCommand } from "./command";
import { enqueueAnalysis } from "./enqueue-analysis";
import { packGeometry } from "@/lib/models/geometry-wire";

/**
 * Stores a validated model as the project's next revision and queues its analysis, in one transaction with: the
 * records of the original file(s) (stored now, or already uploaded and linked), the audit event, the previous revision's MEP runs carried forward with
 * their clashes detected on the new model. The analysis itself runs in the jobs process.
 */
export async function createRevision(input: {
  projectId: string;
  userId: string;
  name: string;
  model: TrussModel;
  source: "generated" | "uploaded";
  /** Files received in the request body, stored now. */
  originals: ReceivedFile[];
  /** Model files already in object storage (presigned uploads), linked to the revision as they are. */
  uploadedFiles?: string[];
}): Promise<{ revision: { id: string; number: number }; job: JobView }> {
  const { projectId, userId, model } = input;
  return withStoredFiles({ projectId, userId, purpose: "model", files: input.originals }, (record) =>
    runRevisionCommand(async ({ tx, live }) => {
      const revision = await insertRevision(tx, { projectId, name: input.name, model, geometry: packGeometry(model), source: input.source, createdBy: userId });
      await record(tx, { revisionId: revision.id });
      const uploaded = input.uploadedFiles ?? [];
      if ((await linkModelFiles(tx, { projectId, attachmentIds: uploaded, revisionId: revision.id })) !== new Set(uploaded).size) {
        throw new ConflictError("An uploaded model file was used by another revision meanwhile; upload it again.");
      }
      await carryPreviousRunsForward(tx, { projectId, revision, model, actorId: userId });
      const job = await enqueueAnalysis(tx, { projectId, revisionId: revision.id, requestedBy: userId });
      await live({ projectId, kind: "revision", subjectId: revision.id, revision: revision.number });
      return { revision, job };
    }),
  );
}
