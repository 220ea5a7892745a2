import { projectRoute } from "@/lib/http/route";
import { downloadUrl } from "@/lib/commands/stored-files";
import { attachmentParamsSchema } from "@/lib/storage/schemas";

/** Downloads a file: a redirect to a short-lived presigned URL of the object store. */
export const GET = projectRoute({ params: attachmentParamsSchema, action: "project.read" }, async ({ params }) =>
  Response.redirect(await downloadUrl(params), 302),
);
