import "server-only";
import { desc, eq } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { auditEvents } from "@/db/schema";

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
