// zod building blocks for values that name stored rows, bounded by lib/limits.ts so a number the database cannot
// hold is a 400 with a message, never a 500 from PostgreSQL.
import { z } from "zod";
import { ids, text } from "./limits";
import { fileNameProblem } from "./text";

const revisionMessage = `Revision numbers are whole numbers from ${ids.revisionNumber.min} to ${ids.revisionNumber.max}.`;

/** A revision number in a JSON body. */
export const revisionNumber = z.number(revisionMessage).int(revisionMessage).min(ids.revisionNumber.min, revisionMessage).max(ids.revisionNumber.max, revisionMessage);

/** A revision number in a path or query string. */
export const revisionNumberText = z.coerce.number(revisionMessage).pipe(revisionNumber);

/** A file's name as the browser gives it: one line, no folder parts, storable, at most text.fileName characters. */
export const fileName = z
  .string()
  .trim()
  .min(1, "The file needs a name.")
  .max(text.fileName, `Keep the file name under ${text.fileName} characters.`)
  .superRefine((name, ctx) => {
    const problem = fileNameProblem(name);
    if (problem) ctx.addIssue({ code: "custom", message: problem });
  });
