import "server-only";
// Route-side reading (a private folder of the project API; it reads stored rows, so it is not lib/): the revision
// and results the report request and the CSV and IFC exports name, checked, and the one-result CSV download. The report PDF is a job (server/jobs/report-data.ts reads for it).
import { getDefaultRevisionNumber, getRevisionWithResults, type RevisionWithResults } from "@/db/queries/models";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import { ConflictError, NotFoundError, ValidationError } from "@/lib/http/errors";

type Analysed = RevisionWithResults & { analysis: NonNullable<RevisionWithResults["analysis"]> };

/** The revision number asked for, else the current revision's (else the newest's); 404 when the project has none. */
export async function chosenRevisionNumber({ projectId, revision }: { projectId: string; revision?: number }): Promise<number> {
  const number = revision ?? (await getDefaultRevisionNumber({ projectId }));
  if (number === null) throw new NotFoundError("This project has no model revision yet.");
  return number;
}

/** A 404 naming a revision number that is not one of this project's. */
export const noSuchRevision = (number: number) => new NotFoundError(`Revision ${number} does not exist in this project.`);

/** The revision (the current one, else the newest, when no number is given) with its stored analysis; 404 / 409 when there is none. */
export async function loadAnalysedRevision({ projectId, revision }: { projectId: string; revision?: number }): Promise<Analysed> {
  const number = await chosenRevisionNumber({ projectId, revision });
  const found = await getRevisionWithResults({ projectId, number });
  if (!found) throw noSuchRevision(number);
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

/**
 * A CSV download of one result of a revision (member forces, node results): the revision and result checked, the
 * file named `<name>-rev<n>-<result>.csv` with the result id reduced to characters safe in a header.
 */
export async function resultCsvResponse(
  { projectId, query, name }: { projectId: string; query: { revision?: number; result: string }; name: string },
  write: (model: TrussModel, result: AnalysisResult, resultId: string) => string,
): Promise<Response> {
  const revision = await loadAnalysedRevision({ projectId, revision: query.revision });
  requireResults(revision.analysis.result, [query.result], "result");
  const csv = write(revision.model, revision.analysis.result, query.result);
  const filename = `${name}-rev${revision.number}-${query.result.replace(/[^A-Za-z0-9_.-]/g, "_")}.csv`;
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"` } });
}
