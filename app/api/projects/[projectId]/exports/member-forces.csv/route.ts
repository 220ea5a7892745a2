import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { loadAnalysedRevision, requireResults } from "@/app/api/projects/[projectId]/_lib/report-data";
import { memberForcesCsv } from "@/lib/report/csv";
import { memberForcesQuerySchema } from "@/lib/report/schemas";

/** Member forces of one load case or combination (`?result=`) of a revision (`?revision=`, newest when absent). */
export const GET = projectRoute({ params: projectParamsSchema, query: memberForcesQuerySchema, action: "report.export" }, async ({ params, query }) => {
  const revision = await loadAnalysedRevision({ projectId: params.projectId, revision: query.revision });
  requireResults(revision.analysis.result, [query.result], "result");
  const csv = memberForcesCsv(revision.model, revision.analysis.result, query.result);
  const filename = `member-forces-rev${revision.number}-${query.result.replace(/[^A-Za-z0-9_.-]/g, "_")}.csv`;
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"` } });
});
