// Input schemas of the report and export routes: shared by the report form, the route handlers and the report job.
import { z } from "zod";
import { revisionNumber, revisionNumberText } from "@/lib/fields";
import { text } from "@/lib/limits";
import { RESERVED_NAMES, reservedNameMessage } from "@/lib/text";

// Result ids index stored results: a name of Object.prototype ("__proto__", "constructor") would read inherited values.
const resultId = z
  .string()
  .trim()
  .min(1)
  .max(text.resultId)
  .refine((id) => !RESERVED_NAMES.has(id), { error: (issue) => reservedNameMessage(String(issue.input)) });
/** How many results one report draws and tabulates (a plan page and a member table each). */
export const REPORT_RESULTS_MAX = 50;
const resultList = z
  .array(resultId)
  .max(REPORT_RESULTS_MAX, `Choose at most ${REPORT_RESULTS_MAX} results.`)
  .superRefine((ids, ctx) => {
    const twice = [...new Set(ids.filter((id, k) => ids.indexOf(id) !== k))];
    if (twice.length) ctx.addIssue({ code: "custom", message: `Name each result once: ${twice.join(", ")} ${twice.length === 1 ? "is" : "are"} named twice.` });
  });

/** POST /api/projects/[projectId]/report: the report to make (a job; GET …/jobs/<id> follows it). */
export const reportRequestSchema = z.strictObject({
  /** Revision number; the current revision (else the newest) when absent. */
  revision: revisionNumber.optional(),
  /** Result ids to tabulate and draw (combinations or load cases), in this order; every combination when absent. */
  combinations: resultList.optional(),
  /** Exactly two result ids whose member states are compared. */
  compare: z.array(resultId).length(2, "Compare exactly two results.").nullish(),
});
export type ReportRequest = z.output<typeof reportRequestSchema>;

/** GET /api/projects/[projectId]/report?revision=: the revision's finished reports. */
export const reportListQuerySchema = z.object({
  revision: revisionNumberText,
});

/** What a report job was asked for, resolved against the revision (stored as the job's input). */
export const reportJobInputSchema = z.strictObject({
  revision: revisionNumber,
  combinations: resultList,
  compare: z.tuple([resultId, resultId]).nullable(),
});
export type ReportJobInput = z.output<typeof reportJobInputSchema>;

/** GET /api/projects/[projectId]/exports/member-forces.csv?revision=&result= (and node-results.csv, the same query) */
export const memberForcesQuerySchema = z.object({
  revision: revisionNumberText.optional(),
  result: resultId,
});

/** GET /api/projects/[projectId]/exports/envelope.csv?revision= */
export const envelopeQuerySchema = z.object({
  revision: revisionNumberText.optional(),
});
