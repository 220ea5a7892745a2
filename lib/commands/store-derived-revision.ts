import "server-only";
import type { Transaction } from "@/db/client";
import type { JobView } from "@/db/queries/jobs";
import { insertRevision } from "@/db/queries/models";
import type { TrussModel } from "@/lib/analysis/model";
import type { Clash, DetectionSummary } from "@/lib/clash/detect";
import { carryRunsForward } from "./carry-runs-forward";
import { enqueueAnalysis } from "./enqueue-analysis";
import { packGeometry } from "@/lib/models/geometry-wire";

/**
 * A step of the commands that store a revision derived from another (runs in their transaction; the hang-services
 * job's is the product's): inserts the revision, copies the runs of `fromRevisionId` onto it with its clashes and
 * their decisions, and queues its analysis, which compares zero-force members with the revision it came from.
 * `detected`: the clashes of those runs on `model`, when already found.
 */
export async function storeDerivedRevision(
  tx: Transaction,
  input: { projectId: string; createdBy: string | null; fromRevisionId: string; name: string; model: TrussModel; detected?: Clash[] },
): Promise<{ revision: { id: string; number: number }; detection: DetectionSummary; analysisJob: JobView }> {
  const { projectId, createdBy, fromRevisionId, model } = input;
  const revision = await insertRevision(tx, { projectId, name: input.name, model, geometry: packGeometry(model), source: "generated", createdBy });
  const detection = await carryRunsForward(tx, { projectId, fromRevisionId, toRevision: { id: revision.id, model }, actorId: createdBy, detected: input.detected });
  const analysisJob = await enqueueAnalysis(tx, { projectId, revisionId: revision.id, requestedBy: createdBy, compareWith: fromRevisionId });
  return { revision, detection, analysisJob };
}
