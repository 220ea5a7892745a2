import { presentAttachment } from "@/db/queries/attachments";
import { requireProjectRole, requireUser } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/parse";
import { confirmUpload } from "@/lib/storage/attachments";
import { attachmentParamsSchema } from "@/lib/storage/schemas";

type Context = RouteContext<"/api/projects/[projectId]/attachments/[attachmentId]/confirm">;

/** Checks the uploaded bytes (size and content) and makes the attachment visible; a refused file is deleted. */
export const POST = handleRoute(async (request: Request, context: Context) => {
  const { projectId, attachmentId } = parseParams(attachmentParamsSchema, await context.params);
  const user = requireUser(await getRequestUser(request));
  await requireProjectRole(user, projectId, "project.read");
  const attachment = await confirmUpload({ projectId, attachmentId, userId: user.id });
  return Response.json({ attachment: presentAttachment(attachment, user.name) });
});
