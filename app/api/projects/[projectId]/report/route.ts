import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { collectReport } from "@/app/api/projects/[projectId]/_lib/report-data";
import { buildReportPdf } from "@/lib/report/pdf";
import { reportQueryFrom, reportQuerySchema } from "@/lib/report/schemas";

/**
 * The review report PDF: `?revision=` (newest when absent), `&combinations=a,b` (all when absent), `&compare=a,b`.
 * Lists may also come as repeated keys (`combinations=a&combinations=b`), as the report page's form sends them.
 */
export const GET = projectRoute(
  { params: projectParamsSchema, query: reportQuerySchema, readQuery: reportQueryFrom, action: "report.export" },
  async ({ params, query, user }) => {
    const input = await collectReport({ projectId: params.projectId, query, generatedBy: user.name, now: new Date() });
    const pdf = await buildReportPdf(input);
    const filename = `strutroom-review-rev${input.revision.number}.pdf`;
    return new Response(new Uint8Array(pdf), {
      headers: { "content-type": "application/pdf", "content-disposition": `inline; filename="${filename}"`, "cache-control": "private, no-store" },
    });
  },
);
