import "server-only";
// The mails other areas ask for. Each one renders its template and queues it in the outbox, inside the caller's
// transaction when one is passed, so the mail commits with (and only with) what it announces; the jobs process
// sends it with retries (lib/mail/outbox.ts).
import { and, eq, inArray } from "drizzle-orm";
import { getDb, type Executor } from "../../db/client";
import { clashes, comments, invitations, memberships, pins, projects, users } from "../../db/schema";
import { enqueueMail } from "../../db/queries/mail-outbox";
import { CLASH_OUTCOME_LABELS, type ClashOutcome } from "../clash/outcomes";
import { clashStepMail, decisionMail, invitationMail, mentionMail, type ClashStep } from "./templates";

/** The web app's public base URL, for links in mails. */
export function appUrl(path: string): string {
  const base = process.env.APP_URL ?? process.env.NEXTAUTH_URL ?? "http://127.0.0.1:3000";
  return new URL(path, base).toString();
}

/** Where a pin's thread opens: the viewer with its live review. */
export function pinUrl(projectId: string, pinId: string): string {
  return appUrl(`/projects/${projectId}/viewer?pin=${encodeURIComponent(pinId)}`);
}

async function projectName(db: Executor, projectId: string): Promise<string> {
  const [row] = await db.select({ name: projects.name }).from(projects).where(eq(projects.id, projectId));
  if (!row) throw new Error(`Project ${projectId} does not exist.`);
  return row.name;
}

/**
 * Queues the invitation mail with its join link. Call it inside the transaction that creates the invitation
 * (db/queries/invitations.ts createInvitation), so there is never an invitation without its mail or the reverse.
 */
export async function sendInvitationMail({ db = getDb(), invitationId, joinUrl }: { db?: Executor; invitationId: string; joinUrl: string }): Promise<void> {
  const [row] = await db
    .select({ invitation: invitations, projectName: projects.name, inviterName: users.name })
    .from(invitations)
    .innerJoin(projects, eq(projects.id, invitations.projectId))
    .innerJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.id, invitationId));
  if (!row) throw new Error(`Invitation ${invitationId} does not exist.`);
  const { invitation } = row;
  const mail = invitationMail({ projectName: row.projectName, inviterName: row.inviterName, role: invitation.role, joinUrl, expiresAt: invitation.expiresAt });
  await enqueueMail({
    db,
    mail: { projectId: invitation.projectId, kind: "invitation", toAddress: invitation.email, ...bodies(mail), dedupeKey: `invitation:${invitation.id}` },
  });
}

/**
 * Queues one mail per mentioned member of a new comment. Call it inside the transaction that writes the comment
 * (db/queries/comments.ts writeComment), with the mentioned members it resolved (the author is never among them).
 */
export async function notifyMention({
  db = getDb(),
  projectId,
  pinId,
  commentId,
  byName,
  excerpt,
  recipients,
}: {
  db?: Executor;
  projectId: string;
  pinId: string;
  commentId: string;
  byName: string;
  excerpt: string;
  recipients: { userId: string; email: string; name: string }[];
}): Promise<void> {
  if (recipients.length === 0) return;
  const [pin] = await db
    .select({ title: pins.title, projectName: projects.name })
    .from(pins)
    .innerJoin(projects, eq(projects.id, pins.projectId))
    .where(and(eq(pins.id, pinId), eq(pins.projectId, projectId)));
  if (!pin) throw new Error(`Pin ${pinId} is not in project ${projectId}.`);
  const mail = mentionMail({ projectName: pin.projectName, byName, pinTitle: pin.title, excerpt, pinUrl: pinUrl(projectId, pinId) });
  for (const recipient of recipients) {
    await enqueueMail({
      db,
      mail: { projectId, kind: "mention", toAddress: recipient.email, ...bodies(mail), dedupeKey: `mention:${commentId}:${recipient.userId}` },
    });
  }
}

async function queueDecisionMail({
  db,
  projectId,
  decisionId,
  deciderId,
  subject,
  outcome,
  note,
  path,
  recipients,
}: {
  db: Executor;
  projectId: string;
  decisionId?: string;
  deciderId: string;
  subject: string;
  outcome: string;
  note: string | null;
  path: string;
  recipients: { userId: string; email: string }[];
}): Promise<void> {
  if (recipients.length === 0) return;
  const [decider] = await db.select({ name: users.name }).from(users).where(eq(users.id, deciderId));
  const mail = decisionMail({ projectName: await projectName(db, projectId), deciderName: decider?.name ?? "Someone", subject, outcome, note, url: appUrl(path) });
  for (const recipient of recipients) {
    await enqueueMail({ db, mail: { projectId, kind: "decision", toAddress: recipient.email, ...bodies(mail), dedupeKey: decisionId ? `decision:${decisionId}:${recipient.userId}` : null } });
  }
}

/**
 * Queues the decision mail for a decision recorded in a pin's thread (a comment of kind "decision") to the pin's
 * author and everyone who wrote in the thread, while still members of the project, never the decider. Call it
 * inside the transaction that writes the comment (db/queries/comments.ts writeComment), after the comment is stored.
 */
export async function notifyThreadDecision({
  db = getDb(),
  projectId,
  pinId,
  commentId,
  deciderId,
  excerpt,
}: {
  db?: Executor;
  projectId: string;
  pinId: string;
  commentId: string;
  deciderId: string;
  excerpt: string;
}): Promise<void> {
  const [pin] = await db
    .select({ title: pins.title, authorId: pins.authorId })
    .from(pins)
    .where(and(eq(pins.id, pinId), eq(pins.projectId, projectId)));
  if (!pin) throw new Error(`Pin ${pinId} is not in project ${projectId}.`);
  const writers = await db.selectDistinct({ userId: comments.authorId }).from(comments).where(eq(comments.pinId, pinId));
  const involved = [...new Set([pin.authorId, ...writers.map((w) => w.userId)])].filter((id) => id !== deciderId);
  const recipients = involved.length
    ? await db
        .select({ userId: users.id, email: users.email })
        .from(memberships)
        .innerJoin(users, eq(users.id, memberships.userId))
        .where(and(eq(memberships.projectId, projectId), inArray(memberships.userId, involved)))
    : [];
  await queueDecisionMail({
    db,
    projectId,
    decisionId: commentId,
    deciderId,
    subject: `the thread "${pin.title}"`,
    outcome: excerpt,
    note: null,
    path: `/projects/${projectId}/viewer?pin=${encodeURIComponent(pinId)}`,
    recipients,
  });
}

/**
 * Queues the mail for one step on a clash to the given members (those still on the team, never the actor): a
 * proposal to the assignee and the structural engineers who decide it, a decision to the proposer and assignee, a
 * re-check to the decider. Call it inside the transaction that records the step; `entryId` makes it queue once.
 */
export async function notifyClashStep({
  db = getDb(),
  projectId,
  clashId,
  entryId,
  step,
  outcome,
  details,
  actorId,
  recipientIds,
}: {
  db?: Executor;
  projectId: string;
  clashId: string;
  entryId: string;
  step: ClashStep;
  outcome: ClashOutcome | null;
  details: string[];
  actorId: string | null;
  recipientIds: (string | null)[];
}): Promise<void> {
  const wanted = [...new Set(recipientIds.filter((id): id is string => id !== null && id !== actorId))];
  if (wanted.length === 0) return;
  const recipients = await db
    .select({ userId: users.id, email: users.email })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(and(eq(memberships.projectId, projectId), inArray(memberships.userId, wanted)));
  if (recipients.length === 0) return;
  const [clash] = await db.select({ clashKey: clashes.clashKey, memberId: clashes.memberId, runId: clashes.runId }).from(clashes).where(eq(clashes.id, clashId));
  if (!clash) throw new Error(`Clash ${clashId} does not exist.`);
  const [actor] = actorId ? await db.select({ name: users.name }).from(users).where(eq(users.id, actorId)) : [];
  const label = outcome ? CLASH_OUTCOME_LABELS[outcome] : null;
  const mail = clashStepMail({
    projectName: await projectName(db, projectId),
    actorName: actor?.name ?? null,
    step,
    subject: `clash ${clash.clashKey} (member ${clash.memberId}, run ${clash.runId})`,
    outcome: label ? label.charAt(0).toLowerCase() + label.slice(1) : null,
    details,
    url: appUrl(`/projects/${projectId}/clashes?clash=${encodeURIComponent(clash.clashKey)}`),
  });
  const kind = step === "proposal" ? "proposal" : step === "recheck" ? "recheck" : "decision";
  for (const recipient of recipients) {
    await enqueueMail({ db, mail: { projectId, kind, toAddress: recipient.email, ...bodies(mail), dedupeKey: `clash:${entryId}:${recipient.userId}` } });
  }
}

/** The structural engineers of a project: who decides clash proposals. */
export async function structuralEngineerIds({ db = getDb(), projectId }: { db?: Executor; projectId: string }): Promise<string[]> {
  const rows = await db
    .select({ userId: memberships.userId })
    .from(memberships)
    .where(and(eq(memberships.projectId, projectId), eq(memberships.role, "structural_engineer")));
  return rows.map((r) => r.userId);
}

function bodies(mail: { subject: string; text: string; html: string }) {
  return { subject: mail.subject, textBody: mail.text, htmlBody: mail.html };
}
