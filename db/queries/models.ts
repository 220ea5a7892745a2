import "server-only";
import { and, asc, desc, eq, max } from "drizzle-orm";
import { getDb, withTransaction, type Executor, type Transaction } from "@/db/client";
import { analysisRuns, attachments, modelRevisions, users, type ModelRevision } from "@/db/schema";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import type { StoredReview } from "@/lib/models/analyse";
import { recordAuditEvent } from "./audit";

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
  /** The uploaded original file(s) kept in object storage, downloadable through the attachments route. */
  originals: { id: string; filename: string }[];
};

/** A revision with its model and the stored analysis and review. */
export type RevisionWithResults = Omit<RevisionSummary, "analysisStatus" | "originals"> & {
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
      model: modelRevisions.model,
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
      memberCount: row.model.members.length,
      analysisStatus: row.status,
      originals: originals.filter((file) => file.revisionId === row.id).map(({ id, filename }) => ({ id, filename })),
    }));
}

/** The number of the newest revision of a project, or null when it has none. */
export async function getLatestRevisionNumber({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<number | null> {
  const [row] = await db.select({ latest: max(modelRevisions.number) }).from(modelRevisions).where(eq(modelRevisions.projectId, projectId));
  return row?.latest ?? null;
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
  return {
    id: r.id,
    number: r.number,
    name: r.name,
    source: r.source,
    createdAt: r.createdAt.toISOString(),
    createdBy: revision.createdBy,
    memberCount: r.model.members.length,
    model: r.model,
    analysis: run ? { id: run.id, status: run.status, result: run.result, review: run.review, createdAt: run.createdAt.toISOString() } : null,
  };
}

export type CreateRevisionInput = {
  projectId: string;
  name: string;
  model: TrussModel;
  source: ModelRevision["source"];
  createdBy: string | null;
  result: AnalysisResult;
  review: StoredReview | null;
};

/** Inserts the next revision of the project with its analysis run and an audit event, inside the given transaction. */
export async function insertRevisionWithAnalysis(tx: Executor, input: CreateRevisionInput): Promise<{ id: string; number: number }> {
  const [row] = await tx.select({ latest: max(modelRevisions.number) }).from(modelRevisions).where(eq(modelRevisions.projectId, input.projectId));
  const number = (row?.latest ?? 0) + 1;
  const [revision] = await tx
    .insert(modelRevisions)
    .values({ projectId: input.projectId, number, name: input.name, model: input.model, source: input.source, createdBy: input.createdBy })
    .returning({ id: modelRevisions.id, number: modelRevisions.number });
  await tx.insert(analysisRuns).values({ revisionId: revision.id, status: input.result.status, result: input.result, review: input.review });
  await recordAuditEvent({
    db: tx,
    projectId: input.projectId,
    actorId: input.createdBy,
    action: "model.revision.create",
    subjectType: "model_revision",
    subjectId: revision.id,
    details: { number, name: input.name, source: input.source, status: input.result.status },
  });
  return revision;
}

/**
 * Stores a new revision (next number of the project) with its analysis run and an audit event, in one
 * transaction; `alsoWrite` adds rows that belong to the new revision in the same transaction (the records of its
 * uploaded original files). A concurrent save that takes the same number fails the unique index and is retried once.
 */
export async function createRevisionWithAnalysis(
  input: CreateRevisionInput,
  alsoWrite?: (tx: Transaction, revision: { id: string; number: number }) => Promise<unknown>,
): Promise<{ id: string; number: number }> {
  const attempt = () =>
    withTransaction(async (tx) => {
      const revision = await insertRevisionWithAnalysis(tx, input);
      await alsoWrite?.(tx, revision);
      return revision;
    });
  try {
    return await attempt();
  } catch (error) {
    // drizzle wraps the pg error; 23505 is PostgreSQL's unique_violation.
    const pgError = error as { cause?: { code?: string }; code?: string };
    if ((pgError.cause?.code ?? pgError.code) === "23505") return attempt();
    throw error;
  }
}
