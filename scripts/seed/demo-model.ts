// The demo roof (lib/analysis/demo-roof.ts: the Northfield sports hall) as revision 1 of the demo project, with its
// analysis and member review stored and marked current, so the viewer opens on real results. Idempotent: skipped once revision 1 exists.
import { and, eq } from "drizzle-orm";
import type { Executor } from "../../db/client";
import { modelRevisions, projects } from "../../db/schema";
import { demoRoof } from "../../lib/analysis/demo-roof";
import type { AnalysisResult } from "../../lib/analysis/analyze";
import type { TrussModel } from "../../lib/analysis/model";
import { analyseForStorage, type StoredReview } from "../../lib/models/analyse";
import type { DesignStandard } from "../../lib/review/design-checks/types";
import { encodeResultColumns } from "../../lib/models/result-columns";
import { insertRevisionWithAnalysis, setCurrentRevision } from "../../db/queries/models";
import { packGeometry } from "../../lib/models/geometry-wire";

/** The demo roof with its analysis and review for one design standard. */
export type AnalysedDemoRoof = { standard: DesignStandard; model: TrussModel; result: AnalysisResult; review: StoredReview | null };

/**
 * Analyses and reviews the demo roof. The seed calls it before its transaction opens: the whole review (overall
 * stability, idle for any roof load) takes seconds, longer on a busy machine, and a transaction left waiting that long
 * is ended by the database's idle-in-transaction timeout (lib/limits.ts).
 */
export function analyseDemoRoof(standard: DesignStandard): AnalysedDemoRoof {
  const model = demoRoof();
  const { result, review } = analyseForStorage(model, standard);
  if (result.status !== "ok") throw new Error("the demo roof analysed as unstable");
  return { standard, model, result, review };
}

/** Stores the demo roof as revision 1 (with results) unless the project already has it. */
export async function seedDemoModel(db: Executor, { projectId, createdBy, analysed }: { projectId: string; createdBy: string; analysed: AnalysedDemoRoof }): Promise<void> {
  const [existing] = await db
    .select({ id: modelRevisions.id })
    .from(modelRevisions)
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, 1)))
    .limit(1);
  if (existing) return;
  const [project] = await db.select({ designStandard: projects.designStandard }).from(projects).where(eq(projects.id, projectId));
  // Only an existing demo project whose owner changed its standard needs the review again, here.
  const { model, result, review } = project.designStandard === analysed.standard ? analysed : analyseDemoRoof(project.designStandard);
  const revision = await insertRevisionWithAnalysis(db, { projectId, name: model.name, model, geometry: packGeometry(model), source: "generated", createdBy, result, review, columns: encodeResultColumns(model, result, review) });
  // The structural engineer has put it up for review: pages open it by default.
  await setCurrentRevision(db, { projectId, revisionId: revision.id });
}
