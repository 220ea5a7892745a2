import "server-only";
import { and, asc, desc, eq, sql } from "drizzle-orm";
import { getDb, withTransaction, type Executor, type Transaction } from "@/db/client";
import { analysisRuns, mepRuns, modelRevisions, type MepRun } from "@/db/schema";
import type { EnvelopeEntry } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import { ConflictError, NotFoundError, ValidationError, issuesFrom } from "@/lib/http/errors";
import { runSchema, type Run, type RunEdit } from "@/lib/mep/schemas";
import { recordAuditEvent } from "./audit";
import { syncClashes, type DetectionSummary } from "./clashes";
import { carryClashDecisions } from "@/lib/commands/carry-clash-decisions";

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

/** The mep_runs row for a run on a revision (also used by the demo seed). */
export function runRow(revisionId: string, run: Run, actorId: string | null) {
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

/** The revision (id, project, model) by project and number, or null. */
export async function getRevisionForMep({ projectId, number, db = getDb() }: { projectId: string; number: number; db?: Executor }): Promise<{ id: string; number: number; model: TrussModel } | null> {
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
export async function getMemberStatesForRevision({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<{ envelope: Record<string, EnvelopeEntry> | null; verdicts: unknown }> {
  const [row] = await db
    .select({
      envelope: sql<Record<string, EnvelopeEntry> | null>`${analysisRuns.result} -> 'envelope'`,
      verdicts: sql<unknown>`(select jsonb_object_agg(m.key, m.value -> 'verdict') from jsonb_each(${analysisRuns.review} -> 'members') as m)`,
    })
    .from(analysisRuns)
    .where(eq(analysisRuns.revisionId, revisionId))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  return row ?? { envelope: null, verdicts: null };
}

/** Every run of a revision, in id order. */
export async function listRunsByRevision({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<RunView[]> {
  const rows = await db.select().from(mepRuns).where(eq(mepRuns.revisionId, revisionId)).orderBy(asc(mepRuns.runId));
  return rows.map((row) => ({ ...toRun(row), updatedAt: row.updatedAt.toISOString() }));
}

async function redetect(tx: Transaction, projectId: string, revision: { id: string; model: TrussModel }): Promise<DetectionSummary> {
  const rows = await tx.select().from(mepRuns).where(eq(mepRuns.revisionId, revision.id)).orderBy(asc(mepRuns.runId));
  const runs = rows.map(toRun);
  return syncClashes({ db: tx, projectId, revisionId: revision.id, model: revision.model, runs });
}

/**
 * Stores imported runs on a revision — "replace" drops the revision's other runs, "upsert" keeps them and
 * overwrites runs with the same id — and re-runs clash detection, all in one transaction; `alsoWrite` adds rows
 * in the same transaction (the record of the imported file).
 */
export async function importRuns({
  projectId,
  revision,
  runs,
  mode,
  actorId,
  alsoWrite,
}: {
  projectId: string;
  revision: { id: string; model: TrussModel };
  runs: Run[];
  mode: "replace" | "upsert";
  actorId: string | null;
  alsoWrite?: (tx: Transaction) => Promise<unknown>;
}): Promise<DetectionSummary> {
  return withTransaction(async (tx) => {
    await alsoWrite?.(tx);
    if (mode === "replace") await tx.delete(mepRuns).where(eq(mepRuns.revisionId, revision.id));
    for (const run of runs) {
      const row = runRow(revision.id, run, actorId);
      await tx
        .insert(mepRuns)
        .values(row)
        .onConflictDoUpdate({ target: [mepRuns.revisionId, mepRuns.runId], set: { name: row.name, system: row.system, profile: row.profile, insulation: row.insulation, clearance: row.clearance, weightPerMetre: row.weightPerMetre, points: row.points } });
    }
    const summary = await redetect(tx, projectId, revision);
    await recordAuditEvent({ db: tx, projectId, actorId, action: "runs.import", subjectType: "model_revision", subjectId: revision.id, details: { mode, runs: runs.map((r) => r.id), ...summary } });
    return summary;
  });
}

/** Applies an edit to one run (validated as a whole run again) and re-runs clash detection, in one transaction. */
export async function updateRun({ projectId, revision, runId, edit, actorId }: { projectId: string; revision: { id: string; model: TrussModel }; runId: string; edit: RunEdit; actorId: string }): Promise<{ run: Run; detection: DetectionSummary }> {
  return withTransaction(async (tx) => {
    const [row] = await tx.select().from(mepRuns).where(and(eq(mepRuns.revisionId, revision.id), eq(mepRuns.runId, runId))).for("update");
    if (!row) throw new NotFoundError("No such run on this revision.");
    const merged = runSchema.safeParse({ ...toRun(row), ...edit });
    if (!merged.success) throw new ValidationError(issuesFrom(merged.error));
    const run = merged.data;
    const next = runRow(revision.id, run, row.createdBy);
    await tx.update(mepRuns).set({ name: next.name, system: next.system, profile: next.profile, insulation: next.insulation, clearance: next.clearance, weightPerMetre: next.weightPerMetre, points: next.points }).where(eq(mepRuns.id, row.id));
    const detection = await redetect(tx, projectId, revision);
    await recordAuditEvent({ db: tx, projectId, actorId, action: "runs.edit", subjectType: "mep_run", subjectId: `${revision.id}/${runId}`, details: { fields: Object.keys(edit), ...detection } });
    return { run, detection };
  });
}

/** Removes one run and re-runs clash detection (its clashes become cleared, keeping their decisions). */
export async function deleteRun({ projectId, revision, runId, actorId }: { projectId: string; revision: { id: string; model: TrussModel }; runId: string; actorId: string }): Promise<DetectionSummary> {
  return withTransaction(async (tx) => {
    const removed = await tx.delete(mepRuns).where(and(eq(mepRuns.revisionId, revision.id), eq(mepRuns.runId, runId))).returning({ id: mepRuns.id });
    if (removed.length === 0) throw new NotFoundError("No such run on this revision.");
    const detection = await redetect(tx, projectId, revision);
    await recordAuditEvent({ db: tx, projectId, actorId, action: "runs.delete", subjectType: "mep_run", subjectId: `${revision.id}/${runId}`, details: { ...detection } });
    return detection;
  });
}

/** Re-runs clash detection on a revision's stored runs (after a model change or on request). */
export async function redetectClashes({ projectId, revision, actorId }: { projectId: string; revision: { id: string; model: TrussModel }; actorId: string | null }): Promise<DetectionSummary> {
  return withTransaction(async (tx) => {
    const detection = await redetect(tx, projectId, revision);
    await recordAuditEvent({ db: tx, projectId, actorId, action: "clashes.detect", subjectType: "model_revision", subjectId: revision.id, details: { ...detection } });
    return detection;
  });
}

/** Brings another revision's runs onto a revision that has none (after a model change) and detects its clashes. */
export async function copyRunsToRevision({ projectId, fromRevisionId, toRevision, actorId }: { projectId: string; fromRevisionId: string; toRevision: { id: string; model: TrussModel }; actorId: string }): Promise<DetectionSummary> {
  return withTransaction(async (tx) => {
    const [existing] = await tx.select({ id: mepRuns.id }).from(mepRuns).where(eq(mepRuns.revisionId, toRevision.id)).limit(1);
    if (existing) throw new ConflictError("This revision already has runs; import or edit them instead.");
    const detection = await carryRunsForward({ projectId, fromRevisionId, toRevision, actorId, db: tx });
    await recordAuditEvent({ db: tx, projectId, actorId, action: "runs.copy", subjectType: "model_revision", subjectId: toRevision.id, details: { fromRevisionId, ...detection } });
    return detection;
  });
}

/**
 * Copies a revision's runs onto a newer revision of the same project and detects clashes there, so a model change
 * keeps the services (clash ids, and so threads, carry over where the same member and segment still clash).
 */
export async function carryRunsForward({ projectId, fromRevisionId, toRevision, actorId, db }: { projectId: string; fromRevisionId: string; toRevision: { id: string; model: TrussModel }; actorId: string | null; db: Transaction }): Promise<DetectionSummary> {
  const runs = await db.select().from(mepRuns).where(eq(mepRuns.revisionId, fromRevisionId));
  if (runs.length > 0) await db.insert(mepRuns).values(runs.map((row) => runRow(toRevision.id, toRun(row), actorId)));
  const detection = await redetect(db, projectId, toRevision);
  await carryClashDecisions(db, { projectId, fromRevisionId, toRevision, actorId });
  return detection;
}

/**
 * Carries the runs of the revision just before a newly stored one (number − 1, the latest previous revision) onto
 * it and detects its clashes, inside the transaction that stores it; a first revision has nothing to carry.
 */
export async function carryPreviousRunsForward({ projectId, revision, model, actorId, db }: { projectId: string; revision: { id: string; number: number }; model: TrussModel; actorId: string | null; db: Transaction }): Promise<DetectionSummary | null> {
  const previous = await getRevisionForMep({ projectId, number: revision.number - 1, db });
  if (!previous) return null;
  return carryRunsForward({ projectId, fromRevisionId: previous.id, toRevision: { id: revision.id, model }, actorId, db });
}
