import "server-only";
import type { Transaction } from "@/db/client";
import { deleteRunsOfRevision, listRuns, upsertRuns } from "@/db/queries/mep";
import type { TrussModel } from "@/lib/analysis/model";
import type { DetectionSummary } from "@/lib/clash/detect";
import type { Run } from "@/lib/mep/schemas";
import { closeDecisionsOfChangedRuns } from "./close-decisions-of-changed-runs";
import { runCommand } from "./command";
import { detectRevisionClashes } from "./detect-revision-clashes";

export type RunsRevision = { id: string; number: number; model: TrussModel };

/**
 * Stores imported runs on a revision — "replace" drops the revision's other runs, "upsert" keeps them and
 * overwrites runs with the same id — re-runs clash detection and closes the decisions on runs it moved, resized or
 * dropped; `alsoWrite` adds rows in the same transaction (the record of the imported file).
 */
export async function importRuns({
  projectId,
  revision,
  runs,
  mode,
  actorId,
  alsoWrite,
}: {
  projectId: string;
  revision: RunsRevision;
  runs: Run[];
  mode: "replace" | "upsert";
  actorId: string | null;
  alsoWrite?: (tx: Transaction) => Promise<unknown>;
}): Promise<DetectionSummary> {
  return runCommand(async ({ tx, audit, live }) => {
    await alsoWrite?.(tx);
    const runsBefore = await listRuns({ db: tx, revisionId: revision.id });
    if (mode === "replace") await deleteRunsOfRevision({ db: tx, revisionId: revision.id });
    await upsertRuns({ db: tx, revisionId: revision.id, runs, actorId });
    const summary = await detectRevisionClashes(tx, { projectId, revision });
    const decisionsClosed = await closeDecisionsOfChangedRuns(tx, { projectId, revision, runsBefore, actorId });
    await audit({ projectId, actorId, action: "runs.import", subjectType: "model_revision", subjectId: revision.id, details: { mode, runs: runs.map((r) => r.id), ...summary, decisionsClosed } });
    await live({ projectId, kind: "runs", subjectId: revision.id, revision: revision.number });
    return summary;
  });
}
