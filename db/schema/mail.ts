// Outgoing mail: written in the same transaction as what it announces, sent later by the jobs process with
// retries (server/jobs/mail-outbox.ts), so a mail server that is down never loses a comment, decision or invitation.
import { index, integer, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { projects, timestamps } from "./core";

export const MAIL_KINDS = ["invitation", "mention", "proposal", "decision", "recheck", "digest"] as const;
export const mailKind = pgEnum("mail_kind", MAIL_KINDS);
/** pending: waiting to be sent (again); sent: the SMTP server accepted it; failed: gave up after the last retry. */
export const MAIL_STATES = ["pending", "sent", "failed"] as const;
export const mailState = pgEnum("mail_state", MAIL_STATES);

export const mailOutbox = pgTable(
  "mail_outbox",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid().references(() => projects.id, { onDelete: "cascade" }),
    kind: mailKind().notNull(),
    toAddress: text().notNull(),
    subject: text().notNull(),
    textBody: text().notNull(),
    htmlBody: text().notNull(),
    // Keeps one mail per purpose (e.g. one digest per person and day) however often a job runs.
    dedupeKey: text().unique(),
    state: mailState().notNull().default("pending"),
    attempts: integer().notNull().default(0),
    nextAttemptAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    lastError: text(),
    sentAt: timestamp({ withTimezone: true }),
    messageId: text(),
    ...timestamps,
  },
  (t) => [index("mail_outbox_due_idx").on(t.state, t.nextAttemptAt)],
);

export type OutboxMail = typeof mailOutbox.$inferSelect;
export type NewOutboxMail = typeof mailOutbox.$inferInsert;
