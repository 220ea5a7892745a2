import "server-only";
// The life of a stored file. Browser uploads go straight to object storage through a presigned URL (to a staging
// key) and are recorded as pending; confirming reads the stored bytes back, checks them, writes those bytes to the
// final key and only then marks the record ready (or deletes both object and record). Server-side uploads check the bytes first, store them, and write the record
// last. Pending records nobody confirmed are swept by the jobs process. So no ready record ever points at missing
// or unchecked bytes, and a failed upload leaves nothing behind.
import { requireSameProject } from "./require-same-project";
import { randomUUID } from "node:crypto";
import {
  deleteAttachmentRecord,
  getAttachment,
  insertAttachment,
  listRevisionFiles,
  listStalePendingAttachments,
  markAttachmentReady,
} from "@/db/queries/attachments";
import { withTransaction, type Executor } from "@/db/client";
import type { Attachment } from "@/db/schema";
import { HttpError, NotFoundError, ValidationError } from "@/lib/http/errors";
import { checkContent, checkSize, HEAD_BYTES, needsWholeFile, type ContentVerdict, type FilePurpose } from "@/lib/storage/content-check";
import { deleteObject, getObject, objectSize, PRESIGN_SECONDS, presignDownload, presignUpload, putObject } from "@/lib/storage/s3";

/** An upload that is refused; 413 when too large, 400 otherwise, with the reason beside the "file" field. */
export class FileRefusedError extends HttpError {
  constructor(verdict: Extract<ContentVerdict, { ok: false }>) {
    super(verdict.reason === "too_large" ? 413 : 400, verdict.message, [{ path: "file", message: verdict.message }]);
    this.name = "FileRefusedError";
  }
}

/** How long an unconfirmed upload may stay pending before the sweep removes it. */
export const PENDING_UPLOAD_MAX_AGE_MS = 60 * 60_000;

type Links = { commentId?: string | null; revisionId?: string | null; runId?: string | null };

function objectKey(projectId: string, purpose: FilePurpose, id: string): string {
  return `projects/${projectId}/${purpose}/${id}`;
}

/**
 * Where a browser uploads through its presigned URL. The URL stays valid for a while after confirming, so the
 * checked bytes are written elsewhere (objectKey), to a key no URL is ever signed for.
 */
function stagingKey(projectId: string, purpose: FilePurpose, id: string): string {
  return `staging/${objectKey(projectId, purpose, id)}`;
}

/** Records a pending upload and hands out a presigned PUT URL; a declared size over the limit is refused at once. */
export async function requestUpload(input: {
  projectId: string;
  userId: string;
  purpose: FilePurpose;
  filename: string;
  contentType: string;
  sizeBytes: number;
  links: Links;
}): Promise<{ attachmentId: string; uploadUrl: string; method: "PUT"; headers: Record<string, string>; expiresInSeconds: number }> {
  const refusal = checkSize(input.purpose, input.sizeBytes);
  if (refusal && !refusal.ok) throw new FileRefusedError(refusal);
  await requireSameProject(input.projectId, input.links);
  const id = randomUUID();
  const key = stagingKey(input.projectId, input.purpose, id);
  await insertAttachment({
    values: {
      id,
      projectId: input.projectId,
      purpose: input.purpose,
      objectKey: key,
      filename: input.filename,
      contentType: input.contentType,
      sizeBytes: input.sizeBytes,
      uploadedBy: input.userId,
      ...input.links,
      state: "pending",
    },
  });
  const uploadUrl = await presignUpload(key, input.contentType);
  return { attachmentId: id, uploadUrl, method: "PUT", headers: { "content-type": input.contentType }, expiresInSeconds: PRESIGN_SECONDS };
}

async function removeEverywhere(attachment: Attachment): Promise<void> {
  await deleteObject(attachment.objectKey);
  await deleteAttachmentRecord({ id: attachment.id });
}

/**
 * Checks what was uploaded for a pending attachment (stored size, then the bytes), copies exactly the bytes it
 * checked from the staging key to the final key, and marks it ready. The bytes are read once and those bytes are
 * both checked and stored, so a write through the upload URL meanwhile changes nothing. A refused file is deleted
 * from storage and its record removed. Only the uploader may confirm; confirming twice is harmless.
 */
export async function confirmUpload({ projectId, attachmentId, userId }: { projectId: string; attachmentId: string; userId: string }): Promise<Attachment> {
  const attachment = await getAttachment({ projectId, attachmentId });
  if (!attachment || attachment.uploadedBy !== userId) throw new NotFoundError("No such upload.");
  if (attachment.state === "ready") return attachment;
  const declared = await objectSize(attachment.objectKey);
  if (declared === null) {
    throw new ValidationError([{ path: "file", message: "Nothing has been uploaded for this file yet." }], "Nothing has been uploaded for this file yet.");
  }
  // The stored size first, so an oversized file is refused without reading it; then the size of what was read.
  const bytes = checkSize(attachment.purpose, declared)?.ok === false ? null : await getObject(attachment.objectKey);
  const size = bytes?.byteLength ?? declared;
  const sizeRefusal = checkSize(attachment.purpose, size);
  if (sizeRefusal && !sizeRefusal.ok) {
    await removeEverywhere(attachment);
    throw new FileRefusedError(sizeRefusal);
  }
  const checked = bytes ?? new Uint8Array();
  const verdict = await checkContent(attachment.purpose, needsWholeFile(attachment.purpose) ? checked : checked.subarray(0, HEAD_BYTES), size);
  if (!verdict.ok) {
    await removeEverywhere(attachment);
    throw new FileRefusedError(verdict);
  }
  const finalKey = objectKey(projectId, attachment.purpose, attachment.id);
  await putObject(finalKey, checked, verdict.contentType);
  await deleteObject(attachment.objectKey);
  return markAttachmentReady({ id: attachment.id, contentType: verdict.contentType, sizeBytes: size, objectKey: finalKey });
}

/** A file the server received itself, before it is stored. */
export type ReceivedFile = { filename: string; bytes: Uint8Array };

/** Records the stored files with the given links inside the caller's transaction. */
export type RecordStoredFiles = (tx: Executor, links: Links) => Promise<Attachment[]>;

/**
 * Stores files the server received itself (a model's original file or tables, a run file) together with what they
 * belong to: every file's bytes are checked first (nothing stored when one is refused), then the objects are
 * stored, then `write` writes its rows and calls `record` inside its one transaction so the attachment rows commit
 * with them. When anything after storing fails, the stored objects are removed again: nothing is left dangling.
 */
export async function withStoredFiles<T>(
  input: { projectId: string; userId: string; purpose: FilePurpose; files: ReceivedFile[] },
  write: (record: RecordStoredFiles) => Promise<T>,
): Promise<T> {
  const checked: (ReceivedFile & { id: string; key: string; contentType: string })[] = [];
  for (const file of input.files) {
    const verdict = await checkContent(input.purpose, file.bytes, file.bytes.byteLength);
    if (!verdict.ok) throw new FileRefusedError(verdict);
    const id = randomUUID();
    checked.push({ ...file, id, key: objectKey(input.projectId, input.purpose, id), contentType: verdict.contentType });
  }
  const stored: string[] = [];
  const removeStored = () => Promise.all(stored.map((key) => deleteObject(key)));
  // One insert after another: a transaction is one connection.
  const record: RecordStoredFiles = async (tx, links) => {
    const rows: Attachment[] = [];
    for (const file of checked) {
      const values = {
        id: file.id,
        projectId: input.projectId,
        purpose: input.purpose,
        objectKey: file.key,
        filename: file.filename,
        contentType: file.contentType,
        sizeBytes: file.bytes.byteLength,
        uploadedBy: input.userId,
        ...links,
        state: "ready" as const,
      };
      rows.push(await insertAttachment({ db: tx, values }));
    }
    return rows;
  };
  try {
    for (const file of checked) {
      await putObject(file.key, file.bytes, file.contentType);
      stored.push(file.key);
    }
    return await write(record);
  } catch (error) {
    await removeStored();
    throw error;
  }
}

/** Stores one file the server received itself with its record (see withStoredFiles). */
export async function storeFile(input: { projectId: string; userId: string; purpose: FilePurpose; filename: string; bytes: Uint8Array; links: Links }): Promise<Attachment> {
  const { projectId, userId, purpose, filename, bytes, links } = input;
  return withStoredFiles({ projectId, userId, purpose, files: [{ filename, bytes }] }, async (record) => {
    const [attachment] = await withTransaction((tx) => record(tx, links));
    return attachment;
  });
}

/** A short-lived download URL for a ready attachment of the project; images and PDF open in the browser. */
export async function downloadUrl({ projectId, attachmentId }: { projectId: string; attachmentId: string }): Promise<string> {
  const attachment = await getAttachment({ projectId, attachmentId });
  if (!attachment || attachment.state !== "ready") throw new NotFoundError("No such file.");
  const inline = attachment.purpose === "comment" || attachment.purpose === "snapshot";
  return presignDownload(attachment.objectKey, attachment.filename, attachment.contentType, inline);
}

/** Removes uploads that were never confirmed (abandoned, or failed halfway) along with any bytes they left. */
export async function sweepStaleUploads({ now }: { now: Date }): Promise<number> {
  const stale = await listStalePendingAttachments({ before: new Date(now.getTime() - PENDING_UPLOAD_MAX_AGE_MS) });
  for (const attachment of stale) await removeEverywhere(attachment);
  return stale.length;
}

/** The bytes of a ready snapshot of the project, or undefined when there is none or its object is gone. */
export async function readSnapshot({ projectId, attachmentId }: { projectId: string; attachmentId: string }): Promise<Uint8Array | undefined> {
  const attachment = await getAttachment({ projectId, attachmentId });
  if (!attachment || attachment.state !== "ready" || attachment.purpose !== "snapshot") return undefined;
  return (await getObject(attachment.objectKey)) ?? undefined;
}

/** Removes a stored file and its record (a snapshot replaced by a newer one); nothing when it is already gone. */
export async function removeStoredFile({ projectId, attachmentId }: { projectId: string; attachmentId: string }): Promise<void> {
  const attachment = await getAttachment({ projectId, attachmentId });
  if (attachment) await removeEverywhere(attachment);
}

/** The bytes of a revision's uploaded model file(s), by name; a file whose object is gone is left out. */
export async function readModelOriginals({ projectId, revisionId }: { projectId: string; revisionId: string }): Promise<ReceivedFile[]> {
  const files = await listRevisionFiles({ projectId, revisionId, purpose: "model" });
  const read = await Promise.all(files.map(async (file) => ({ filename: file.filename, bytes: await getObject(file.objectKey) })));
  return read.filter((file): file is ReceivedFile => file.bytes !== null);
}
