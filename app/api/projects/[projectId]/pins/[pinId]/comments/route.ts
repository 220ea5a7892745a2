import { z } from "zod";
import { listCommentsByPin } from "@/db/queries/comments";
import { getPinById } from "@/db/queries/pins";
import { NotFoundError } from "@/lib/http/errors";
import { projectRoute } from "@/lib/http/route";

const paramsSchema = z.object({ projectId: z.uuid(), pinId: z.uuid() });

/** The thread of one pin, oldest first. */
export const GET = projectRoute({ params: paramsSchema, action: "project.read" }, async ({ params }) => {
  const pin = await getPinById(params);
  if (!pin) throw new NotFoundError("No such pin in this project.");
  return Response.json({ pin, comments: await listCommentsByPin(params) });
});
