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
 * What a clash list shows of the clashed members under the revision's latest analysis: their envelope entries and
 * verdicts, read for those members only, and the load patterns the verdicts rest on (from the review's overview). The
 * whole envelope and the review's members are megabytes on a big roof: walking them for every clash list (each viewer
 * opening asks for one) kept PostgreSQL busy for most of a second on a 60 × 60 roof (issue 13 navigation).
 */
export async function getMemberStatesForRevision({ revisionId, memberIds, db = getDb() }: { revisionId: string; memberIds: readonly string[]; db?: Executor }): Promise<{ envelope: Envelope | null; verdicts: unknown; patterns: unknown }> {
  const [run] = await db
    .select({
      id: analysisRuns.id,
      // the load cases the verdicts rest on; older reviews kept them under anyLoad
      patterns: sql<unknown>`coalesce(${analysisRuns.reviewOverview} -> 'analysedPatterns', ${analysisRuns.reviewOverview} -> 'anyLoad' -> 'patterns')`,
    })
    .from(analysisRuns)
    .where(eq(analysisRuns.revisionId, revisionId))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  if (!run) return { envelope: null, verdicts: null, patterns: null };
  if (memberIds.length === 0) return { envelope: {}, verdicts: {}, patterns: run.patterns };
  // `offset 0` keeps the inner select from being folded into the outer one, so each document is decompressed once,
  // not once per member looked up. The ids travel as one JSON parameter, however many clashes there are.
  const ids = JSON.stringify([...new Set(memberIds)]);
  const { rows } = await db.execute<{ envelope: Envelope | null; verdicts: unknown }>(sql`
    select
      (select jsonb_object_agg(id, whole.envelope -> id) from jsonb_array_elements_text(${ids}::jsonb) as id where whole.envelope ? id) as envelope,
      (select jsonb_object_agg(id, whole.members -> id -> 'verdict') from jsonb_array_elements_text(${ids}::jsonb) as id where whole.members ? id) as verdicts
    from (select result -> 'envelope' as envelope, review -> 'members' as members from ${analysisRuns} where id = ${run.id} offset 0) as whole`);
  return { envelope: rows[0]?.envelope ?? {}, verdicts: rows[0]?.verdicts ?? {}, patterns: run.patterns };
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
