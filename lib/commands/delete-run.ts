import "server-only";
import { deleteRunRow, listRuns } from "@/db/queries/mep";
import type { DetectionSummary } from "@/lib/clash/detect";
import { NotFoundError } from "@/lib/http/errors";
import { closeDecisionsOfChangedRuns } from "./close-decisions-of-changed-runs";
import { runCommand } from "./command";
import { detectRevisionClashes } from "./detect-revision-clashes";
import type { RunsRevision } from "./import-runs";

/** Removes one run and re-runs clash detection: its clashes are cleared, and their decisions closed with the reason (kept in their history). */
export async function deleteRun({ projectId, revision, runId, actorId }: { projectId: string; revision: RunsRevision; runId: string; actorId: string }): Promise<DetectionSummary> {
  return runCommand(async ({ tx, audit, live }) => {
    const runsBefore = await listRuns({ db: tx, revisionId: revision.id });
    if (!(await deleteRunRow({ db: tx, revisionId: revision.id, runId }))) throw new NotFoundError("No such run on this revision.");
    const detection = await detectRevisionClashes(tx, { projectId, revision });
    const decisionsClosed = await closeDecisionsOfChangedRuns(tx, { projectId, revision, runsBefore, actorId });
    await audit({ projectId, actorId, action: "runs.delete", subjectType: "mep_run", subjectId: `${revision.id}/${runId}`, details: { ...detection, decisionsClosed } });
    await live({ projectId, kind: "runs", subjectId: revision.id, revision: revision.number });
    return detection;
  });
}
