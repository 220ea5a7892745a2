import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseParams, parseWith } from "@/lib/http/parse";
import { loadAnalysedRevision, requireResults } from "@/lib/report/collect";
import { memberForcesCsv } from "@/lib/report/csv";
import { memberForcesQuerySchema } from "@/lib/report/schemas";

type Context = RouteContext<"/api/projects/[projectId]/exports/member-forces.csv">;

/** Member forces of one load case or combination (`?result=`) of a revision (`?revision=`, newest when absent). */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "report.export");
  const query = parseWith(memberForcesQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const revision = await loadAnalysedRevision({ projectId, revision: query.revision });
  requireResults(revision.analysis.result, [query.result], "result");
  const csv = memberForcesCsv(revision.model, revision.analysis.result, query.result);
  const filename = `member-forces-rev${revision.number}-${query.result.replace(/[^A-Za-z0-9_.-]/g, "_")}.csv`;
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"` } });
});
