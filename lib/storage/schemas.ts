// Input schemas for file uploads: shared by the upload form and the route handlers.
import { z } from "zod";
import { fileName } from "@/lib/fields";
import { UPLOAD_PURPOSES } from "./content-check";

/** A request for a presigned upload: what the browser says about the file (checked again against the bytes). */
export const uploadRequestSchema = z
  .object({
    purpose: z.enum(UPLOAD_PURPOSES),
    filename: fileName,
    contentType: z.string().trim().min(1).max(100),
    sizeBytes: z.number().int().positive("The file is empty."),
    commentId: z.uuid().optional(),
    revisionId: z.uuid().optional(),
    runId: z.uuid().optional(),
  })
  .refine((input) => input.purpose !== "comment" || input.commentId, { message: "Say which comment the file belongs to.", path: ["commentId"] });
export type UploadRequestInput = z.input<typeof uploadRequestSchema>;

export const attachmentParamsSchema = z.object({ projectId: z.uuid(), attachmentId: z.uuid() });

export const listAttachmentsQuerySchema = z.object({ commentId: z.uuid() });
