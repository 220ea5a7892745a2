import "server-only";
import type { JobView } from "@/db/queries/jobs";
import { insertRevision } from "@/db/queries/models";
import type { TrussModel } from "@/lib/analysis/model";
import type { DetectionSummary } from "@/lib/clash/detect";
import { carryRunsForward } from "./carry-runs-forward";
import { runRevisionCommand } from "./command";
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
  return runRevisionCommand(async ({ tx, live }) => {
    const revision = await insertRevision(tx, { projectId, name: input.name, model, source: "generated", createdBy: userId });
    const detection = await carryRunsForward(tx, { projectId, fromRevisionId, toRevision: { id: revision.id, model }, actorId: userId });
    const job = await enqueueAnalysis(tx, { projectId, revisionId: revision.id, requestedBy: userId, compareWith: fromRevisionId });
    await live({ projectId, kind: "revision", subjectId: revision.id, revision: revision.number });
    return { revision, detection, job };
  });
}
