import { listReportJobs } from "@/db/queries/jobs";
import { getRevisionResultIds } from "@/db/queries/models";
import { enqueueReport } from "@/lib/commands/enqueue-report";
import { ConflictError, ValidationError } from "@/lib/http/errors";
import { projectParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { REPORT_RESULTS_MAX, reportListQuerySchema, reportRequestSchema } from "@/lib/report/schemas";
import { chosenRevisionNumber, noSuchRevision } from "@/app/api/projects/[projectId]/_lib/report-data";

/**
 * Asks for the review report PDF of a revision (the current one when none is named): the jobs process makes and
 * stores it; the answer is the job to follow (GET …/jobs/<id>), whose outcome names the stored file when done.
 */
export const POST = projectRoute({ params: projectParamsSchema, body: reportRequestSchema, action: "report.make" }, async ({ params: { projectId }, body, user }) => {
  const number = await chosenRevisionNumber({ projectId, revision: body.revision });
  // Only the result ids are read here (the stored analysis of a large roof is megabytes); the job reads the rest.
  const revision = await getRevisionResultIds({ projectId, number });
  if (!revision) throw noSuchRevision(number);
  if (revision.status === null) throw new ConflictError(`Revision ${number} has not been analysed yet; make the report once its analysis is stored.`);
  if (revision.status === "unstable") throw new ConflictError(`Revision ${number} is unstable: it has no forces to report.`);
  const known = new Set([...revision.loadCases, ...revision.combinations]);
  const issues = (["combinations", "compare"] as const).flatMap((field) => {
    const unknown = (body[field] ?? []).filter((id) => !known.has(id));
    return unknown.length ? [{ path: field, message: `Not a load case or combination of revision ${number}: ${unknown.join(", ")}.` }] : [];
  });
  // Every combination (else every load case) when none is named, as long as one report can draw them all.
  const combinations = body.combinations ?? (revision.combinations.length ? revision.combinations : revision.loadCases);
  if (combinations.length > REPORT_RESULTS_MAX) {
    issues.push({ path: "combinations", message: `Revision ${number} has ${combinations.length} results to report and one report draws at most ${REPORT_RESULTS_MAX}: choose them.` });
  }
  if (issues.length) throw new ValidationError(issues, issues.map((i) => i.message).join(" "));
  const compare = body.compare ? ([body.compare[0], body.compare[1]] as [string, string]) : null;
  const job = await enqueueReport({ projectId, revisionId: revision.id, query: { revision: number, combinations, compare }, requestedBy: user.id });
  return Response.json({ job }, { status: 202 });
});

/** The newest finished reports of a revision (`?revision=`): what the report page lists, refetched when one is stored. */
export const GET = projectRoute({ params: projectParamsSchema, query: reportListQuerySchema, action: "report.export" }, async ({ params: { projectId }, query }) => {
  const reports = await listReportJobs({ projectId, revision: query.revision });
  return Response.json({ reports });
});
