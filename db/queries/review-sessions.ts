import "server-only";
import { and, eq, isNull } from "drizzle-orm";
import { getDb } from "../client";
import { reviewSessions, users } from "../schema";
import type { PresentedReviewSession, SessionView } from "../../lib/realtime/events";

async function present(row: typeof reviewSessions.$inferSelect | undefined): Promise<PresentedReviewSession | null> {
  if (!row) return null;
  const [presenter] = await getDb().select({ name: users.name }).from(users).where(eq(users.id, row.presenterId));
  return { id: row.id, presenterId: row.presenterId, presenterName: presenter?.name ?? "", view: row.view, startedAt: row.startedAt.toISOString() };
}

/** The project's live review session, or null when nobody is presenting. */
export async function getLiveSession({ projectId }: { projectId: string }) {
  const [row] = await getDb()
    .select()
    .from(reviewSessions)
    .where(and(eq(reviewSessions.projectId, projectId), isNull(reviewSessions.endedAt)));
  return present(row);
}

/**
 * Starts a session presented by the user, or returns the live one unchanged (the unique partial index keeps one
 * live session per project even with several realtime nodes).
 */
export async function startSession({ projectId, presenterId }: { projectId: string; presenterId: string }) {
  await getDb().insert(reviewSessions).values({ projectId, presenterId }).onConflictDoNothing();
  return getLiveSession({ projectId });
}

/** Hands the live session to another presenter; null when there is no live session. */
export async function handOverSession({ projectId, toUserId }: { projectId: string; toUserId: string }) {
  const [row] = await getDb()
    .update(reviewSessions)
    .set({ presenterId: toUserId })
    .where(and(eq(reviewSessions.projectId, projectId), isNull(reviewSessions.endedAt)))
    .returning();
  return present(row);
}

/** Ends the live session of the project. */
export async function endSession({ projectId }: { projectId: string }) {
  await getDb()
    .update(reviewSessions)
    .set({ endedAt: new Date() })
    .where(and(eq(reviewSessions.projectId, projectId), isNull(reviewSessions.endedAt)));
}

/** Remembers the presenter's latest view so late joiners and reconnecting followers start there. */
export async function saveSessionView({ projectId, presenterId, view }: { projectId: string; presenterId: string; view: SessionView }) {
  await getDb()
    .update(reviewSessions)
    .set({ view })
    .where(and(eq(reviewSessions.projectId, projectId), eq(reviewSessions.presenterId, presenterId), isNull(reviewSessions.endedAt)));
}
