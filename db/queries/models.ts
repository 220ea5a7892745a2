import "server-only";
import { and, asc, desc, eq, isNull, max, sql } from "drizzle-orm";
import { getDb, withTransaction, type Executor, type Transaction } from "@/db/client";
import { analysisRuns, attachments, modelRevisions, projects, users, type AnalysisRun, type ModelRevision, type Project } from "@/db/schema";
import { jsonBytes } from "@/lib/models/json-bytes";
import { recordAuditEvent } from "./audit";
import { latestJobsOfRevisions, type JobView } from "./jobs";
import { insertResultColumns, runColumnValues, type StoredColumns } from "./result-columns";

// The stored jsonb columns' types (db/schema), so this file needs nothing from the analysis code.
type TrussModel = ModelRevision["model"];
type AnalysisResult = AnalysisRun["result"];
type StoredReview = NonNullable<AnalysisRun["review"]>;

/** A revision as listed (no model body). */
export type RevisionSummary = {
  id: string;
  number: number;
  name: string;
  source: ModelRevision["source"];
  createdAt: string;
  createdBy: string | null;
  memberCount: number;
  analysisStatus: "ok" | "unstable" | null;
  /** Marked current (for review) by the structural engineer; pages open it by default. */
  isCurrent: boolean;
  /** The newest job working on the revision (its analysis), for the progress bar; null for a seeded revision. */
  job: JobView | null;
  /** The uploaded original file(s) kept in object storage, downloadable through the attachments route. */
  originals: { id: string; filename: string }[];
};

/** A revision with its model and the stored analysis and review. */
export type RevisionWithResults = Omit<RevisionSummary, "analysisStatus" | "originals"> & {
  /** The newest whole-roof "idle for any roof load" job, while it runs or after (server/jobs/any-load.ts). */
  anyLoadJob: JobView | null;
  model: TrussModel;
  analysis: { id: string; status: "ok" | "unstable"; result: AnalysisResult; review: StoredReview | null; createdAt: string } | null;
};

/** Every revision of a project, newest first, with the status of its analysis. */
export async function listRevisionsByProject({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<RevisionSummary[]> {
  const rows = await db
    .select({
      id: modelRevisions.id,
      number: modelRevisions.number,
      name: modelRevisions.name,
      source: modelRevisions.source,
      createdAt: modelRevisions.createdAt,
      createdBy: users.name,
      memberCount: modelRevisions.memberCount,
      isCurrent: modelRevisions.isCurrent,
      status: analysisRuns.status,
    })
    .from(modelRevisions)
    .leftJoin(users, eq(users.id, modelRevisions.createdBy))
    .leftJoin(analysisRuns, eq(analysisRuns.revisionId, modelRevisions.id))
    .where(eq(modelRevisions.projectId, projectId))
    .orderBy(desc(modelRevisions.number));
  const originals = await db
    .select({ id: attachments.id, filename: attachments.filename, revisionId: attachments.revisionId })
    .from(attachments)
    .where(and(eq(attachments.projectId, projectId), eq(attachments.purpose, "model"), eq(attachments.state, "ready")))
    .orderBy(asc(attachments.filename));
  const latestJobs = await latestJobsOfRevisions({ revisionIds: rows.map((row) => row.id), db });
  const seen = new Set<string>();
  return rows
    .filter((row) => !seen.has(row.id) && seen.add(row.id))
    .map((row) => ({
      id: row.id,
      number: row.number,
      name: row.name,
      source: row.source,
      createdAt: row.createdAt.toISOString(),
      createdBy: row.createdBy,
      memberCount: row.memberCount,
      analysisStatus: row.status,
      isCurrent: row.isCurrent,
      job: latestJobs.get(row.id) ?? null,
      originals: originals.filter((file) => file.revisionId === row.id).map(({ id, filename }) => ({ id, filename })),
    }));
}

/** A revision's model with the project's design standard and deflection limit (the re-check of carried decisions). */
export async function getRevisionForAnalysis({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<{ model: TrussModel; standard: Project["designStandard"]; deflectionLimit: number } | null> {
  const [row] = await db
    .select({ model: modelRevisions.model, standard: projects.designStandard, deflectionLimit: projects.deflectionLimit })
    .from(modelRevisions)
    .innerJoin(projects, eq(projects.id, modelRevisions.projectId))
    .where(eq(modelRevisions.id, revisionId))
    .limit(1);
  return row ?? null;
}

/**
 * What the analysis job's thread starts from: the revision's model as JSON text (parsed in that thread, never in the
 * jobs process), the project's design standard and deflection limit as they are now; null when the revision is gone.
 */
export async function getRevisionToAnalyse({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<{ modelJson: string; standard: Project["designStandard"]; deflectionLimit: number } | null> {
  const [row] = await db
    .select({ modelJson: sql<string>`${modelRevisions.model}::text`, standard: projects.designStandard, deflectionLimit: projects.deflectionLimit })
    .from(modelRevisions)
    .innerJoin(projects, eq(projects.id, modelRevisions.projectId))
    .where(eq(modelRevisions.id, revisionId))
    .limit(1);
  return row ?? null;
}

/** The members zero in all results of a revision's newest analysis, when that analysis is stable; else null. */
export async function getNewestZeroInAll({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<string[] | null> {
  const [row] = await db
    .select({ status: analysisRuns.status, zeroInAll: sql<string[]>`${analysisRuns.result} -> 'zeroInAll'` })
    .from(analysisRuns)
    .where(eq(analysisRuns.revisionId, revisionId))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  return row?.status === "ok" ? row.zeroInAll : null;
}

/** One revision by number with its model and newest analysis run, or null. */
export async function getRevisionWithResults({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<RevisionWithResults | null> {
  const [revision] = await db
    .select({ revision: modelRevisions, createdBy: users.name })
    .from(modelRevisions)
    .leftJoin(users, eq(users.id, modelRevisions.createdBy))
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .limit(1);
  if (!revision) return null;
  const [run] = await db
    .select()
    .from(analysisRuns)
    .where(eq(analysisRuns.revisionId, revision.revision.id))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  const r = revision.revision;
  const jobs = await latestJobsOfRevisions({ revisionIds: [r.id], db });
  const anyLoadJobs = await latestJobsOfRevisions({ revisionIds: [r.id], kind: "any_load", db });
  return {
    id: r.id,
    number: r.number,
    name: r.name,
    source: r.source,
    createdAt: r.createdAt.toISOString(),
    createdBy: revision.createdBy,
    memberCount: r.memberCount,
    isCurrent: r.isCurrent,
    job: jobs.get(r.id) ?? null,
    anyLoadJob: anyLoadJobs.get(r.id) ?? null,
    model: r.model,
    analysis: run ? { id: run.id, status: run.status, result: run.result, review: run.review, createdAt: run.createdAt.toISOString() } : null,
  };
}

export type NewRevisionInput = {
  projectId: string;
  name: string;
  model: TrussModel;
  /** The model packed for the viewer (lib/models/geometry-wire.ts packGeometry). */
  geometry: Uint8Array;
  source: ModelRevision["source"];
  createdBy: string | null;
};

export type { StoredColumns };

export type CreateRevisionInput = NewRevisionInput & { result: AnalysisResult; review: StoredReview | null; columns: StoredColumns };

/** Inserts the next revision of the project (no analysis yet) with an audit event, inside the given transaction. */
export async function insertRevision(tx: Executor, input: NewRevisionInput): Promise<{ id: string; number: number }> {
  const [row] = await tx.select({ latest: max(modelRevisions.number) }).from(modelRevisions).where(eq(modelRevisions.projectId, input.projectId));
  const number = (row?.latest ?? 0) + 1;
  const [revision] = await tx
    .insert(modelRevisions)
    .values({
      projectId: input.projectId,
      number,
      name: input.name,
      model: input.model,
      geometry: input.geometry,
      memberCount: input.model.members.length,
      memberOrder: input.model.members.map((member) => member.id),
      source: input.source,
      createdBy: input.createdBy,
    })
    .returning({ id: modelRevisions.id, number: modelRevisions.number });
  await recordAuditEvent({
    db: tx,
    projectId: input.projectId,
    actorId: input.createdBy,
    action: "model.revision.create",
    subjectType: "model_revision",
    subjectId: revision.id,
    details: { number, name: input.name, source: input.source },
  });
  return revision;
}

/** The oldest revision saved before its viewer geometry was stored with it (migration 0019), with its model, or null. */
export async function getRevisionWithoutGeometry({ db = getDb() }: { db?: Executor } = {}): Promise<{ id: string; model: TrussModel } | null> {
  const [row] = await db.select({ id: modelRevisions.id, model: modelRevisions.model }).from(modelRevisions).where(isNull(modelRevisions.geometry)).orderBy(asc(modelRevisions.createdAt)).limit(1);
  return row ?? null;
}

/** Stores a revision's viewer geometry if it has none yet (a revision's stored geometry is never replaced). */
export async function storeRevisionGeometry(db: Executor, { revisionId, geometry }: { revisionId: string; geometry: Uint8Array }): Promise<void> {
  await db.update(modelRevisions).set({ geometry }).where(and(eq(modelRevisions.id, revisionId), isNull(modelRevisions.geometry)));
}

/** The analysis JSON as stored: the document's UTF-8 bytes (lib/models/json-bytes.ts); PostgreSQL parses them into jsonb. */
export type JsonBytes = Uint8Array;
// Sent as one binary bytea parameter: no JavaScript string of the document is made on the way.
const jsonbOf = (bytes: JsonBytes) => sql`convert_from(${Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength)}::bytea, 'UTF8')::jsonb`;

/**
 * Stores an analysis run (results and review as JSON, and the same as columns) of a revision. One insert of the run
 * row: every update of it would recompute its generated overview columns, decompressing both documents again.
 */
export async function insertAnalysisRun(
  tx: Executor,
  input: { revisionId: string; status: AnalysisRun["status"]; resultJson: JsonBytes; reviewJson: JsonBytes | null; columns: StoredColumns },
): Promise<{ id: string }> {
  const { revisionId, status, resultJson, reviewJson, columns } = input;
  const [run] = await tx
    .insert(analysisRuns)
    .values({ revisionId, status, result: jsonbOf(resultJson), review: reviewJson && jsonbOf(reviewJson), ...runColumnValues(columns) })
    .returning({ id: analysisRuns.id });
  await insertResultColumns(tx, { runId: run.id, results: columns.results });
  return run;
}

/** Inserts the next revision of the project with an analysis already computed (the demo seed, tests). */
export async function insertRevisionWithAnalysis(tx: Executor, input: CreateRevisionInput): Promise<{ id: string; number: number }> {
  const revision = await insertRevision(tx, input);
  const { result, review, columns } = input;
  await insertAnalysisRun(tx, { revisionId: revision.id, status: result.status, resultJson: jsonBytes(result), reviewJson: review && jsonBytes(review), columns });
  return revision;
}

/**
 * Runs `write` (which inserts the next revision of a project) in one transaction. A concurrent save that takes the
 * same number fails the unique index and is retried once.
 */
export async function withNextRevision<T>(write: (tx: Transaction) => Promise<T>): Promise<T> {
  const attempt = () => withTransaction(write);
  try {
    return await attempt();
  } catch (error) {
    // drizzle wraps the pg error; 23505 is PostgreSQL's unique_violation.
    const pgError = error as { cause?: { code?: string }; code?: string };
    if ((pgError.cause?.code ?? pgError.code) === "23505") return attempt();
    throw error;
  }
}

/** The number of a revision given its id (null when it does not exist). */
export async function getRevisionNumber({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<number | null> {
  const [row] = await db.select({ number: modelRevisions.number }).from(modelRevisions).where(eq(modelRevisions.id, revisionId)).limit(1);
  return row?.number ?? null;
}

/** Marks one revision of a project current (for review) and unmarks the one before; returns the previous number. */
export async function setCurrentRevision(tx: Executor, { projectId, revisionId }: { projectId: string; revisionId: string }): Promise<number | null> {
  const [previous] = await tx
    .update(modelRevisions)
    .set({ isCurrent: false })
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.isCurrent, true)))
    .returning({ number: modelRevisions.number });
  await tx.update(modelRevisions).set({ isCurrent: true }).where(eq(modelRevisions.id, revisionId));
  return previous?.number ?? null;
}

/** The number of the project's current revision, else its newest, else null. */
export async function getDefaultRevisionNumber({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<number | null> {
  const [row] = await db
    .select({ number: modelRevisions.number })
    .from(modelRevisions)
    .where(eq(modelRevisions.projectId, projectId))
    .orderBy(desc(modelRevisions.isCurrent), desc(modelRevisions.number))
    .limit(1);
  return row?.number ?? null;
}

/**
 * The revision pages open by default (the current one, else the newest) with its newest analysis (the result set),
 * or null when the project has no revision: what a thread's proposal or decision is judged on.
 */
export async function getDefaultRevisionResultSet({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<{ revisionId: string; revision: number; analysisRunId: string | null } | null> {
  const [row] = await db
    .select({ revisionId: modelRevisions.id, revision: modelRevisions.number, analysisRunId: analysisRuns.id })
    .from(modelRevisions)
    .leftJoin(analysisRuns, eq(analysisRuns.revisionId, modelRevisions.id))
    .where(eq(modelRevisions.projectId, projectId))
    .orderBy(desc(modelRevisions.isCurrent), desc(modelRevisions.number), desc(analysisRuns.createdAt))
    .limit(1);
  return row ?? null;
}

/** A revision's id and the status of its newest analysis (null while none is stored), or null when it does not exist. */
/**
 * The newest analysis run of a revision by number, for the whole-roof any-load job: its id and status, and whether
 * its review already holds the certificate.
 */
export async function getRevisionForAnyLoad(db: Executor, { projectId, number }: { projectId: string; number: number }) {
  const [row] = await db
    .select({ revisionId: modelRevisions.id, runId: analysisRuns.id, status: analysisRuns.status, certified: sql<boolean>`(${analysisRuns.review} -> 'anyLoad') is not null` })
    .from(modelRevisions)
    .leftJoin(analysisRuns, eq(analysisRuns.revisionId, modelRevisions.id))
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  return row ?? null;
}

/** An analysis run with its review, for the any-load job; null when gone. */
export async function getAnalysisRunForAnyLoad({ runId, db = getDb() }: { runId: string; db?: Executor }) {
  const [row] = await db
    .select({ result: analysisRuns.result, hasReview: sql<boolean>`${analysisRuns.review} is not null`, model: modelRevisions.model, standard: projects.designStandard })
    .from(analysisRuns)
    .innerJoin(modelRevisions, eq(modelRevisions.id, analysisRuns.revisionId))
    .innerJoin(projects, eq(projects.id, modelRevisions.projectId))
    .where(eq(analysisRuns.id, runId))
    .limit(1);
  return row ?? null;
}

/**
 * Puts the any-load certificate into a stored review: the run's summary under `anyLoad` and each member's row under
 * `members.<id>.anyLoad`, in one statement. False when the run or its review is gone.
 */
export async function setReviewAnyLoad(db: Executor, { runId, anyLoad, members }: { runId: string; anyLoad: unknown; members: Record<string, unknown> }): Promise<boolean> {
  const rows = await db
    .update(analysisRuns)
    .set({
      review: sql`jsonb_set(jsonb_set(${analysisRuns.review}, '{anyLoad}', ${JSON.stringify(anyLoad)}::jsonb), '{members}', (
        select coalesce(jsonb_object_agg(m.key, m.value || jsonb_build_object('anyLoad', ${JSON.stringify(members)}::jsonb -> m.key)), '{}'::jsonb)
        from jsonb_each(${analysisRuns.review} -> 'members') as m))`,
    })
    .where(and(eq(analysisRuns.id, runId), sql`${analysisRuns.review} is not null`))
    .returning({ id: analysisRuns.id });
  return rows.length === 1;
}

export async function getRevisionAnalysisStatus(db: Executor, { projectId, number }: { projectId: string; number: number }): Promise<{ id: string; status: "ok" | "unstable" | null } | null> {
  const [row] = await db
    .select({ id: modelRevisions.id, status: analysisRuns.status })
    .from(modelRevisions)
    .leftJoin(analysisRuns, eq(analysisRuns.revisionId, modelRevisions.id))
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  return row ? { id: row.id, status: row.status ?? null } : null;
}

/** What a report request is checked against, without loading the model or results: the revision's id, its analysis status and its result ids. */
export async function getRevisionResultIds({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<{
  id: string;
  status: "ok" | "unstable" | null;
  loadCases: string[];
  combinations: string[];
} | null> {
  const [row] = await db
    .select({
      id: modelRevisions.id,
      status: analysisRuns.status,
      loadCases: sql<string[]>`jsonb_path_query_array(${modelRevisions.model}, '$.loadCases[*].id')`,
      combinations: sql<string[]>`jsonb_path_query_array(${modelRevisions.model}, '$.combinations[*].id')`,
    })
    .from(modelRevisions)
    .leftJoin(analysisRuns, eq(analysisRuns.revisionId, modelRevisions.id))
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  return row ? { ...row, status: row.status ?? null } : null;
}
