import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { loadAnalysedRevision, requireResults } from "@/app/api/projects/[projectId]/_lib/report-data";
import { nodeResultsCsv } from "@/lib/report/csv";
import { memberForcesQuerySchema } from "@/lib/report/schemas";

/** Node displacements and support reactions of one load case or combination (`?result=`) of a revision (`?revision=`). */
export const GET = projectRoute({ params: projectParamsSchema, query: memberForcesQuerySchema, action: "report.export" }, async ({ params, query }) => {
  const revision = await loadAnalysedRevision({ projectId: params.projectId, revision: query.revision });
  requireResults(revision.analysis.result, [query.result], "result");
  const csv = nodeResultsCsv(revision.model, revision.analysis.result, query.result);
  const filename = `node-results-rev${revision.number}-${query.result.replace(/[^A-Za-z0-9_.-]/g, "_")}.csv`;
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"` } });
});
