import "server-only";
import { and, asc, eq, gt, sql } from "drizzle-orm";
import * as Y from "yjs";
import { getDb } from "../client";
import { yjsUpdates } from "../schema";

/** Appends one Yjs update of the project's live document. */
export async function appendYjsUpdate({ projectId, update }: { projectId: string; update: Uint8Array }) {
  await getDb().insert(yjsUpdates).values({ projectId, update });
}

/** Every stored update of the project's document, in write order. */
export async function loadYjsUpdates({ projectId }: { projectId: string }) {
  const rows = await getDb()
    .select({ id: yjsUpdates.id, update: yjsUpdates.update })
    .from(yjsUpdates)
    .where(eq(yjsUpdates.projectId, projectId))
    .orderBy(asc(yjsUpdates.id));
  return rows;
}

/** Rows settled this long ago cannot be overtaken by a row with a lower id that commits later. */
const SETTLED_AFTER = sql`interval '5 seconds'`;

/**
 * The project's updates stored after row afterId, in id order, each saying whether it is settled (old enough that
 * no row with a lower id can still commit): a reader moves its mark only past settled rows.
 */
export async function loadYjsUpdatesAfter({ projectId, afterId }: { projectId: string; afterId: number }) {
  return getDb()
    .select({ id: yjsUpdates.id, update: yjsUpdates.update, settled: sql<boolean>`${yjsUpdates.createdAt} < now() - ${SETTLED_AFTER}` })
    .from(yjsUpdates)
    .where(and(eq(yjsUpdates.projectId, projectId), gt(yjsUpdates.id, afterId)))
    .orderBy(asc(yjsUpdates.id));
}

/**
 * Merges the project's stored updates up to now into one compacted row, in one transaction. Rows written
 * meanwhile (by this or another realtime node) have higher ids and are left alone, so nothing is lost.
 * Only one realtime node compacts a document at a time (a transaction-scoped advisory lock on the project; a node
 * that does not get it skips this round). Returns how many rows were merged.
 */
export async function compactYjsUpdates({ projectId }: { projectId: string }) {
  return getDb().transaction(async (tx) => {
    const lock = await tx.execute<{ locked: boolean }>(sql`select pg_try_advisory_xact_lock(hashtextextended(${`yjs-compact:${projectId}`}, 0)) as locked`);
    if (!lock.rows[0].locked) return 0;
    const rows = await tx
      .select({ id: yjsUpdates.id, update: yjsUpdates.update })
      .from(yjsUpdates)
      .where(eq(yjsUpdates.projectId, projectId))
      .orderBy(asc(yjsUpdates.id))
      .for("update");
    if (rows.length < 2) return 0;
    const merged = Y.mergeUpdates(rows.map((row) => row.update));
    // Delete exactly the rows read: an id range could catch a row another transaction committed late.
    const ids = rows.map((row) => row.id);
    await tx.delete(yjsUpdates).where(and(eq(yjsUpdates.projectId, projectId), sql`${yjsUpdates.id} = any(${sql.param(ids)}::bigint[])`));
    await tx.insert(yjsUpdates).values({ projectId, update: merged, compacted: true });
    return rows.length;
  });
}
