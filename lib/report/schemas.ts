// Query schemas of the report and export routes: shared by the report form and the route handlers.
import { z } from "zod";
import { revisionNumberText } from "@/lib/fields";
import { text } from "@/lib/limits";
import { RESERVED_NAMES, reservedNameMessage } from "@/lib/text";

// Result ids index stored results: a name of Object.prototype ("__proto__", "constructor") would read inherited values.
const resultId = z
  .string()
  .trim()
  .min(1)
  .max(text.resultId)
  .refine((id) => !RESERVED_NAMES.has(id), { error: (issue) => reservedNameMessage(String(issue.input)) });
const idList = z
  .string()
  .transform((value) => value.split(",").map((id) => id.trim()).filter(Boolean))
  .pipe(z.array(resultId).max(50, "Choose at most 50 results."));

/** GET /api/projects/[projectId]/report?revision=&combinations=a,b&compare=a,b */
export const reportQuerySchema = z.object({
  /** Revision number; the newest revision when absent. */
  revision: revisionNumberText.optional(),
  /** Result ids to tabulate (combinations or load cases); every combination when absent. */
  combinations: idList.optional(),
  /** Exactly two result ids whose member states are compared. */
  compare: idList.pipe(z.array(resultId).length(2, "Compare exactly two results, as compare=a,b.")).optional(),
});
export type ReportQuery = z.output<typeof reportQuerySchema>;

/** The raw report query from URL parameters, joining repeated list keys (a form's checkboxes) with commas. */
export function reportQueryFrom(params: URLSearchParams): Record<string, string | undefined> {
  const list = (key: string) => params.getAll(key).flatMap((value) => value.split(",")).map((id) => id.trim()).filter(Boolean).join(",") || undefined;
  return { revision: params.get("revision") || undefined, combinations: list("combinations"), compare: list("compare") };
}

/** GET /api/projects/[projectId]/exports/member-forces.csv?revision=&result= */
export const memberForcesQuerySchema = z.object({
  revision: revisionNumberText.optional(),
  result: resultId,
});

/** GET /api/projects/[projectId]/exports/envelope.csv?revision= */
export const envelopeQuerySchema = z.object({
  revision: revisionNumberText.optional(),
});
