import "server-only";
import { listRuns, lockRun, updateRunRow } from "@/db/queries/mep";
import type { DetectionSummary } from "@/lib/clash/detect";
import { NotFoundError, ValidationError, issuesFrom } from "@/lib/http/errors";
import { runSchema, type Run, type RunEdit } from "@/lib/mep/schemas";
import { closeDecisionsOfChangedRuns } from "./close-decisions-of-changed-runs";
import { runCommand } from "./command";
import { detectRevisionClashes } from "./detect-revision-clashes";
import type { RunsRevision } from "./import-runs";

/** Applies an edit to one run (validated as a whole run again), re-runs clash detection and closes the decisions a move or resize undoes. */
export async function editRun({ projectId, revision, runId, edit, actorId }: { projectId: string; revision: RunsRevision; runId: string; edit: RunEdit; actorId: string }): Promise<{ run: Run; detection: DetectionSummary }> {
  return runCommand(async ({ tx, audit, live }) => {
    const current = await lockRun({ db: tx, revisionId: revision.id, runId });
    if (!current) throw new NotFoundError("No such run on this revision.");
    const merged = runSchema.safeParse({ ...current, ...edit });
    if (!merged.success) throw new ValidationError(issuesFrom(merged.error));
    const run = merged.data;
    const runsBefore = await listRuns({ db: tx, revisionId: revision.id });
    await updateRunRow({ db: tx, revisionId: revision.id, run });
    const detection = await detectRevisionClashes(tx, { projectId, revision });
    const decisionsClosed = await closeDecisionsOfChangedRuns(tx, { projectId, revision, runsBefore, actorId });
    await audit({ projectId, actorId, action: "runs.edit", subjectType: "mep_run", subjectId: `${revision.id}/${runId}`, details: { fields: Object.keys(edit), ...detection, decisionsClosed } });
    await live({ projectId, kind: "runs", subjectId: revision.id, revision: revision.number });
    return { run, detection };
  });
}
