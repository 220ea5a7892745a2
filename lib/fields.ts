// zod building blocks for values that name stored rows, bounded by lib/limits.ts so a number the database cannot
// hold is a 400 with a message, never a 500 from PostgreSQL.
import { z } from "zod";
import { ids } from "./limits";

const revisionMessage = `Revision numbers are whole numbers from ${ids.revisionNumber.min} to ${ids.revisionNumber.max}.`;

/** A revision number in a JSON body. */
export const revisionNumber = z.number(revisionMessage).int(revisionMessage).min(ids.revisionNumber.min, revisionMessage).max(ids.revisionNumber.max, revisionMessage);

/** A revision number in a path or query string. */
export const revisionNumberText = z.coerce.number(revisionMessage).pipe(revisionNumber);
