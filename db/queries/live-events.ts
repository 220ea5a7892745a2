import "server-only";
import { asc, inArray, isNull, sql } from "drizzle-orm";
import type { Executor, Transaction } from "@/db/client";
import { liveEvents, type LiveEventRow } from "@/db/schema";
import { LIVE_EVENTS_CHANNEL, type LiveEventKind } from "@/lib/realtime/live-events";

/** Writes a live event and notifies the realtime server; pass the command's transaction (NOTIFY fires on commit). */
export async function insertLiveEvent({ db, projectId, kind, subjectId, revision = null }: { db: Executor; projectId: string; kind: LiveEventKind; subjectId: string; revision?: number | null }) {
  await db.insert(liveEvents).values({ projectId, kind, subjectId, revision });
  await db.execute(sql`select pg_notify(${LIVE_EVENTS_CHANNEL}, ${projectId})`);
}

/** Locks up to `limit` unpublished events, oldest first (another node's claim is skipped, not waited for). */
export function lockUnpublishedLiveEvents({ db, limit }: { db: Transaction; limit: number }): Promise<LiveEventRow[]> {
  return db.select().from(liveEvents).where(isNull(liveEvents.publishedAt)).orderBy(asc(liveEvents.id)).limit(limit).for("update", { skipLocked: true });
}

/** Marks events published. */
export async function markLiveEventsPublished({ db, ids }: { db: Executor; ids: number[] }) {
  if (ids.length > 0) await db.update(liveEvents).set({ publishedAt: sql`now()` }).where(inArray(liveEvents.id, ids));
}
