import "server-only";
import type { Transaction } from "@/db/client";
import { markClashesCleared, upsertClashes } from "@/db/queries/clashes";
import { listRuns } from "@/db/queries/mep";
import { detectClashes, type Clash, type ClashModel, type DetectionSummary } from "@/lib/clash/detect";

/**
 * A step of the commands that change runs or models (not a command itself: it runs in the caller's transaction).
 * Detects the clashes of a revision's stored runs and stores them: clashes found again keep their row, outcome and
 * decisions (matched by stable key) with fresh geometry; new ones are added; ones no longer found are marked
 * cleared, never deleted, so decisions stay on record.
 */
export async function detectRevisionClashes(
  tx: Transaction,
  { projectId, revision, detected }: { projectId: string; revision: { id: string; model: ClashModel }; detected?: Clash[] },
): Promise<DetectionSummary> {
  // `detected`: the clashes of these same runs on this model, found before the transaction by a job, so the
  // transaction stays short on a big roof.
  const found = detected ?? detectClashes(revision.model, await listRuns({ db: tx, revisionId: revision.id }));
  await upsertClashes({
    db: tx,
    rows: found.map((c) => ({
      projectId,
      revisionId: revision.id,
      clashKey: c.id,
      memberId: c.memberId,
      runId: c.runId,
      segmentIndex: c.segmentIndex,
      kind: c.kind,
      status: "active" as const,
      gap: c.gap,
      depth: c.depth,
      requiredClearance: c.requiredClearance,
      pointX: c.point.x,
      pointY: c.point.y,
      pointZ: c.point.z,
    })),
  });
  const cleared = await markClashesCleared({ db: tx, revisionId: revision.id, keepKeys: found.map((c) => c.id) });
  const hard = found.filter((c) => c.kind === "hard").length;
  return { found: found.length, hard, clearance: found.length - hard, cleared };
}
