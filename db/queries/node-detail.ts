import "server-only";
import { sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { modelRevisions } from "@/db/schema";
import { getNodeResults, newestRun } from "./result-columns";

/**
 * One node of a revision's newest analysis: its place, its support (null when free) and its displacement and
 * reaction in every result. Null when the revision, its analysis or the node does not exist.
 */
export async function getNodeDetail({ nodeId, ...key }: { projectId: string; number: number; nodeId: string; db?: Executor }) {
  const db = key.db ?? getDb();
  const run = await newestRun({ ...key, db });
  if (!run) return null;
  const found = await db.execute<{ node: { id: string; x: number; y: number; z: number }; support: { node: string; ux: boolean; uy: boolean; uz: boolean } | null }>(sql`
    select n.value as node,
      (select s.value from jsonb_array_elements(r.model -> 'supports') s where s.value ->> 'node' = ${nodeId}::text limit 1) as support
    from ${modelRevisions} r, jsonb_array_elements(r.model -> 'nodes') n
    where r.id = ${run.revisionId} and n.value ->> 'id' = ${nodeId}::text
    limit 1`);
  const [row] = found.rows;
  if (!row) return null;
  return { ...run, node: row.node, support: row.support, results: await getNodeResults({ runId: run.runId, nodeIds: [nodeId], db }) };
}
