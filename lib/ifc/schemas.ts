import { z } from "zod";
import { revisionNumberText } from "@/lib/fields";
import { memberForcesQuerySchema } from "@/lib/report/schemas";

/** Largest IFC upload the app reads (bytes); the command line reads up to MAX_IFC_BYTES. */
export const IFC_UPLOAD_BYTES = 64 * 1024 * 1024;

/** POST …/runs/ifc: which revision, replace or upsert, and whether only to preview (nothing stored). */
export const ifcRunsQuerySchema = z.object({
  revision: revisionNumberText,
  mode: z.enum(["replace", "upsert"]).default("upsert"),
  preview: z.enum(["0", "1"]).default("1"),
});

/** GET …/exports/revision.ifc: the revision (newest when absent) and the result whose force state is written. */
export const ifcExportQuerySchema = memberForcesQuerySchema.partial({ result: true });
