import "server-only";
// The shape of every write in Strutroom. A command (one file per use case in this folder) owns exactly one
// transaction: it reads and writes through db/queries functions with `tx`, computes with pure lib/ code, and
// records in the same transaction what happened — the audit event, the mail to send (lib/mail queue functions,
// given `tx`) and the live event for open viewers. Either all of it commits or none of it does, so a rolled-back
// command is never announced. Route handlers, server actions and socket events only parse, authorize and call.
import { withTransaction, type Transaction } from "@/db/client";
import { recordAuditEvent, type AuditInput } from "@/db/queries/audit";
import { insertLiveEvent } from "@/db/queries/live-events";
import { withNextRevision } from "@/db/queries/models";
import type { LiveEventKind } from "@/lib/realtime/live-events";

export type LiveEventInput = { projectId: string; kind: LiveEventKind; subjectId: string; revision?: number | null };

export type CommandContext = {
  tx: Transaction;
  /** Records who did what to which subject. */
  audit(event: AuditInput): Promise<void>;
  /** Tells open viewers of the project what changed (published by the realtime server after commit). */
  live(event: LiveEventInput): Promise<void>;
};

function contextFor(tx: Transaction): CommandContext {
  return {
    tx,
    audit: (event) => recordAuditEvent({ db: tx, ...event }),
    live: (event) => insertLiveEvent({ db: tx, ...event }),
  };
}

/** Runs a command's body in one transaction with the recorders bound to it. */
export function runCommand<T>(body: (context: CommandContext) => Promise<T>): Promise<T> {
  return withTransaction((tx) => body(contextFor(tx)));
}

/** runCommand for a command that inserts a project's next revision: a concurrent save that took the number is retried once. */
export function runRevisionCommand<T>(body: (context: CommandContext) => Promise<T>): Promise<T> {
  return withNextRevision((tx) => body(contextFor(tx)));
}
