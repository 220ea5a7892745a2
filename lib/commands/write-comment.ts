import "server-only";
import type { Transaction } from "@/db/client";
import { getCommentInThread, insertComment, insertMentionNotifications } from "@/db/queries/comments";
import { listMembersByProject } from "@/db/queries/memberships";
import { presentNotification } from "@/db/queries/notifications";
import { touchPin } from "@/db/queries/pins";
import type { CommentKind, PresentedComment, PresentedNotification } from "@/lib/realtime/events";
import { findMentions } from "@/lib/realtime/mentions";
import { notifyMention, notifyThreadDecision } from "./mail";

export type WrittenComment = {
  comment: PresentedComment;
  /** False when the id was already stored (a retry): nothing new was written or notified. */
  created: boolean;
  notifications: { userId: string; notification: PresentedNotification }[];
  /** The mentioned members (mailed in the same transaction). */
  mentioned: { userId: string; email: string; name: string }[];
};

/**
 * A step of the post-comment and create-pin commands (runs in their transaction): resolves @mentions against the
 * project's members, stores one notification per mentioned member (never the author), queues their mention mails
 * and, for a decision, the decision mail to the pin's author and the thread's writers (never the decider), and marks
 * the pin changed.
 */
export async function writeComment(
  tx: Transaction,
  input: { id: string; projectId: string; pinId: string; authorId: string; authorName: string; body: string; kind: CommentKind },
): Promise<WrittenComment> {
  const members = (await listMembersByProject({ projectId: input.projectId, db: tx })).map((m) => ({ id: m.userId, name: m.name, email: m.email }));
  const mentions = findMentions(input.body, members).filter((id) => id !== input.authorId);
  const created = await insertComment({ db: tx, values: { id: input.id, pinId: input.pinId, authorId: input.authorId, body: input.body, kind: input.kind, mentions } });
  const comment = await getCommentInThread({ db: tx, pinId: input.pinId, commentId: input.id });
  if (!comment) throw new Error("The comment id is taken by another thread.");
  if (!created) return { comment, created, notifications: [], mentioned: [] };

  await touchPin({ db: tx, pinId: input.pinId });
  const excerpt = input.body.length > 140 ? `${input.body.slice(0, 139)}…` : input.body;
  const stored = await insertMentionNotifications({ db: tx, userIds: mentions, payload: { projectId: input.projectId, pinId: input.pinId, commentId: input.id, byName: input.authorName, excerpt } });
  const mentioned = members.filter((member) => mentions.includes(member.id)).map((m) => ({ userId: m.id, email: m.email, name: m.name }));
  await notifyMention({ db: tx, projectId: input.projectId, pinId: input.pinId, commentId: input.id, byName: input.authorName, excerpt, recipients: mentioned });
  if (input.kind === "decision") {
    await notifyThreadDecision({ db: tx, projectId: input.projectId, pinId: input.pinId, commentId: input.id, deciderId: input.authorId, excerpt });
  }
  return { comment, created, notifications: stored.map((n) => ({ userId: n.userId, notification: presentNotification(n) })), mentioned };
}
