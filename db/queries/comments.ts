import "server-only";
import { and, asc, eq, gt } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { comments, notifications, pins, users } from "../schema";
import { listMembersByProject } from "./memberships";
import { findMentions } from "../../lib/realtime/mentions";
import type { CommentKind, PresentedComment, PresentedNotification } from "../../lib/realtime/events";
import { presentNotification } from "./notifications";
import { notifyMention, notifyThreadDecision } from "../../lib/mail/notify";

type CommentRow = { comment: typeof comments.$inferSelect; authorName: string };

function presentComment({ comment, authorName }: CommentRow): PresentedComment {
  return {
    id: comment.id,
    pinId: comment.pinId,
    kind: comment.kind,
    body: comment.body,
    author: { id: comment.authorId, name: authorName },
    mentions: comment.mentions,
    createdAt: comment.createdAt.toISOString(),
  };
}

function selectComments(db: Executor) {
  return db.select({ comment: comments, authorName: users.name }).from(comments).innerJoin(users, eq(users.id, comments.authorId));
}

/** The thread of a pin, oldest first (empty when the pin is not in the project). */
export async function listCommentsByPin({ projectId, pinId }: { projectId: string; pinId: string }) {
  const rows = await selectComments(getDb())
    .innerJoin(pins, eq(pins.id, comments.pinId))
    .where(and(eq(pins.projectId, projectId), eq(comments.pinId, pinId)))
    .orderBy(asc(comments.createdAt));
  return rows.map(presentComment);
}

/** Comments written in the project after `since` (reconnect catch-up). */
export async function listCommentsSince({ projectId, since }: { projectId: string; since: Date }) {
  const rows = await selectComments(getDb())
    .innerJoin(pins, eq(pins.id, comments.pinId))
    .where(and(eq(pins.projectId, projectId), gt(comments.createdAt, since)))
    .orderBy(asc(comments.createdAt));
  return rows.map(presentComment);
}

export type WrittenComment = {
  comment: PresentedComment;
  /** False when the id was already stored (a retry): nothing new was written or notified. */
  created: boolean;
  notifications: { userId: string; notification: PresentedNotification }[];
  /** E-mail addresses of the mentioned members, for the mail notice sent after the commit. */
  mentioned: { userId: string; email: string; name: string }[];
};

/**
 * Writes a comment inside the caller's transaction: resolves @mentions against the project's members, stores one
 * notification per mentioned member (never the author), queues their mention mails and, for a decision, the
 * decision mail to the pin's author and the thread's writers (never the decider), and marks the pin changed.
 */
export async function writeComment(
  tx: Executor,
  input: { id: string; projectId: string; pinId: string; authorId: string; authorName: string; body: string; kind: CommentKind },
): Promise<WrittenComment> {
  const members = (await listMembersByProject({ projectId: input.projectId, db: tx })).map((m) => ({ id: m.userId, name: m.name, email: m.email }));
  const mentions = findMentions(input.body, members).filter((id) => id !== input.authorId);
  const inserted = await tx
    .insert(comments)
    .values({ id: input.id, pinId: input.pinId, authorId: input.authorId, body: input.body, kind: input.kind, mentions })
    .onConflictDoNothing({ target: comments.id })
    .returning({ id: comments.id });
  const created = inserted.length > 0;
  const [row] = await selectComments(tx).where(and(eq(comments.id, input.id), eq(comments.pinId, input.pinId)));
  if (!row) throw new Error("The comment id is taken by another thread.");
  if (!created) return { comment: presentComment(row), created, notifications: [], mentioned: [] };

  await tx.update(pins).set({ updatedAt: new Date() }).where(eq(pins.id, input.pinId));
  const excerpt = input.body.length > 140 ? `${input.body.slice(0, 139)}…` : input.body;
  const stored = mentions.length
    ? await tx
        .insert(notifications)
        .values(
          mentions.map((userId) => ({
            userId,
            kind: "mention" as const,
            payload: { projectId: input.projectId, pinId: input.pinId, commentId: input.id, byName: input.authorName, excerpt },
          })),
        )
        .returning()
    : [];
  const mentioned = members.filter((member) => mentions.includes(member.id)).map((m) => ({ userId: m.id, email: m.email, name: m.name }));
  await notifyMention({ db: tx, projectId: input.projectId, pinId: input.pinId, commentId: input.id, byName: input.authorName, excerpt, recipients: mentioned });
  if (input.kind === "decision") {
    await notifyThreadDecision({ db: tx, projectId: input.projectId, pinId: input.pinId, commentId: input.id, deciderId: input.authorId, excerpt });
  }
  return {
    comment: presentComment(row),
    created,
    notifications: stored.map((n) => ({ userId: n.userId, notification: presentNotification(n) })),
    mentioned,
  };
}

/** Stores a comment on a pin of the project in one transaction; null when the pin is not in the project. */
export async function createComment(input: {
  id: string;
  projectId: string;
  pinId: string;
  authorId: string;
  authorName: string;
  body: string;
  kind: CommentKind;
}): Promise<WrittenComment | null> {
  return getDb().transaction(async (tx) => {
    const [pin] = await tx
      .select({ id: pins.id })
      .from(pins)
      .where(and(eq(pins.id, input.pinId), eq(pins.projectId, input.projectId)));
    if (!pin) return null;
    return writeComment(tx, input);
  });
}
