import "server-only";
import type { Transaction } from "@/db/client";
import { copyRuns, getRevisionForMep } from "@/db/queries/mep";
import type { Clash, ClashModel, DetectionSummary } from "@/lib/clash/detect";
import type { TrussModel } from "@/lib/analysis/model";
import { carryClashDecisions } from "./carry-clash-decisions";
import { detectRevisionClashes } from "./detect-revision-clashes";

/**
 * A step of the commands that store a revision (runs in their transaction). Copies a revision's runs onto a newer
 * revision of the same project and detects clashes there, so a model change keeps the services (clash ids, and so
 * threads, carry over where the same member and segment still clash), then carries the clash decisions. `detected`:
 * the clashes already found for the same runs on `toRevision.model`.
 */
export async function carryRunsForward(
  tx: Transaction,
  { projectId, fromRevisionId, toRevision, actorId, detected }: { projectId: string; fromRevisionId: string; toRevision: { id: string; model: TrussModel & ClashModel }; actorId: string | null; detected?: Clash[] },
): Promise<DetectionSummary> {
  await copyRuns({ db: tx, fromRevisionId, toRevisionId: toRevision.id, actorId });
  const detection = await detectRevisionClashes(tx, { projectId, revision: toRevision, detected });
  await carryClashDecisions(tx, { projectId, fromRevisionId, toRevision, actorId });
  return detection;
}

/**
 * Carries the runs of the revision just before a newly stored one (number − 1, the latest previous revision) onto
 * it and detects its clashes; a first revision has nothing to carry.
 */
export async function carryPreviousRunsForward(tx: Transaction, { projectId, revision, model, actorId }: { projectId: string; revision: { id: string; number: number }; model: TrussModel; actorId: string | null }): Promise<DetectionSummary | null> {
  const previous = await getRevisionForMep({ projectId, number: revision.number - 1, db: tx });
  if (!previous) return null;
  return carryRunsForward(tx, { projectId, fromRevisionId: previous.id, toRevision: { id: revision.id, model }, actorId });
}
