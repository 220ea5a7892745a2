import "server-only";
import { and, asc, desc, eq, isNull, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { analysisRuns, modelRevisions, resultColumns, type AnalysisRun, type ModelRevision } from "@/db/schema";
import type { StoredMemberReview } from "@/lib/models/analyse";
import type { ResultColumns, RunColumns } from "@/lib/models/result-columns";

// Typed by the stored columns (db/schema), so this file needs nothing from the analysis code.
type EnvelopeEntry = AnalysisRun["result"]["envelope"][string];
type TrussModel = ModelRevision["model"];
type AnalysisResult = AnalysisRun["result"];
type StoredReview = NonNullable<AnalysisRun["review"]>;

/** The columns of a run (lib/models/result-columns.ts encodeResultColumns), stored beside its JSON. */
export type StoredColumns = { results: ResultColumns[]; run: RunColumns };

/** Rows per insert of result columns: a few hundred combinations of a big roof stay well under pg's parameter cap. */
const COLUMN_ROWS_PER_INSERT = 50;
const bytes = (values: Float32Array) => new Uint8Array(values.buffer, values.byteOffset, values.byteLength);

/** A run's own columns (utilisation, verdicts, zero-in-all) as the analysis_runs row holds them. */
export function runColumnValues({ run }: StoredColumns) {
  return { utilisation: run.utilisation ? bytes(run.utilisation) : null, verdicts: run.verdicts, zeroInAll: run.zeroInAll };
}

/** Stores the columns of a run stored before results were kept as columns: its own, and one row per result. */
export async function storeRunColumns(tx: Executor, { runId, columns }: { runId: string; columns: StoredColumns }): Promise<void> {
  await tx.update(analysisRuns).set(runColumnValues(columns)).where(eq(analysisRuns.id, runId));
  await insertResultColumns(tx, { runId, results: columns.results });
}

/** Inserts one row of columns per result of a run. */
export async function insertResultColumns(tx: Executor, { runId, results }: { runId: string; results: ResultColumns[] }): Promise<void> {
  for (let start = 0; start < results.length; start += COLUMN_ROWS_PER_INSERT) {
    const rows = results.slice(start, start + COLUMN_ROWS_PER_INSERT).map((result) => ({
      analysisRunId: runId,
      resultId: result.resultId,
      forces: bytes(result.forces),
      zero: result.zero,
      displacements: bytes(result.displacements),
    }));
    await tx.insert(resultColumns).values(rows);
  }
}

/** The oldest run stored before results were kept as columns (its zero-in-all column is empty), with its model. */
export async function getRunWithoutColumns({ db = getDb() }: { db?: Executor } = {}): Promise<{ runId: string; model: TrussModel; result: AnalysisResult; review: StoredReview | null } | null> {
  const [row] = await db
    .select({ runId: analysisRuns.id, model: modelRevisions.model, result: analysisRuns.result, review: analysisRuns.review })
    .from(analysisRuns)
    .innerJoin(modelRevisions, eq(modelRevisions.id, analysisRuns.revisionId))
    .where(isNull(analysisRuns.zeroInAll))
    .orderBy(asc(analysisRuns.createdAt))
    .limit(1);
  return row ?? null;
}


type RevisionKey = { projectId: string; number: number; db?: Executor };

/** The newest analysis run of a revision by number (id only), or null when the revision or run does not exist. */
export async function newestRun({ projectId, number, db = getDb() }: RevisionKey): Promise<{ runId: string; revisionId: string } | null> {
  const [row] = await db
    .select({ runId: analysisRuns.id, revisionId: modelRevisions.id })
    .from(modelRevisions)
    .innerJoin(analysisRuns, eq(analysisRuns.revisionId, modelRevisions.id))
    .where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.number, number)))
    .orderBy(desc(analysisRuns.createdAt))
    .limit(1);
  return row ?? null;
}

/** One result's columns and its run's columns, or null when the revision, its analysis or the result is missing. */
export async function getResultColumns({ resultId, ...key }: RevisionKey & { resultId: string }) {
  const db = key.db ?? getDb();
  const run = await newestRun({ ...key, db });
  if (!run) return null;
  const [row] = await db
    .select({
      forces: resultColumns.forces,
      zero: resultColumns.zero,
      displacements: resultColumns.displacements,
      utilisation: analysisRuns.utilisation,
      verdicts: analysisRuns.verdicts,
      zeroInAll: analysisRuns.zeroInAll,
    })
    .from(resultColumns)
    .innerJoin(analysisRuns, eq(analysisRuns.id, resultColumns.analysisRunId))
    .where(and(eq(resultColumns.analysisRunId, run.runId), eq(resultColumns.resultId, resultId)))
    .limit(1);
  return row ? { ...run, ...row } : null;
}

/**
 * One member's stored numbers: its place in the revision's member order, its force bytes (Float32) and zero bit in
 * every result (read by offset, so no whole column leaves the database), its envelope, governing results and
 * review entry from the run's JSON, and the displacement and reaction of its two end nodes in every result. Null when the revision, its analysis or the member is missing.
 */
export async function getMemberColumns({ memberId, ...key }: RevisionKey & { memberId: string }) {
  const db = key.db ?? getDb();
  const run = await newestRun({ ...key, db });
  if (!run) return null;
  // array_position is 1-based; a member not in the order gives null.
  const [member] = await db
    .select({
      index: sql<number | null>`array_position(${modelRevisions.memberOrder}, ${memberId}::text) - 1`,
      member: sql<{ id: string; i: string; j: string; section: string } | null>`${modelRevisions.model} -> 'members' -> (array_position(${modelRevisions.memberOrder}, ${memberId}::text) - 1)`,
      envelope: sql<EnvelopeEntry | null>`${analysisRuns.result} -> 'envelope' -> ${memberId}::text`,
      governing: sql<{ maxTension: string | null; maxCompression: string | null } | null>`${analysisRuns.result} -> 'info' -> 'governing' -> ${memberId}::text`,
      envelopeOver: sql<string | null>`${analysisRuns.result} -> 'info' ->> 'envelopeOver'`,
      review: sql<StoredMemberReview | null>`${analysisRuns.review} -> 'members' -> ${memberId}::text`,
      standard: sql<string | null>`${analysisRuns.review} ->> 'standard'`,
    })
    .from(analysisRuns)
    .innerJoin(modelRevisions, eq(modelRevisions.id, analysisRuns.revisionId))
    .where(eq(analysisRuns.id, run.runId));
  if (!member || member.index === null) return null;
  const k = member.index;
  const results = await db
    .select({
      resultId: resultColumns.resultId,
      force: sql<Buffer>`substring(${resultColumns.forces} from ${4 * k + 1} for 4)`,
      zeroByte: sql<Buffer>`substring(${resultColumns.zero} from ${(k >> 3) + 1} for 1)`,
    })
    .from(resultColumns)
    .where(eq(resultColumns.analysisRunId, run.runId));
  const ends = member.member ? await getNodeResults({ runId: run.runId, nodeIds: [member.member.i, member.member.j], db }) : [];
  return { ...run, ...member, index: k, results, ends };
}

type Vector = { ux: number; uy: number; uz: number };
type Force = { fx: number; fy: number; fz: number };

/** What the analysis stored at one node in one result: its displacement (m) and, at a support, its reaction (kN). */
export type StoredNodeResult = { resultId: string; nodeId: string; displacement: Vector | null; reaction: Force | null };

/**
 * The displacement and reaction of the named nodes in every result of a run, picked out of the stored JSON in SQL
 * (full double precision; a large stored result never leaves the database whole).
 */
export async function getNodeResults({ runId, nodeIds, db = getDb() }: { runId: string; nodeIds: string[]; db?: Executor }): Promise<StoredNodeResult[]> {
  if (nodeIds.length === 0) return [];
  const ids = JSON.stringify(nodeIds);
  const rows = await db.execute<StoredNodeResult>(sql`
    select r.key as "resultId", n.id as "nodeId", r.value -> 'displacements' -> n.id as displacement, r.value -> 'reactions' -> n.id as reaction
    from ${analysisRuns} a, jsonb_each(a.result -> 'results') r, jsonb_array_elements_text(${ids}::jsonb) as n(id)
    where a.id = ${runId}`);
  return rows.rows;
}
