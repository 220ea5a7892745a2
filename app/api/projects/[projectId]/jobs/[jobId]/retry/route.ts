import { retryAnalysis } from "@/lib/commands/retry-analysis";
import { jobParamsSchema } from "@/lib/http/params";
import { projectRoute } from "@/lib/http/route";

/** Puts a failed analysis back in the queue (who may run an analysis may retry one). */
export const POST = projectRoute({ params: jobParamsSchema, action: "analysis.run" }, async ({ params: { projectId, jobId }, user }) =>
  Response.json({ job: await retryAnalysis({ projectId, jobId, userId: user.id }) }, { status: 202 }),
);
