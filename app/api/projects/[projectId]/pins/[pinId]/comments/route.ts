import { z } from "zod";
import { listCommentsByPin } from "@/db/queries/comments";
import { getPinById } from "@/db/queries/pins";
import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute, NotFoundError } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/parse";

type Context = RouteContext<"/api/projects/[projectId]/pins/[pinId]/comments">;

const paramsSchema = z.object({ projectId: z.uuid(), pinId: z.uuid() });

/** The thread of one pin, oldest first. */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId, pinId } = parseParams(paramsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  const pin = await getPinById({ projectId, pinId });
  if (!pin) throw new NotFoundError("No such pin in this project.");
  return Response.json({ pin, comments: await listCommentsByPin({ projectId, pinId }) });
});
