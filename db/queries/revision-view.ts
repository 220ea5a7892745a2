import "server-only";
import { and, asc, desc, eq, sql, type SQL } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { analysisRuns, modelRevisions, resultColumns, users, type AnalysisRun, type InfoOverview, type ModelRevision } from "@/db/schema";
import { latestJobsOfRevisions, type JobView } from "./jobs";

// Typed by the stored columns (db/schema), so this file needs nothing from the analysis code.
type TrussModel = ModelRevision["model"];
type StoredReview = NonNullable<AnalysisRun["review"]>;

export type { InfoOverview };

/** The review without its per-member rows (those come with one member's detail). */
export type ReviewOverview = Omit<StoredReview, "members">;

/**
 * What the viewer opens a revision with (GET …/models/N/summary): no node, member or result arrays — the geometry
 * and each result's columns are their own binary answers — so a big roof opens after a few hundred kilobytes.
 */
export type RevisionOverview = {
  id: string;
  number: number;
  name: string;
  createdAt: string;
  createdBy: string | null;
  memberCount: number;
  isCurrent: boolean;
  job: JobView | null;
  anyLoadJob: JobView | null;
  /** The model without nodes, members, materials and sections: its name, supports, load cases and combinations. */
  model: Pick<TrussModel, "name" | "supports" | "loadCases" | "combinations">;
  analysis: {
    id: string;
    status: "ok" | "unstable";
    createdAt: string;
    /** Ids of the stored results (load cases and combinations), in no particular order. */
    resultIds: string[];
    /** The analysis's info without its per-member maps. */
    info: InfoOverview;
    review: ReviewOverview | null;
  } | null;
};

/**
 * One revision by number as the viewer opens it, or null. It reads the overviews PostgreSQL keeps beside the large
 * jsonb fields (generated columns), never the fields themselves.
 */
export async function getRevisionOverview({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<RevisionOverview | null> {
  const [row] = await db
    .select({
      id: modelRevisions.id,
      number: modelRevisions.number,
      name: modelRevisions.name,
      createdAt: modelRevisions.createdAt,
      createdBy: users.name,
      memberCount: modelRevisions.memberCount,
      isCurrent: modelRevisions.isCurrent,
      model: sql<RevisionOverview["model"]>`${modelRevisions.modelOverview}`,
    })
    .from(modelRevisions)
    .leftJoin(users, eq(users.id, modelRevisions.createdBy))
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .limit(1);
  if (!row) return null;
  const [run] = await db
    .select({
      id: analysisRuns.id,
      status: analysisRuns.status,
      createdAt: analysisRuns.createdAt,
      info: sql<InfoOverview>`${analysisRuns.infoOverview}`,
      review: sql<ReviewOverview | null>`${analysisRuns.reviewOverview}`,
    })
    .from(analysisRuns)
    .where(eq(analysisRuns.revisionId, row.id))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  const resultIds = run
    ? (await db.select({ id: resultColumns.resultId }).from(resultColumns).where(eq(resultColumns.analysisRunId, run.id)).orderBy(asc(resultColumns.resultId))).map((r) => r.id)
    : [];
  const jobs = await latestJobsOfRevisions({ revisionIds: [row.id], db });
  const anyLoadJobs = await latestJobsOfRevisions({ revisionIds: [row.id], kind: "any_load", db });
  return {
    ...row,
    createdAt: row.createdAt.toISOString(),
    job: jobs.get(row.id) ?? null,
    anyLoadJob: anyLoadJobs.get(row.id) ?? null,
    analysis: run ? { id: run.id, status: run.status, createdAt: run.createdAt.toISOString(), resultIds, info: run.info, review: run.review } : null,
  };
}

/** One revision's id and model by number, or null: what its geometry is packed from. */
export async function getRevisionModel({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<{ id: string; model: TrussModel } | null> {
  const [row] = await db
    .select({ id: modelRevisions.id, model: modelRevisions.model })
    .from(modelRevisions)
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .limit(1);
  return row ?? null;
}

/** A revision's viewer geometry as stored when it was saved (null for revisions saved before migration 0019). */
export async function getRevisionGeometry({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<{ id: string; geometry: Uint8Array | null } | null> {
  const [row] = await db
    .select({ id: modelRevisions.id, geometry: modelRevisions.geometry })
    .from(modelRevisions)
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .limit(1);
  return row ?? null;
}

/** Only the ids of a jsonb array of objects (the model's load cases or combinations), as [{ id }]. */
const idsOf = (array: SQL) => sql<{ id: string }[]>`(select coalesce(jsonb_agg(jsonb_build_object('id', item->>'id')), '[]'::jsonb) from jsonb_array_elements(${array}) item)`;

/**
 * What the viewer page needs to name the opening result before any script runs: the ids of the model's load cases
 * and combinations, and the result ids stored by the revision's latest analysis when that one is stable (the
 * viewer draws no result of an unstable one). Null when there is no such revision.
 */
export async function getRevisionResultNames({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<{ loadCases: { id: string }[]; combinations: { id: string }[]; stored: string[] } | null> {
  const [row] = await db
    .select({ id: modelRevisions.id, loadCases: idsOf(sql`${modelRevisions.modelOverview}->'loadCases'`), combinations: idsOf(sql`${modelRevisions.modelOverview}->'combinations'`) })
    .from(modelRevisions)
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .limit(1);
  if (!row) return null;
  const [run] = await db.select({ id: analysisRuns.id, status: analysisRuns.status }).from(analysisRuns).where(eq(analysisRuns.revisionId, row.id)).orderBy(desc(analysisRuns.createdAt)).limit(1);
  const stored = run?.status === "ok" ? (await db.select({ id: resultColumns.resultId }).from(resultColumns).where(eq(resultColumns.analysisRunId, run.id))).map((r) => r.id) : [];
  return { loadCases: row.loadCases, combinations: row.combinations, stored };
}
