import "server-only";
import { withTransaction } from "@/db/client";
import { recordAuditEvent } from "@/db/queries/audit";
import { getRevisionAnalysisStatus, setCurrentRevision } from "@/db/queries/models";
import { ConflictError, NotFoundError } from "@/lib/http/errors";

/**
 * The structural engineer marks which revision the team reviews: pages open it by default. Only a revision with a
 * stable analysis can be current (an unstable one has no forces to review).
 */
export async function markRevisionCurrent({ projectId, number, actorId }: { projectId: string; number: number; actorId: string }): Promise<void> {
  await withTransaction(async (tx) => {
    const revision = await getRevisionAnalysisStatus(tx, { projectId, number });
    if (!revision) throw new NotFoundError("No such revision.");
    if (revision.status === "unstable") throw new ConflictError(`Revision ${number} is unstable; it has no forces to review, so it cannot be current.`);
    if (revision.status === null) throw new ConflictError(`Revision ${number} is not analysed yet; mark it current once its analysis is stored.`);
    const previous = await setCurrentRevision(tx, { projectId, revisionId: revision.id });
    await recordAuditEvent({ db: tx, projectId, actorId, action: "revision.markCurrent", subjectType: "model_revision", subjectId: revision.id, details: { number, previous } });
  });
}
