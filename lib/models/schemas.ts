// Request bodies for creating a model revision, shared by the models page forms and the route handler.
import { z } from "zod";
import { fileName, revisionNumberText } from "@/lib/fields";
import { modelUploadChars, modelUploadFiles } from "@/lib/limits";
import { roofParamsSchema } from "@/lib/analysis/generator";

const revisionName = z.string().trim().min(1, "Give the revision a name").max(200);

export const createRevisionSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("generate"), params: roofParamsSchema }),
  z.object({
    kind: z.literal("uploadJson"),
    name: revisionName.optional(),
    // The uploaded file's name, kept with the stored original.
    fileName: fileName.optional(),
    model: z.unknown(),
  }),
  z.object({
    kind: z.literal("uploadCsv"),
    name: revisionName,
    tables: z.record(z.string().min(1), z.string().max(modelUploadChars, "Keep each table under 40 million characters.")).refine((t) => Object.keys(t).length > 0, "Add at least one CSV table"),
  }),
  z.object({
    // Files the browser already put in object storage through presigned uploads (confirmed attachments of purpose
    // "model"): one JSON model, or the CSV tables. They are kept byte for byte as the revision's originals.
    kind: z.literal("uploadFiles"),
    name: revisionName.optional(),
    attachmentIds: z.array(z.uuid()).min(1, "Upload at least one file.").max(modelUploadFiles, `Upload at most ${modelUploadFiles} files.`),
  }),
]);

/** A request that carries its model (or generator parameters) in the body itself. */
export type InlineRevisionRequest = Exclude<z.output<typeof createRevisionSchema>, { kind: "uploadFiles" }>;

export type CreateRevisionInput = z.input<typeof createRevisionSchema>;
/** A parsed create-revision request, as the route handler sees it. */
export type CreateRevisionRequest = z.output<typeof createRevisionSchema>;

export const revisionParamsSchema = z.object({ projectId: z.uuid(), number: revisionNumberText });

/** The two revisions a comparison is between (from: the earlier one, usually). */
export const compareQuerySchema = z
  .object({ from: revisionNumberText, to: revisionNumberText })
  .refine((q) => q.from !== q.to, { path: ["to"], message: "Choose two different revisions to compare." });
