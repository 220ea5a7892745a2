import "server-only";
// Route-side reading (a private folder of the project API): it reads stored rows and objects, so it is not lib/.
// Model files the browser uploaded through presigned URLs (confirmed attachments of purpose "model"): read back
// for validation, and later linked to the revision as its originals, byte for byte as uploaded.
import { getAttachment } from "@/db/queries/attachments";
import { ConflictError, NotFoundError } from "@/lib/http/errors";
import type { UploadedModelFile } from "@/lib/models/uploaded-files";
import { getObject } from "@/lib/storage/s3";

/** The text of each confirmed, unused model file the user uploaded to the project, in the order given. */
export async function readModelFiles({ projectId, userId, attachmentIds }: { projectId: string; userId: string; attachmentIds: string[] }): Promise<UploadedModelFile[]> {
  const files: UploadedModelFile[] = [];
  for (const attachmentId of new Set(attachmentIds)) {
    const attachment = await getAttachment({ projectId, attachmentId });
    // Someone else's upload, a file of another purpose or one not yet confirmed: as if it did not exist.
    if (!attachment || attachment.purpose !== "model" || attachment.state !== "ready" || attachment.uploadedBy !== userId) {
      throw new NotFoundError("No such uploaded model file.");
    }
    if (attachment.revisionId) throw new ConflictError(`${attachment.filename} is already the original of another revision; upload it again.`);
    const bytes = await getObject(attachment.objectKey);
    if (!bytes) throw new NotFoundError("No such uploaded model file.");
    // Confirming checked the bytes are UTF-8 JSON or CSV within the size limit.
    files.push({ filename: attachment.filename, contentType: attachment.contentType, text: new TextDecoder().decode(bytes) });
  }
  return files;
}
