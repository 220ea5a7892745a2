import "server-only";
import type { Transaction } from "@/db/client";
import { recordAuditEvent } from "@/db/queries/audit";
import { getCommentInThread, insertComment, insertMentionNotifications, listThreadSteps } from "@/db/queries/comments";
import { getProjectMember, listMembersByProject } from "@/db/queries/memberships";
import { getDefaultRevisionResultSet } from "@/db/queries/models";
import { presentNotification } from "@/db/queries/notifications";
import { touchPin } from "@/db/queries/pins";
import { ConflictError, ForbiddenError } from "@/lib/http/errors";
import { threadStepRefusal } from "@/lib/permissions";
import type { CommentKind, PresentedComment, PresentedNotification } from "@/lib/realtime/events";
import { findMentions } from "@/lib/realtime/mentions";
import type { Viewpoint } from "@/lib/realtime/viewpoint";
import { isRecordStep, threadStanding, threadStepConflict } from "@/lib/realtime/thread-record";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { notifyMention, notifyThreadStep } from "./mail";

export type WrittenComment = {
  comment: PresentedComment;
  /** False when the id was already stored (a retry): nothing new was written or notified. */
  created: boolean;
  notifications: { userId: string; notification: PresentedNotification }[];
  /** The mentioned members (mailed in the same transaction). */
  mentioned: { userId: string; email: string; name: string }[];
};

export type CommentInput = { id: string; projectId: string; pinId: string; authorId: string; authorName: string; body: string; kind: CommentKind; conditions?: string; viewpoint?: Viewpoint };

/**
 * A step of the post-comment and create-pin commands (runs in their transaction, the pin locked): asks the rule book
 * with the author's role now (the membership read in this transaction), and for a step of the thread's record
 * (proposal, decision, supersession) checks it against the thread's standing: a proposal or a second decision
 * never replaces a standing decision, the proposer does not decide their own proposal. A step records the role, the
 * revision and result set it is judged on (the project's current revision and its newest analysis), the standing
 * caution and, for a supersession, the decision it supersedes; it is audited and mailed (lib/commands/mail.ts).
 * Any comment resolves its @mentions (a notification and mail for each mentioned member, never the author) and
 * marks the pin changed. A retried id answers the stored comment and writes nothing.
 */
export async function writeComment(tx: Transaction, input: CommentInput): Promise<WrittenComment> {
  const stored = await getCommentInThread({ db: tx, pinId: input.pinId, commentId: input.id });
  if (stored) return { comment: stored, created: false, notifications: [], mentioned: [] };

  const author = await getProjectMember({ projectId: input.projectId, userId: input.authorId, db: tx });
  const step = isRecordStep(input.kind);
  const standing = step ? threadStanding(await listThreadSteps({ db: tx, pinId: input.pinId })) : null;
  const refusal = threadStepRefusal(author ? { role: author.role, userId: author.userId } : null, input.kind, standing?.proposal?.proposerId ?? null);
  if (refusal) throw new ForbiddenError(refusal);
  const conflict = standing ? threadStepConflict(input.kind, standing) : null;
  if (conflict) throw new ConflictError(conflict);

  // findMentions looks only after an "@": a body without one names nobody, and the whole team is not read for it.
  const members = input.body.includes("@") ? await listMembersByProject({ projectId: input.projectId, db: tx }) : [];
  const candidates = members.map((m) => ({ id: m.userId, name: m.name, email: m.email }));
  const mentions = findMentions(input.body, candidates).filter((id) => id !== input.authorId);
  const judgedOn = step ? await getDefaultRevisionResultSet({ projectId: input.projectId, db: tx }) : null;
  const conditions = input.kind === "decision" && input.conditions ? input.conditions : null;
  const comment = await insertComment({
    db: tx,
    authorName: author?.name ?? input.authorName,
    revision: judgedOn?.revision ?? null,
    values: {
      id: input.id,
      pinId: input.pinId,
      authorId: input.authorId,
      body: input.body,
      kind: input.kind,
      mentions,
      role: author?.role ?? null,
      conditions,
      revisionId: judgedOn?.revisionId ?? null,
      analysisRunId: judgedOn?.analysisRunId ?? null,
      caution: step ? STANDING_CAUTION : null,
      supersedesId: input.kind === "supersession" ? (standing?.decisionId ?? null) : null,
      viewpoint: input.viewpoint ?? null,
      // Taken after the pin's lock, so the record's order is the order its steps were admitted in.
      createdAt: new Date(),
    },
  });
  if (!comment) throw new Error("The comment id is taken by another thread.");

  await touchPin({ db: tx, pinId: input.pinId });
  const excerpt = input.body.length > 140 ? `${input.body.slice(0, 139)}…` : input.body;
  const notifications = await insertMentionNotifications({ db: tx, userIds: mentions, payload: { projectId: input.projectId, pinId: input.pinId, commentId: input.id, byName: input.authorName, excerpt } });
  const mentioned = candidates.filter((member) => mentions.includes(member.id)).map((m) => ({ userId: m.id, email: m.email, name: m.name }));
  await notifyMention({ db: tx, projectId: input.projectId, pinId: input.pinId, commentId: input.id, byName: input.authorName, excerpt, recipients: mentioned });
  if (isRecordStep(input.kind)) {
    await recordAuditEvent({
      db: tx,
      projectId: input.projectId,
      actorId: input.authorId,
      action: `thread.${input.kind}`,
      subjectType: "pin",
      subjectId: input.pinId,
      details: { commentId: input.id, body: input.body, conditions, supersedes: comment.supersedesId, revisionId: judgedOn?.revisionId ?? null, analysisRunId: judgedOn?.analysisRunId ?? null },
    });
    await notifyThreadStep({ db: tx, projectId: input.projectId, pinId: input.pinId, commentId: input.id, step: input.kind, actorId: input.authorId, text: excerpt, conditions });
  }
  return { comment, created: true, notifications: notifications.map((n) => ({ userId: n.userId, notification: presentNotification(n) })), mentioned };
}
