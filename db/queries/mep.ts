import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { getDb, type Executor, type Transaction } from "@/db/client";
import { analysisRuns, mepRuns, modelRevisions, type AnalysisRun, type MepRun, type ModelRevision } from "@/db/schema";
import type { Run } from "@/lib/mep/schemas";

// Typed by the stored columns (db/schema), so this file needs nothing from the analysis code.
type Envelope = AnalysisRun["result"]["envelope"];

/** A stored run in the shape of the run schema (plus when it last changed). */
export type RunView = Run & { updatedAt: string };

function toRun(row: MepRun): Run {
  return {
    id: row.runId,
    ...(row.name ? { name: row.name } : {}),
    system: row.system,
    profile: row.profile,
    insulation: row.insulation,
    clearance: row.clearance,
    weightPerMetre: row.weightPerMetre,
    points: row.points,
  };
}

/** The mep_runs row for a run on a revision. */
function runRow(revisionId: string, run: Run, actorId: string | null) {
  return {
    revisionId,
    runId: run.id,
    name: run.name ?? null,
    system: run.system,
    profile: run.profile,
    insulation: run.insulation,
    clearance: run.clearance,
    weightPerMetre: run.weightPerMetre,
    points: run.points,
    createdBy: actorId,
  };
}

/** A revision's id by project and number, without its model (what a request checks before queueing work on it), or null. */
export async function getRevisionRef({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<{ id: string; number: number } | null> {
  const [row] = await db
    .select({ id: modelRevisions.id, number: modelRevisions.number })
    .from(modelRevisions)
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .limit(1);
  return row ?? null;
}

/** What the hang-services job reads of its source revision: number, name and model; null when it is gone. */
export async function getRevisionForHanging({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<Pick<ModelRevision, "id" | "number" | "model"> | null> {
  const [row] = await db.select({ id: modelRevisions.id, number: modelRevisions.number, model: modelRevisions.model }).from(modelRevisions).where(eq(modelRevisions.id, revisionId)).limit(1);
  return row ?? null;
}

/** The revision (id, project, model) by project and number, or null. */
export async function getRevisionForMep({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<Pick<ModelRevision, "id" | "number" | "model"> | null> {
  const [row] = await db
    .select({ id: modelRevisions.id, number: modelRevisions.number, model: modelRevisions.model })
    .from(modelRevisions)
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .limit(1);
  return row ?? null;
}

/** The newest analysis stored with a revision (results and member review), or null. */
export async function getLatestAnalysisForRevision({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }) {
  const [row] = await db.select().from(analysisRuns).where(eq(analysisRuns.revisionId, revisionId)).orderBy(desc(analysisRuns.createdAt)).limit(1);
  return row ?? null;
}

/**
 * What the clash table needs from the newest analysis of a revision: each member's envelope and verdict. Picked
 * out in SQL because the stored result and review (every case, every check) are large to load and parse.
 */
export async function getMemberStatesForRevision({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<{ envelope: Envelope | null; verdicts: unknown; patterns: unknown }> {
  const [row] = await db
    .select({
      envelope: sql<Envelope | null>`${analysisRuns.result} -> 'envelope'`,
      verdicts: sql<unknown>`(select jsonb_object_agg(m.key, m.value -> 'verdict') from jsonb_each(${analysisRuns.review} -> 'members') as m)`,
      // the load cases the verdicts rest on; older reviews kept them under anyLoad
      patterns: sql<unknown>`coalesce(${analysisRuns.review} -> 'analysedPatterns', ${analysisRuns.review} -> 'anyLoad' -> 'patterns')`,
    })
    .from(analysisRuns)
    .where(eq(analysisRuns.revisionId, revisionId))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  return row ?? { envelope: null, verdicts: null, patterns: null };
}

/** Every run of a revision, in id order. */
export async function listRunsByRevision({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<RunView[]> {
  const rows = await db.select().from(mepRuns).where(eq(mepRuns.revisionId, revisionId)).orderBy(asc(mepRuns.runId));
  return rows.map((row) => ({ ...toRun(row), updatedAt: row.updatedAt.toISOString() }));
}

/** Every run of a revision in the run schema's shape, in id order (what clash detection reads). */
export async function listRuns({ db, revisionId }: { db: Executor; revisionId: string }): Promise<Run[]> {
  const rows = await db.select().from(mepRuns).where(eq(mepRuns.revisionId, revisionId)).orderBy(asc(mepRuns.runId));
  return rows.map(toRun);
}

/** Whether a revision has any run. */
export async function revisionHasRuns({ db, revisionId }: { db: Executor; revisionId: string }): Promise<boolean> {
  const [row] = await db.select({ id: mepRuns.id }).from(mepRuns).where(eq(mepRuns.revisionId, revisionId)).limit(1);
  return Boolean(row);
}

/** Removes every run of a revision. */
export async function deleteRunsOfRevision({ db, revisionId }: { db: Executor; revisionId: string }): Promise<void> {
  await db.delete(mepRuns).where(eq(mepRuns.revisionId, revisionId));
}

/** Stores runs on a revision, overwriting a run with the same id. */
export async function upsertRuns({ db, revisionId, runs, actorId }: { db: Executor; revisionId: string; runs: Run[]; actorId: string | null }): Promise<void> {
  for (const run of runs) {
    const row = runRow(revisionId, run, actorId);
    await db
      .insert(mepRuns)
      .values(row)
      .onConflictDoUpdate({ target: [mepRuns.revisionId, mepRuns.runId], set: { name: row.name, system: row.system, profile: row.profile, insulation: row.insulation, clearance: row.clearance, weightPerMetre: row.weightPerMetre, points: row.points } });
  }
}

/** One run of a revision, locked until the transaction ends, or null. */
export async function lockRun({ db, revisionId, runId }: { db: Transaction; revisionId: string; runId: string }): Promise<Run | null> {
  const [row] = await db.select().from(mepRuns).where(and(eq(mepRuns.revisionId, revisionId), eq(mepRuns.runId, runId))).for("update");
  return row ? toRun(row) : null;
}

/** Overwrites the fields of one run (its id stays). */
export async function updateRunRow({ db, revisionId, run }: { db: Executor; revisionId: string; run: Run }): Promise<void> {
  const next = runRow(revisionId, run, null);
  await db
    .update(mepRuns)
    .set({ name: next.name, system: next.system, profile: next.profile, insulation: next.insulation, clearance: next.clearance, weightPerMetre: next.weightPerMetre, points: next.points })
    .where(and(eq(mepRuns.revisionId, revisionId), eq(mepRuns.runId, run.id)));
}

/** Removes one run; answers whether there was one. */
export async function deleteRunRow({ db, revisionId, runId }: { db: Executor; revisionId: string; runId: string }): Promise<boolean> {
  const removed = await db.delete(mepRuns).where(and(eq(mepRuns.revisionId, revisionId), eq(mepRuns.runId, runId))).returning({ id: mepRuns.id });
  return removed.length > 0;
}

/** Copies every run of one revision onto another (same project). */
export async function copyRuns({ db, fromRevisionId, toRevisionId, actorId }: { db: Executor; fromRevisionId: string; toRevisionId: string; actorId: string | null }): Promise<void> {
  const rows = await db.select().from(mepRuns).where(eq(mepRuns.revisionId, fromRevisionId));
  if (rows.length > 0) await db.insert(mepRuns).values(rows.map((row) => runRow(toRevisionId, toRun(row), actorId)));
}
