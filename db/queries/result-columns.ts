import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { analysisRuns, modelRevisions, resultColumns, type AnalysisRun } from "@/db/schema";
import type { StoredMemberReview } from "@/lib/models/analyse";

// Typed by the stored column (db/schema), so this file needs nothing from the analysis code.
type EnvelopeEntry = AnalysisRun["result"]["envelope"][string];

type RevisionKey = { projectId: string; number: number; db?: Executor };

/** The newest analysis run of a revision by number (id only), or null when the revision or run does not exist. */
async function newestRun({ projectId, number, db = getDb() }: RevisionKey): Promise<{ runId: string; revisionId: string } | null> {
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
 * every result (read by offset, so no whole column leaves the database), and its envelope, governing results and
 * review entry from the run's JSON. Null when the revision, its analysis or the member is missing.
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
  return { ...run, ...member, index: k, results };
}
