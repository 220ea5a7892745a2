import "server-only";
import { and, asc, eq, inArray, isNotNull, lte, sql } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { mailOutbox, type NewOutboxMail, type OutboxMail } from "../schema";

/** How long a claimed mail is reserved for the worker that took it before another worker may retry it. */
const CLAIM_LEASE_MS = 2 * 60_000;

/**
 * Queues a mail; pass the transaction that writes what the mail announces so both commit together. A mail whose
 * dedupeKey is already queued is skipped; returns whether a row was written.
 */
export async function enqueueMail({ db = getDb(), mail }: { db?: Executor; mail: NewOutboxMail }): Promise<boolean> {
  const rows = await db.insert(mailOutbox).values(mail).onConflictDoNothing({ target: mailOutbox.dedupeKey }).returning({ id: mailOutbox.id });
  return rows.length > 0;
}

/** Takes up to `limit` pending mails that are due, reserving them for a lease so parallel workers never double-send. */
export async function claimDueMail({ limit, now = new Date() }: { limit: number; now?: Date }): Promise<OutboxMail[]> {
  return getDb().transaction(async (tx) => {
    const due = await tx
      .select()
      .from(mailOutbox)
      .where(and(eq(mailOutbox.state, "pending"), lte(mailOutbox.nextAttemptAt, now)))
      .orderBy(asc(mailOutbox.nextAttemptAt))
      .limit(limit)
      .for("update", { skipLocked: true });
    if (due.length === 0) return [];
    await tx
      .update(mailOutbox)
      .set({ nextAttemptAt: new Date(now.getTime() + CLAIM_LEASE_MS) })
      .where(inArray(mailOutbox.id, due.map((mail) => mail.id)));
    return due;
  });
}

/** Records that the SMTP server accepted the mail. */
export async function markMailSent({ id, messageId }: { id: string; messageId: string }): Promise<void> {
  await getDb()
    .update(mailOutbox)
    .set({ state: "sent", sentAt: new Date(), messageId, attempts: sql`${mailOutbox.attempts} + 1`, lastError: null })
    .where(eq(mailOutbox.id, id));
}

/** Records a failed attempt: retried at nextAttemptAt, or given up (state failed) when that is null. */
export async function markMailAttemptFailed({ id, error, nextAttemptAt }: { id: string; error: string; nextAttemptAt: Date | null }): Promise<void> {
  await getDb()
    .update(mailOutbox)
    .set({
      attempts: sql`${mailOutbox.attempts} + 1`,
      lastError: error.slice(0, 1000),
      ...(nextAttemptAt ? { nextAttemptAt } : { state: "failed" as const }),
    })
    .where(eq(mailOutbox.id, id));
}

/** One queued mail by id (tests and the dev page). */
export async function getOutboxMail({ id }: { id: string }): Promise<OutboxMail | null> {
  const [row] = await getDb().select().from(mailOutbox).where(eq(mailOutbox.id, id));
  return row ?? null;
}

/** Queued mails to an address, newest first (tests and the dev page). */
export function listOutboxMailTo({ toAddress }: { toAddress: string }): Promise<OutboxMail[]> {
  return getDb().select().from(mailOutbox).where(eq(mailOutbox.toAddress, toAddress)).orderBy(sql`${mailOutbox.createdAt} desc`);
}

/** The Message-IDs of the project's mails the SMTP server accepted (the captured-mail page matches on them). */
export async function listSentMessageIds({ projectId }: { projectId: string }): Promise<string[]> {
  const rows = await getDb()
    .select({ messageId: mailOutbox.messageId })
    .from(mailOutbox)
    .where(and(eq(mailOutbox.projectId, projectId), eq(mailOutbox.state, "sent"), isNotNull(mailOutbox.messageId)));
  return rows.flatMap((row) => (row.messageId ? [row.messageId] : []));
}
