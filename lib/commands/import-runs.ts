import "server-only";
import type { Transaction } from "@/db/client";
import { deleteRunsOfRevision, upsertRuns } from "@/db/queries/mep";
import type { TrussModel } from "@/lib/analysis/model";
import type { DetectionSummary } from "@/lib/clash/detect";
import type { Run } from "@/lib/mep/schemas";
import { runCommand } from "./command";
import { detectRevisionClashes } from "./detect-revision-clashes";

export type RunsRevision = { id: string; number: number; model: TrussModel };

/**
 * Stores imported runs on a revision — "replace" drops the revision's other runs, "upsert" keeps them and
 * overwrites runs with the same id — and re-runs clash detection; `alsoWrite` adds rows in the same transaction
 * (the record of the imported file).
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
    if (mode === "replace") await deleteRunsOfRevision({ db: tx, revisionId: revision.id });
    await upsertRuns({ db: tx, revisionId: revision.id, runs, actorId });
    const summary = await detectRevisionClashes(tx, { projectId, revision });
    await audit({ projectId, actorId, action: "runs.import", subjectType: "model_revision", subjectId: revision.id, details: { mode, runs: runs.map((r) => r.id), ...summary } });
    await live({ projectId, kind: "runs", subjectId: revision.id, revision: revision.number });
    return summary;
  });
}
