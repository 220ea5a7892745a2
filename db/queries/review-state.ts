import "server-only";
import { and, count, desc, eq, isNotNull, sql } from "drizzle-orm";
import type { Executor } from "../client";
import { clashes, modelRevisions, pins, reviewSessions, users } from "../schema";

type PinState = (typeof pins.$inferSelect)["state"];
type ClashOutcome = NonNullable<(typeof clashes.$inferSelect)["outcome"]>;

export type ReviewState = {
  threads: Record<PinState, number>;
  /** The revision under review: the one marked current, else the newest; null before the first revision. */
  revision: { number: number; name: string; isCurrent: boolean; createdAt: string } | null;
  /** Active clashes on that revision by outcome (null: nothing proposed yet), and how many need another look. */
  clashes: { byOutcome: { outcome: ClashOutcome | null; count: number }[]; needsAnotherLook: number; total: number };
  lastSession: { presenterName: string; startedAt: string; endedAt: string | null } | null;
};

/** Where a project's review stands, for its overview page: four small aggregate reads. */
export async function getReviewState({ db, projectId }: { db: Executor; projectId: string }): Promise<ReviewState> {
  const [threadRows, [revision], [session]] = await Promise.all([
    db.select({ state: pins.state, count: count() }).from(pins).where(eq(pins.projectId, projectId)).groupBy(pins.state),
    db
      .select({ id: modelRevisions.id, number: modelRevisions.number, name: modelRevisions.name, isCurrent: modelRevisions.isCurrent, createdAt: modelRevisions.createdAt })
      .from(modelRevisions)
      .where(eq(modelRevisions.projectId, projectId))
      .orderBy(desc(modelRevisions.isCurrent), desc(modelRevisions.number))
      .limit(1),
    db
      .select({ presenterName: users.name, startedAt: reviewSessions.startedAt, endedAt: reviewSessions.endedAt })
      .from(reviewSessions)
      .innerJoin(users, eq(users.id, reviewSessions.presenterId))
      .where(eq(reviewSessions.projectId, projectId))
      .orderBy(desc(reviewSessions.startedAt))
      .limit(1),
  ]);
  const threads: Record<PinState, number> = { open: 0, answered: 0, closed: 0 };
  for (const row of threadRows) threads[row.state] = row.count;

  const onRevision = revision ? and(eq(clashes.revisionId, revision.id), eq(clashes.status, "active")) : sql`false`;
  const [byOutcome, [recheck]] = await Promise.all([
    db.select({ outcome: clashes.outcome, count: count() }).from(clashes).where(onRevision).groupBy(clashes.outcome),
    db.select({ count: count() }).from(clashes).where(and(onRevision, isNotNull(clashes.recheckReason))),
  ]);
  return {
    threads,
    revision: revision ? { number: revision.number, name: revision.name, isCurrent: revision.isCurrent, createdAt: revision.createdAt.toISOString() } : null,
    clashes: { byOutcome, needsAnotherLook: recheck?.count ?? 0, total: byOutcome.reduce((sum, row) => sum + row.count, 0) },
    lastSession: session ? { presenterName: session.presenterName, startedAt: session.startedAt.toISOString(), endedAt: session.endedAt?.toISOString() ?? null } : null,
  };
}
