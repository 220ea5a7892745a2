import { enqueueAnyLoad } from "@/lib/commands/enqueue-any-load";
import { projectRoute } from "@/lib/http/route";
import { revisionParamsSchema } from "@/lib/models/schemas";

/** Starts "idle for any roof load" for the whole roof as a job (structural engineer); answers the job to follow. */
export const POST = projectRoute({ params: revisionParamsSchema, action: "analysis.run" }, async ({ params, user }) => {
  const job = await enqueueAnyLoad({ ...params, actorId: user.id });
  return Response.json({ job }, { status: 202 });
});
