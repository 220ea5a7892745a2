import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { resultCsvResponse } from "@/app/api/projects/[projectId]/_lib/report-data";
import { nodeResultsCsv } from "@/lib/report/csv";
import { memberForcesQuerySchema } from "@/lib/report/schemas";

/** Node displacements and support reactions of one load case or combination (`?result=`) of a revision (`?revision=`). */
export const GET = projectRoute({ params: projectParamsSchema, query: memberForcesQuerySchema, action: "report.export" }, async ({ params, query }) =>
  resultCsvResponse({ projectId: params.projectId, query, name: "node-results" }, nodeResultsCsv),
);
