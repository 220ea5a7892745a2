import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { auditEvents, users } from "@/db/schema";

export type AuditInput = {
  projectId: string | null;
  actorId: string | null;
  action: string;
  subjectType: string;
  subjectId: string;
  details?: Record<string, unknown>;
};

/** Records who did what to which subject; pass the transaction so the event commits with the change. */
export async function recordAuditEvent({ db = getDb(), ...event }: AuditInput & { db?: Executor }): Promise<void> {
  await db.insert(auditEvents).values({ ...event, details: event.details ?? {} });
}

/** The latest audit events of a project, newest first. */
export function listAuditEventsByProject({ projectId, limit = 100, db = getDb() }: { projectId: string; limit?: number; db?: Executor }) {
  return db.select().from(auditEvents).where(eq(auditEvents.projectId, projectId)).orderBy(desc(auditEvents.createdAt)).limit(limit);
}

/** The newest audit event of an action on a subject, with the actor's name, or null (e.g. who made a revision current, and when). */
export async function getLatestAuditEvent({ projectId, action, subjectId, db = getDb() }: { projectId: string; action: string; subjectId: string; db?: Executor }): Promise<{ by: string | null; at: string } | null> {
  const [row] = await db
    .select({ by: users.name, at: auditEvents.createdAt })
    .from(auditEvents)
    .leftJoin(users, eq(users.id, auditEvents.actorId))
    .where(and(eq(auditEvents.projectId, projectId), eq(auditEvents.action, action), eq(auditEvents.subjectId, subjectId)))
    .orderBy(desc(auditEvents.createdAt))
    .limit(1);
  return row ? { by: row.by, at: row.at.toISOString() } : null;
}
