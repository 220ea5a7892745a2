// Files in object storage: comment attachments (images, PDF), model files and MEP run files (design.md, "Data":
// attachments hold object keys; the bytes live in the S3-compatible store).
import { bigint, index, pgEnum, pgTable, text, uuid } from "drizzle-orm/pg-core";
import { FILE_PURPOSES } from "../../lib/storage/content-check";
import { projects, timestamps, users } from "./core";
import { comments } from "./review";

/** pending: a presigned upload was handed out, the bytes are not verified yet; ready: stored and verified. */
export const ATTACHMENT_STATES = ["pending", "ready"] as const;
export const attachmentState = pgEnum("attachment_state", ATTACHMENT_STATES);
export const filePurpose = pgEnum("file_purpose", FILE_PURPOSES);

export const attachments = pgTable(
  "attachments",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    purpose: filePurpose().notNull(),
    objectKey: text().notNull().unique(),
    // The name the uploader gave; shown and used for downloads, never trusted for the type.
    filename: text().notNull(),
    // Detected from the bytes when the upload is confirmed (the declared type until then).
    contentType: text().notNull(),
    sizeBytes: bigint({ mode: "number" }).notNull(),
    uploadedBy: uuid()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    commentId: uuid().references(() => comments.id, { onDelete: "cascade" }),
    // Model revision or MEP run the file belongs to (no foreign key: those tables live in other areas and may be
    // written after the file, e.g. a model file uploaded before its revision is created).
    revisionId: uuid(),
    runId: uuid(),
    state: attachmentState().notNull().default("pending"),
    ...timestamps,
  },
  (t) => [index("attachments_comment_idx").on(t.commentId), index("attachments_pending_idx").on(t.state, t.createdAt)],
);

export type Attachment = typeof attachments.$inferSelect;
export type NewAttachment = typeof attachments.$inferInsert;
