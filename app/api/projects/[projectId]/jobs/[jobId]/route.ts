import { getProjectJob } from "@/db/queries/jobs";
import { NotFoundError } from "@/lib/http/errors";
import { jobParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";

/** One job of the project: state, phase, percent, the error of a failed job and the outcome of a finished one. */
export const GET = projectRoute({ params: jobParamsSchema, action: "project.read" }, async ({ params: { projectId, jobId } }) => {
  const job = await getProjectJob({ projectId, jobId });
  if (!job) throw new NotFoundError("No such job.");
  return Response.json({ job }, { headers: { "Cache-Control": "no-store" } });
});
