import "server-only";
import { and, asc, eq, inArray, isNull, lt } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { attachments, comments, pins, users, type Attachment, type NewAttachment } from "../schema";

export type PresentedAttachment = {
  id: string;
  purpose: Attachment["purpose"];
  filename: string;
  contentType: string;
  sizeBytes: number;
  uploadedBy: { id: string; name: string };
  commentId: string | null;
  createdAt: string;
};

/** Records a file (pending until its bytes are verified, or ready when the server stored and checked them). */
export async function insertAttachment({ db = getDb(), values }: { db?: Executor; values: NewAttachment }): Promise<Attachment> {
  const [row] = await db.insert(attachments).values(values).returning();
  return row;
}

/** One attachment of the project in any state, or null. */
export async function getAttachment({ projectId, attachmentId, db = getDb() }: { projectId: string; attachmentId: string; db?: Executor }): Promise<Attachment | null> {
  const [row] = await db.select().from(attachments).where(and(eq(attachments.projectId, projectId), eq(attachments.id, attachmentId)));
  return row ?? null;
}

/** Marks a pending attachment ready with the type detected from its bytes, its size and its final object key. */
export async function markAttachmentReady({ id, contentType, sizeBytes, objectKey }: { id: string; contentType: string; sizeBytes: number; objectKey: string }): Promise<Attachment> {
  const [row] = await getDb().update(attachments).set({ state: "ready", contentType, sizeBytes, objectKey }).where(eq(attachments.id, id)).returning();
  return row;
}

/** Removes the record of an attachment (its object is removed by the caller). */
export async function deleteAttachmentRecord({ id, db = getDb() }: { id: string; db?: Executor }): Promise<void> {
  await db.delete(attachments).where(eq(attachments.id, id));
}

/** The ready attachments of a comment, oldest first, with the uploader's name. */
export async function listAttachmentsByComment({ projectId, commentId }: { projectId: string; commentId: string }): Promise<PresentedAttachment[]> {
  const rows = await getDb()
    .select({ attachment: attachments, uploaderName: users.name })
    .from(attachments)
    .innerJoin(users, eq(users.id, attachments.uploadedBy))
    .where(and(eq(attachments.projectId, projectId), eq(attachments.commentId, commentId), eq(attachments.state, "ready")))
    .orderBy(asc(attachments.createdAt));
  return rows.map(({ attachment, uploaderName }) => presentAttachment(attachment, uploaderName));
}

/** The attachment as sent to browsers (no object key). */
export function presentAttachment(attachment: Attachment, uploaderName: string): PresentedAttachment {
  return {
    id: attachment.id,
    purpose: attachment.purpose,
    filename: attachment.filename,
    contentType: attachment.contentType,
    sizeBytes: attachment.sizeBytes,
    uploadedBy: { id: attachment.uploadedBy, name: uploaderName },
    commentId: attachment.commentId,
    createdAt: attachment.createdAt.toISOString(),
  };
}

/** The author of a comment on a pin of this project, or null when there is no such comment there. */
export async function getCommentAuthor({ projectId, commentId }: { projectId: string; commentId: string }): Promise<string | null> {
  const [row] = await getDb()
    .select({ authorId: comments.authorId })
    .from(comments)
    .innerJoin(pins, eq(pins.id, comments.pinId))
    .where(and(eq(pins.projectId, projectId), eq(comments.id, commentId)));
  return row?.authorId ?? null;
}

/** Pending uploads started before `before` (never confirmed: abandoned or failed halfway). */
export function listStalePendingAttachments({ before, limit = 100 }: { before: Date; limit?: number }): Promise<Attachment[]> {
  return getDb()
    .select()
    .from(attachments)
    .where(and(eq(attachments.state, "pending"), lt(attachments.createdAt, before)))
    .orderBy(asc(attachments.createdAt))
    .limit(limit);
}

/**
 * Links confirmed model files to the revision made from them; returns how many were linked (a file already used by
 * another revision, or not ready, is not linked, and the caller rolls back).
 */
export async function linkModelFiles(tx: Executor, { projectId, attachmentIds, revisionId }: { projectId: string; attachmentIds: string[]; revisionId: string }): Promise<number> {
  if (attachmentIds.length === 0) return 0;
  const rows = await tx
    .update(attachments)
    .set({ revisionId })
    .where(and(eq(attachments.projectId, projectId), inArray(attachments.id, attachmentIds), eq(attachments.purpose, "model"), eq(attachments.state, "ready"), isNull(attachments.revisionId)))
    .returning({ id: attachments.id });
  return rows.length;
}

/** The ready files of a purpose linked to a revision (its uploaded model originals, its stored reports), by name. */
export function listRevisionFiles({ projectId, revisionId, purpose, db = getDb() }: { projectId: string; revisionId: string; purpose: Attachment["purpose"]; db?: Executor }): Promise<Attachment[]> {
  return db
    .select()
    .from(attachments)
    .where(and(eq(attachments.projectId, projectId), eq(attachments.revisionId, revisionId), eq(attachments.purpose, purpose), eq(attachments.state, "ready")))
    .orderBy(asc(attachments.filename));
}
