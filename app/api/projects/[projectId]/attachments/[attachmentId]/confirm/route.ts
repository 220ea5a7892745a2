import { presentAttachment } from "@/db/queries/attachments";
import { projectRoute } from "@/lib/http/route";
import { confirmUpload } from "@/lib/commands/stored-files";
import { attachmentParamsSchema } from "@/lib/storage/schemas";

/** Checks the uploaded bytes (size and content) and makes the attachment visible; a refused file is deleted. */
export const POST = projectRoute({ params: attachmentParamsSchema, action: "project.read" }, async ({ params, user }) => {
  const attachment = await confirmUpload({ ...params, userId: user.id });
  return Response.json({ attachment: presentAttachment(attachment, user.name) });
});
