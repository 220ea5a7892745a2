import "server-only";
import { getRevisionAnalysisStatus, setCurrentRevision } from "@/db/queries/models";
import { ConflictError, NotFoundError } from "@/lib/http/errors";
import { runCommand } from "./command";

/**
 * The structural engineer marks which revision the team reviews: pages open it by default. Only a revision with a
 * stable analysis can be current (an unstable one has no forces to review). Open revision lists refresh live.
 */
export async function markRevisionCurrent({ projectId, number, actorId }: { projectId: string; number: number; actorId: string }): Promise<void> {
  await runCommand(async ({ tx, audit, live }) => {
    const revision = await getRevisionAnalysisStatus(tx, { projectId, number });
    if (!revision) throw new NotFoundError("No such revision.");
    if (revision.status === "unstable") throw new ConflictError(`Revision ${number} is unstable; it has no forces to review, so it cannot be current.`);
    if (revision.status === null) throw new ConflictError(`Revision ${number} is not analysed yet; mark it current once its analysis is stored.`);
    const previous = await setCurrentRevision(tx, { projectId, revisionId: revision.id });
    await audit({ projectId, actorId, action: "revision.markCurrent", subjectType: "model_revision", subjectId: revision.id, details: { number, previous } });
    await live({ projectId, kind: "revision", subjectId: revision.id, revision: number });
  });
}
