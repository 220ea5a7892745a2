import { markRevisionCurrent } from "@/lib/commands/mark-revision-current";
import { projectRoute } from "@/lib/http/route";
import { revisionParamsSchema } from "@/lib/models/schemas";

/** Marks the revision current (for review); pages open it by default (structural engineer). */
export const PUT = projectRoute({ params: revisionParamsSchema, action: "revision.markCurrent" }, async ({ params, user }) => {
  await markRevisionCurrent({ ...params, actorId: user.id });
  return Response.json({ current: params.number });
});
