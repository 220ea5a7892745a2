import "server-only";
import { and, desc, eq, isNull } from "drizzle-orm";
import { getDb } from "../client";
import { notifications } from "../schema";
import type { PresentedNotification } from "../../lib/realtime/events";

/** A notification as sent to its recipient. */
export function presentNotification(row: typeof notifications.$inferSelect): PresentedNotification {
  return {
    id: row.id,
    kind: row.kind,
    payload: row.payload,
    readAt: row.readAt?.toISOString() ?? null,
    createdAt: row.createdAt.toISOString(),
  };
}

/** The user's notifications, newest first (unread only when asked). */
export async function listNotificationsForUser({ userId, unreadOnly = false, limit = 100 }: { userId: string; unreadOnly?: boolean; limit?: number }) {
  const conditions = [eq(notifications.userId, userId)];
  if (unreadOnly) conditions.push(isNull(notifications.readAt));
  const rows = await getDb()
    .select()
    .from(notifications)
    .where(and(...conditions))
    .orderBy(desc(notifications.createdAt))
    .limit(limit);
  return rows.map(presentNotification);
}

/** Marks one of the user's notifications read; null when it is not theirs. */
export async function markNotificationRead({ userId, notificationId }: { userId: string; notificationId: string }) {
  const [row] = await getDb()
    .update(notifications)
    .set({ readAt: new Date() })
    .where(and(eq(notifications.id, notificationId), eq(notifications.userId, userId)))
    .returning();
  return row ? presentNotification(row) : null;
}
