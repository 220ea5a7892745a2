import "server-only";
// The mails commands queue, as steps inside the command's transaction (pass `tx`): each reads what it needs through
// db/queries/mail-context.ts, renders its template and queues it in the outbox, so the mail commits with (and only
// with) what it announces.
import type { Executor } from "@/db/client";
import { enqueueMail } from "@/db/queries/mail-outbox";
import { getClashMailFacts, getInvitationMailFacts, getPinMailFacts, getProjectName, getUserName, listMemberContacts, listThreadWriterIds, listUserIdsWithRole } from "@/db/queries/mail-context";
import { CLASH_OUTCOME_LABELS, type ClashOutcome } from "@/lib/clash/outcomes";
import { appUrl, outboxBodies, pinUrl } from "@/lib/mail/notify";
import { clashStepMail, decisionMail, invitationMail, mentionMail, type ClashStep } from "@/lib/mail/templates";

async function projectName(db: Executor, projectId: string): Promise<string> {
  const name = await getProjectName({ db, projectId });
  if (name === null) throw new Error(`Project ${projectId} does not exist.`);
  return name;
}

/** Queues the invitation mail with its join link, in the transaction that creates the invitation. */
export async function sendInvitationMail({ db, invitationId, joinUrl }: { db: Executor; invitationId: string; joinUrl: string }): Promise<void> {
  const row = await getInvitationMailFacts({ db, invitationId });
  if (!row) throw new Error(`Invitation ${invitationId} does not exist.`);
  const { invitation } = row;
  const mail = invitationMail({ projectName: row.projectName, inviterName: row.inviterName, role: invitation.role, joinUrl, expiresAt: invitation.expiresAt });
  await enqueueMail({
    db,
    mail: { projectId: invitation.projectId, kind: "invitation", toAddress: invitation.email, ...outboxBodies(mail), dedupeKey: `invitation:${invitation.id}` },
  });
}

/** Queues one mail per mentioned member of a new comment (the author is never among them). */
export async function notifyMention({
  db,
  projectId,
  pinId,
  commentId,
  byName,
  excerpt,
  recipients,
}: {
  db: Executor;
  projectId: string;
  pinId: string;
  commentId: string;
  byName: string;
  excerpt: string;
  recipients: { userId: string; email: string; name: string }[];
}): Promise<void> {
  if (recipients.length === 0) return;
  const pin = await getPinMailFacts({ db, projectId, pinId });
  if (!pin) throw new Error(`Pin ${pinId} is not in project ${projectId}.`);
  const mail = mentionMail({ projectName: pin.projectName, byName, pinTitle: pin.title, excerpt, pinUrl: pinUrl(projectId, pinId) });
  for (const recipient of recipients) {
    await enqueueMail({
      db,
      mail: { projectId, kind: "mention", toAddress: recipient.email, ...outboxBodies(mail), dedupeKey: `mention:${commentId}:${recipient.userId}` },
    });
  }
}

/**
 * Queues the mail for a step of a pin's thread record (never to the actor, only to members still on the team): a
 * proposal, said to be one, to the structural engineers who decide it; a decision, with its conditions, to the pin's
 * author and everyone who wrote in the thread; a supersession, with its reason, to them and the previous decider.
 */
export async function notifyThreadStep({
  db,
  projectId,
  pinId,
  commentId,
  step,
  actorId,
  text,
  conditions,
}: {
  db: Executor;
  projectId: string;
  pinId: string;
  commentId: string;
  step: "proposal" | "decision" | "supersession";
  actorId: string;
  /** The step's text (an excerpt): what is proposed or decided, or why a decision is superseded. */
  text: string;
  conditions: string | null;
}): Promise<void> {
  const pin = await getPinMailFacts({ db, projectId, pinId });
  if (!pin) throw new Error(`Pin ${pinId} is not in project ${projectId}.`);
  const involved = step === "proposal" ? await structuralEngineerIds({ db, projectId }) : [pin.authorId, ...(await listThreadWriterIds({ db, pinId }))];
  const recipients = await listMemberContacts({ db, projectId, userIds: [...new Set(involved)].filter((id) => id !== actorId) });
  if (recipients.length === 0) return;
  const actorName = (await getUserName({ db, userId: actorId })) ?? "Someone";
  const subject = `the thread "${pin.title}"`;
  const url = appUrl(`/projects/${projectId}/viewer?pin=${encodeURIComponent(pinId)}`);
  const mail =
    step === "decision"
      ? decisionMail({ projectName: pin.projectName, deciderName: actorName, subject, outcome: text, note: null, conditions, url })
      : clashStepMail({ projectName: pin.projectName, actorName, step, subject, outcome: step === "proposal" ? text : null, details: step === "supersession" ? [`Reason: ${text}`] : [], url, linkLabel: "Open the thread" });
  const kind = step === "proposal" ? "proposal" : "decision";
  for (const recipient of recipients) {
    await enqueueMail({ db, mail: { projectId, kind, toAddress: recipient.email, ...outboxBodies(mail), dedupeKey: `${kind}:${commentId}:${recipient.userId}` } });
  }
}

/**
 * Queues the mail for one step on a clash to the given members (those still on the team, never the actor): a
 * proposal to the assignee and the structural engineers who decide it, a decision to the proposer and assignee, a
 * re-check to the decider. `entryId` makes it queue once.
 */
export async function notifyClashStep({
  db,
  projectId,
  clashId,
  entryId,
  step,
  outcome,
  details,
  actorId,
  recipientIds,
}: {
  db: Executor;
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
  const recipients = await listMemberContacts({ db, projectId, userIds: wanted });
  if (recipients.length === 0) return;
  const clash = await getClashMailFacts({ db, clashId });
  if (!clash) throw new Error(`Clash ${clashId} does not exist.`);
  const actorName = actorId ? await getUserName({ db, userId: actorId }) : null;
  const label = outcome ? CLASH_OUTCOME_LABELS[outcome] : null;
  const mail = clashStepMail({
    projectName: await projectName(db, projectId),
    actorName,
    step,
    subject: `clash ${clash.clashKey} (member ${clash.memberId}, run ${clash.runId})`,
    outcome: label ? label.charAt(0).toLowerCase() + label.slice(1) : null,
    details,
    url: appUrl(`/projects/${projectId}/clashes?clash=${encodeURIComponent(clash.clashKey)}`),
  });
  const kind = step === "proposal" ? "proposal" : step === "recheck" ? "recheck" : "decision";
  for (const recipient of recipients) {
    await enqueueMail({ db, mail: { projectId, kind, toAddress: recipient.email, ...outboxBodies(mail), dedupeKey: `clash:${entryId}:${recipient.userId}` } });
  }
}

/** The structural engineers of a project: who decides clash proposals. */
export function structuralEngineerIds({ db, projectId }: { db: Executor; projectId: string }): Promise<string[]> {
  return listUserIdsWithRole({ db, projectId, role: "structural_engineer" });
}
