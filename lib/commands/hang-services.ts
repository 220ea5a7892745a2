import "server-only";
import type { JobView } from "@/db/queries/jobs";
import { carryRunsForward } from "@/db/queries/mep";
import type { DetectionSummary } from "@/db/queries/clashes";
import { insertRevision, withNextRevision } from "@/db/queries/models";
import type { TrussModel } from "@/lib/analysis/model";
import { enqueueAnalysis } from "./enqueue-analysis";

/**
 * Stores the revision with the services hung (derived from `fromRevisionId`), copies the runs onto it with its
 * clashes detected, and queues its analysis, which compares zero-force members with the revision it came from.
 */
export async function hangServicesRevision(input: {
  projectId: string;
  userId: string;
  fromRevisionId: string;
  name: string;
  model: TrussModel;
}): Promise<{ revision: { id: string; number: number }; detection: DetectionSummary; job: JobView }> {
  const { projectId, userId, fromRevisionId, model } = input;
  return withNextRevision(async (tx) => {
    const revision = await insertRevision(tx, { projectId, name: input.name, model, source: "generated", createdBy: userId });
    const detection = await carryRunsForward({ projectId, fromRevisionId, toRevision: { id: revision.id, model }, actorId: userId, db: tx });
    const job = await enqueueAnalysis(tx, { projectId, revisionId: revision.id, requestedBy: userId, compareWith: fromRevisionId });
    return { revision, detection, job };
  });
}
