// The demo roof (lib/analysis/demo-roof.ts: the Northfield sports hall) as revision 1 of the demo project, with its
// analysis and member review stored and marked current, so the viewer opens on real results. Idempotent: skipped once revision 1 exists.
import { and, eq } from "drizzle-orm";
import type { Executor } from "../../db/client";
import { modelRevisions, projects } from "../../db/schema";
import { demoRoof } from "../../lib/analysis/demo-roof";
import { analyseForStorage } from "../../lib/models/analyse";
import { encodeResultColumns } from "../../lib/models/result-columns";
import { insertRevisionWithAnalysis, setCurrentRevision } from "../../db/queries/models";

/** Stores the demo roof as revision 1 (with results) unless the project already has it. */
export async function seedDemoModel(db: Executor, { projectId, createdBy }: { projectId: string; createdBy: string }): Promise<void> {
  const [existing] = await db
    .select({ id: modelRevisions.id })
    .from(modelRevisions)
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, 1)))
    .limit(1);
  if (existing) return;
  const [project] = await db.select({ designStandard: projects.designStandard }).from(projects).where(eq(projects.id, projectId));
  const model = demoRoof();
  const { result, review } = analyseForStorage(model, project.designStandard);
  if (result.status !== "ok") throw new Error("the demo roof analysed as unstable");
  const revision = await insertRevisionWithAnalysis(db, { projectId, name: model.name, model, source: "generated", createdBy, result, review, columns: encodeResultColumns(model, result, review) });
  // The structural engineer has put it up for review: pages open it by default.
  await setCurrentRevision(db, { projectId, revisionId: revision.id });
}
