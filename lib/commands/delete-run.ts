import "server-only";
import { deleteRunRow } from "@/db/queries/mep";
import type { DetectionSummary } from "@/lib/clash/detect";
import { NotFoundError } from "@/lib/http/errors";
import { runCommand } from "./command";
import { detectRevisionClashes } from "./detect-revision-clashes";
import type { RunsRevision } from "./import-runs";

/** Removes one run and re-runs clash detection (its clashes become cleared, keeping their decisions). */
export async function deleteRun({ projectId, revision, runId, actorId }: { projectId: string; revision: RunsRevision; runId: string; actorId: string }): Promise<DetectionSummary> {
  return runCommand(async ({ tx, audit, live }) => {
    if (!(await deleteRunRow({ db: tx, revisionId: revision.id, runId }))) throw new NotFoundError("No such run on this revision.");
    const detection = await detectRevisionClashes(tx, { projectId, revision });
    await audit({ projectId, actorId, action: "runs.delete", subjectType: "mep_run", subjectId: `${revision.id}/${runId}`, details: { ...detection } });
    await live({ projectId, kind: "runs", subjectId: revision.id, revision: revision.number });
    return detection;
  });
}
