import { ConflictError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { loadAnalysedRevision } from "@/app/api/projects/[projectId]/_lib/report-data";
import { envelopeCsv } from "@/lib/report/csv";
import { envelopeQuerySchema } from "@/lib/report/schemas";

/** The envelope of a revision (`?revision=`, newest when absent): extremes over the combinations per member. */
export const GET = projectRoute({ params: projectParamsSchema, query: envelopeQuerySchema, action: "report.export" }, async ({ params, query }) => {
  const revision = await loadAnalysedRevision({ projectId: params.projectId, revision: query.revision });
  if (revision.analysis.result.status !== "ok") throw new ConflictError("The model is unstable, so it has no envelope.");
  const csv = envelopeCsv(revision.model, revision.analysis.result);
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="envelope-rev${revision.number}.csv"` } });
});
