import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { parseParams, parseWith } from "@/lib/http/parse";
import { collectReport } from "@/lib/report/collect";
import { buildReportPdf } from "@/lib/report/pdf";
import { reportQueryFrom, reportQuerySchema } from "@/lib/report/schemas";

type Context = RouteContext<"/api/projects/[projectId]/report">;

/**
 * The review report PDF: `?revision=` (newest when absent), `&combinations=a,b` (all when absent), `&compare=a,b`.
 * Lists may also come as repeated keys (`combinations=a&combinations=b`), as the report page's form sends them.
 */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId } = parseParams(projectParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "report.export");
  const query = parseWith(reportQuerySchema, reportQueryFrom(new URL(request.url).searchParams));
  const input = await collectReport({ projectId, query, generatedBy: user.name, now: new Date() });
  const pdf = await buildReportPdf(input);
  const filename = `strutroom-review-rev${input.revision.number}.pdf`;
  return new Response(new Uint8Array(pdf), {
    headers: { "content-type": "application/pdf", "content-disposition": `inline; filename="${filename}"`, "cache-control": "private, no-store" },
  });
});
