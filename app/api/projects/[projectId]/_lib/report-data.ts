import "server-only";
// Route-side reading (a private folder of the project API; it reads stored rows, so it is not lib/). Gathers what the review report and the CSV exports need from the stored data (other areas' query functions),
// checking the chosen revision and result ids; the report itself is built from the plain data (lib/report/pdf.ts).
import { listClashesByRevision } from "@/db/queries/clashes";
import { getDefaultRevisionNumber, getRevisionWithResults, type RevisionWithResults } from "@/db/queries/models";
import { listPinsByProject } from "@/db/queries/pins";
import { getProjectById } from "@/db/queries/projects";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import { CLASH_OUTCOME_LABELS } from "@/lib/clash/outcomes";
import { ConflictError, NotFoundError, ValidationError } from "@/lib/http/errors";
import type { Anchor } from "@/lib/realtime/events";
import type { ReportQuery } from "@/lib/report/schemas";
import type { ReportInput } from "@/lib/report/types";

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

function anchorText(anchor: Anchor): string {
  if (anchor.kind === "point") return `point (${anchor.point.map((v) => v.toFixed(2)).join(", ")})`;
  return `${anchor.kind} ${anchor.id}`;
}

/** Everything the review report shows, for the chosen revision and results. */
export async function collectReport({ projectId, query, generatedBy, now }: { projectId: string; query: ReportQuery; generatedBy: string; now: Date }): Promise<ReportInput> {
  const project = await getProjectById({ projectId });
  if (!project) throw new NotFoundError();
  const revision = await loadAnalysedRevision({ projectId, revision: query.revision });
  const { result } = revision.analysis;
  const defaults = revision.model.combinations.length > 0 ? revision.model.combinations.map((c) => c.id) : revision.model.loadCases.map((c) => c.id);
  const combinations = query.combinations ?? (result.status === "ok" ? defaults : []);
  requireResults(result, combinations, "combinations");
  const compare = query.compare ? ([query.compare[0], query.compare[1]] as [string, string]) : null;
  if (compare) requireResults(result, compare, "compare");

  const clashes = await listClashesByRevision({ revisionId: revision.id });
  const pins = await listPinsByProject({ projectId });
  return {
    project: { name: project.name, description: project.description },
    revision: { number: revision.number, name: revision.name, createdAt: revision.createdAt, createdBy: revision.createdBy },
    model: revision.model,
    result,
    combinations,
    compare,
    clashes: clashes.map((c) => ({
      clashKey: c.clashKey,
      memberId: c.memberId,
      runId: c.runId,
      kind: c.kind,
      status: c.status,
      outcome: c.outcome ? CLASH_OUTCOME_LABELS[c.outcome] : null,
      note: c.note,
      conditions: c.conditions,
      proposedBy: c.proposedBy,
      decidedBy: c.decidedBy,
      decidedAt: c.decidedAt,
    })),
    openQuestions: pins
      .filter((pin) => pin.state !== "closed")
      .map((pin) => ({ title: pin.title, anchor: anchorText(pin.anchor), state: pin.state as "open" | "answered", author: pin.author.name, createdAt: pin.createdAt, comments: pin.commentCount })),
    generatedAt: now.toISOString(),
    generatedBy,
  };
}
