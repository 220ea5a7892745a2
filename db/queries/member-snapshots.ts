import "server-only";
import { desc, eq, sql } from "drizzle-orm";
import type { Executor } from "@/db/client";
import { analysisRuns, modelRevisions, type ModelRevision } from "@/db/schema";

export type MemberResults = {
  id: string;
  analysisRunId: string;
  results: Record<string, { force: number; zero: boolean }>;
  verdict: string | null;
  utilisation: number | null;
};

/**
 * The newest analysis of a revision, for the named members only: force and zero flag in every result, verdict and
 * utilisation. Picked out in SQL so a large stored result is never loaded whole.
 */
export async function getMemberResults({ db, revisionId, memberIds }: { db: Executor; revisionId: string; memberIds: string[] }): Promise<Map<string, MemberResults>> {
  const found = new Map<string, MemberResults>();
  if (memberIds.length === 0) return found;
  const [run] = await db.select({ id: analysisRuns.id }).from(analysisRuns).where(eq(analysisRuns.revisionId, revisionId)).orderBy(desc(analysisRuns.createdAt)).limit(1);
  if (!run) return found;
  const ids = JSON.stringify(memberIds);
  const forces = await db.execute<{ member: string; result: string; force: number | null; zero: boolean }>(sql`
    select m.id as member, r.key as result, (r.value -> 'memberForces' ->> m.id)::float8 as force, (r.value -> 'zeroForceMembers') ? m.id as zero
    from ${analysisRuns} a, jsonb_each(a.result -> 'results') r, jsonb_array_elements_text(${ids}::jsonb) as m(id)
    where a.id = ${run.id} and r.value -> 'memberForces' ? m.id`);
  const reviews = await db.execute<{ member: string; verdict: string | null; utilisation: number | null }>(sql`
    select m.id as member, a.review -> 'members' -> m.id ->> 'verdict' as verdict, (a.review -> 'members' -> m.id ->> 'utilisation')::float8 as utilisation
    from ${analysisRuns} a, jsonb_array_elements_text(${ids}::jsonb) as m(id)
    where a.id = ${run.id}`);
  for (const row of forces.rows) {
    const entry = found.get(row.member) ?? { id: row.member, analysisRunId: run.id, results: {}, verdict: null, utilisation: null };
    entry.results[row.result] = { force: row.force ?? 0, zero: row.zero };
    found.set(row.member, entry);
  }
  for (const row of reviews.rows) {
    const entry = found.get(row.member);
    if (entry) Object.assign(entry, { verdict: row.verdict, utilisation: row.utilisation });
  }
  return found;
}

/** A revision's number and model by id, or null. */
export async function getRevisionModelById(db: Executor, revisionId: string): Promise<{ number: number; model: ModelRevision["model"] } | null> {
  const [row] = await db.select({ number: modelRevisions.number, model: modelRevisions.model }).from(modelRevisions).where(eq(modelRevisions.id, revisionId));
  return row ?? null;
}
