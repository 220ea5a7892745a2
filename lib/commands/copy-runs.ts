import "server-only";
import { revisionHasRuns } from "@/db/queries/mep";
import type { DetectionSummary } from "@/lib/clash/detect";
import { ConflictError } from "@/lib/http/errors";
import { carryRunsForward } from "./carry-runs-forward";
import { runCommand } from "./command";
import type { RunsRevision } from "./import-runs";

/** Brings another revision's runs onto a revision that has none (after a model change) and detects its clashes. */
export async function copyRunsToRevision({ projectId, fromRevisionId, toRevision, actorId }: { projectId: string; fromRevisionId: string; toRevision: RunsRevision; actorId: string }): Promise<DetectionSummary> {
  return runCommand(async ({ tx, audit, live }) => {
    if (await revisionHasRuns({ db: tx, revisionId: toRevision.id })) throw new ConflictError("This revision already has runs; import or edit them instead.");
    const detection = await carryRunsForward(tx, { projectId, fromRevisionId, toRevision, actorId });
    await audit({ projectId, actorId, action: "runs.copy", subjectType: "model_revision", subjectId: toRevision.id, details: { fromRevisionId, ...detection } });
    await live({ projectId, kind: "runs", subjectId: toRevision.id, revision: toRevision.number });
    return detection;
  });
}
