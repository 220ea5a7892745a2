import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { ConflictError, handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseParams, parseWith } from "@/lib/http/parse";
import { loadAnalysedRevision } from "@/lib/report/collect";
import { envelopeCsv } from "@/lib/report/csv";
import { envelopeQuerySchema } from "@/lib/report/schemas";

type Context = RouteContext<"/api/projects/[projectId]/exports/envelope.csv">;

/** The envelope of a revision (`?revision=`, newest when absent): extremes over the combinations per member. */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "report.export");
  const query = parseWith(envelopeQuerySchema, Object.fromEntries(new URL(request.url).searchParams));
  const revision = await loadAnalysedRevision({ projectId, revision: query.revision });
  if (revision.analysis.result.status !== "ok") throw new ConflictError("The model is unstable, so it has no envelope.");
  const csv = envelopeCsv(revision.model, revision.analysis.result);
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="envelope-rev${revision.number}.csv"` } });
});
