import { requireProjectRole } from "@/lib/auth/guard";
import { getRequestUser } from "@/lib/auth/session";
import { handleRoute } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/parse";
import { downloadUrl } from "@/lib/storage/attachments";
import { attachmentParamsSchema } from "@/lib/storage/schemas";

type Context = RouteContext<"/api/projects/[projectId]/attachments/[attachmentId]">;

/** Downloads a file: a redirect to a short-lived presigned URL of the object store. */
export const GET = handleRoute(async (request: Request, context: Context) => {
  const { projectId, attachmentId } = parseParams(attachmentParamsSchema, await context.params);
  await requireProjectRole(await getRequestUser(request), projectId, "project.read");
  return Response.redirect(await downloadUrl({ projectId, attachmentId }), 302);
});
