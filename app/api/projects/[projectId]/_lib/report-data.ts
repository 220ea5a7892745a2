import "server-only";
// Route-side reading (a private folder of the project API; it reads stored rows, so it is not lib/): the revision
// and results the CSV and IFC exports name, checked. The report PDF is a job (server/jobs/report-data.ts reads for it).
import { getDefaultRevisionNumber, getRevisionWithResults, type RevisionWithResults } from "@/db/queries/models";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import { ConflictError, NotFoundError, ValidationError } from "@/lib/http/errors";

type Analysed = RevisionWithResults & { analysis: NonNullable<RevisionWithResults["analysis"]> };

/** The revision (the current one, else the newest, when no number is given) with its stored analysis; 404 / 409 when there is none. */
export async function loadAnalysedRevision({ projectId, revision }: { projectId: string; revision?: number }): Promise<Analysed> {
  const number = revision ?? (await getDefaultRevisionNumber({ projectId }));
  if (number === null) throw new NotFoundError("This project has no model revision yet.");
  const found = await getRevisionWithResults({ projectId, number });
  if (!found) throw new NotFoundError(`Revision ${number} does not exist in this project.`);
  if (!found.analysis) throw new ConflictError(`Revision ${number} has not been analysed yet.`);
  return found as Analysed;
}

/** Throws a 400 naming the field when an id is not a load case or combination of the analysis. */
export function requireResults(result: AnalysisResult, ids: string[], field: string): void {
  const unknown = ids.filter((id) => !(id in result.results));
  if (unknown.length > 0) {
    const message = result.status === "unstable" ? "The model is unstable, so it has no results to report." : `Not a load case or combination of this revision: ${unknown.join(", ")}.`;
    throw new ValidationError([{ path: field, message }], message);
  }
}
