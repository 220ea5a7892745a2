import { getProjectJob } from "@/db/queries/jobs";
import { retryJob } from "@/lib/commands/retry-job";
import { ForbiddenError, NotFoundError } from "@/lib/http/errors";
import { jobParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";
import { JOB_ACTIONS } from "@/lib/jobs/actions";
import { authorize } from "@/lib/permissions";

/** Puts a failed job back in the queue: who may start that kind of job (run an analysis, hang the services, make a report) may retry it. */
export const POST = projectRoute({ params: jobParamsSchema, action: "project.read" }, async ({ params: { projectId, jobId }, user, membership }) => {
  const job = await getProjectJob({ projectId, jobId });
  if (!job) throw new NotFoundError("No such job.");
  if (!JOB_ACTIONS[job.kind].every((action) => authorize(membership, action))) throw new ForbiddenError();
  return Response.json({ job: await retryJob({ projectId, jobId, userId: user.id }) }, { status: 202 });
});
