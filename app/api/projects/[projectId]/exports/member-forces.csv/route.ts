import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { resultCsvResponse } from "@/app/api/projects/[projectId]/_lib/report-data";
import { memberForcesCsv } from "@/lib/report/csv";
import { memberForcesQuerySchema } from "@/lib/report/schemas";

/** Member forces of one load case or combination (`?result=`) of a revision (`?revision=`, the current one when absent). */
export const GET = projectRoute({ params: projectParamsSchema, query: memberForcesQuerySchema, action: "report.export" }, async ({ params, query }) =>
  resultCsvResponse({ projectId: params.projectId, query, name: "member-forces" }, memberForcesCsv),
);
