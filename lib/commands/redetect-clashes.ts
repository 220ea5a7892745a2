import "server-only";
import type { DetectionSummary } from "@/lib/clash/detect";
import { runCommand } from "./command";
import { detectRevisionClashes } from "./detect-revision-clashes";
import type { RunsRevision } from "./import-runs";

/** Re-runs clash detection on a revision's stored runs (after a model change or on request). */
export async function redetectClashes({ projectId, revision, actorId }: { projectId: string; revision: RunsRevision; actorId: string | null }): Promise<DetectionSummary> {
  return runCommand(async ({ tx, audit, live }) => {
    const detection = await detectRevisionClashes(tx, { projectId, revision });
    await audit({ projectId, actorId, action: "clashes.detect", subjectType: "model_revision", subjectId: revision.id, details: { ...detection } });
    await live({ projectId, kind: "runs", subjectId: revision.id, revision: revision.number });
    return detection;
  });
}
