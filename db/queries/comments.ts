import "server-only";
import { and, asc, eq, gt, ne } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { analysisRuns, comments, modelRevisions, notifications, pins, users } from "../schema";
import type { PresentedComment } from "../../lib/realtime/events";
import { isRecordStep } from "../../lib/realtime/thread-record";

type CommentRow = { comment: typeof comments.$inferSelect; authorName: string; revision: number | null };

function presentComment({ comment, authorName, revision }: CommentRow): PresentedComment {
  return {
    id: comment.id,
    pinId: comment.pinId,
    kind: comment.kind,
    body: comment.body,
    author: { id: comment.authorId, name: authorName },
    mentions: comment.mentions,
    createdAt: comment.createdAt.toISOString(),
    role: comment.role,
    conditions: comment.conditions,
    revision,
    analysisRunId: comment.analysisRunId,
    caution: comment.caution,
    supersedesId: comment.supersedesId,
    viewpoint: comment.viewpoint,
  };
}

function selectComments(db: Executor) {
  return db
    .select({ comment: comments, authorName: users.name, revision: modelRevisions.number })
    .from(comments)
    .innerJoin(users, eq(users.id, comments.authorId))
    .leftJoin(modelRevisions, eq(modelRevisions.id, comments.revisionId));
}

/** The thread of a pin, oldest first (empty when the pin is not in the project). */
export async function listCommentsByPin({ projectId, pinId }: { projectId: string; pinId: string }) {
  const rows = await selectComments(getDb())
    .innerJoin(pins, eq(pins.id, comments.pinId))
    .where(and(eq(pins.projectId, projectId), eq(comments.pinId, pinId)))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.map(presentComment);
}

/** The steps of a thread's record (proposals, decisions, supersessions), oldest first: what its standing is read from. */
export async function listThreadSteps({ db, pinId }: { db: Executor; pinId: string }) {
  const rows = await db
    .select({ id: comments.id, kind: comments.kind, authorId: comments.authorId })
    .from(comments)
    .where(and(eq(comments.pinId, pinId), ne(comments.kind, "comment")))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.map((row) => ({ id: row.id, kind: row.kind, author: { id: row.authorId } }));
}

/**
 * Every step of the records of a project's threads (proposals, decisions, supersessions), oldest first: who (and
 * their role then), the revision and stored analysis judged on, conditions, caution, and what a supersession ends.
 */
export async function listProjectThreadSteps({ projectId, db = getDb() }: { projectId: string; db?: Executor }) {
  const rows = await db
    .select({
      id: comments.id,
      pinId: comments.pinId,
      kind: comments.kind,
      body: comments.body,
      conditions: comments.conditions,
      role: comments.role,
      caution: comments.caution,
      supersedesId: comments.supersedesId,
      createdAt: comments.createdAt,
      author: users.name,
      revision: modelRevisions.number,
      analysedAt: analysisRuns.createdAt,
    })
    .from(comments)
    .innerJoin(pins, eq(pins.id, comments.pinId))
    .innerJoin(users, eq(users.id, comments.authorId))
    .leftJoin(modelRevisions, eq(modelRevisions.id, comments.revisionId))
    .leftJoin(analysisRuns, eq(analysisRuns.id, comments.analysisRunId))
    .where(and(eq(pins.projectId, projectId), ne(comments.kind, "comment")))
    .orderBy(asc(comments.createdAt), asc(comments.id));
  return rows.flatMap(({ kind, ...r }) => (isRecordStep(kind) ? [{ ...r, kind, createdAt: r.createdAt.toISOString(), analysedAt: r.analysedAt?.toISOString() ?? null }] : []));
}
export type ThreadStepEntry = Awaited<ReturnType<typeof listProjectThreadSteps>>[number];

/** Comments written in the project after `since` (reconnect catch-up). */
export async function listCommentsSince({ projectId, since }: { projectId: string; since: Date }) {
  const rows = await selectComments(getDb())
    .innerJoin(pins, eq(pins.id, comments.pinId))
    .where(and(eq(pins.projectId, projectId), gt(comments.createdAt, since)))
    .orderBy(asc(comments.createdAt));
  return rows.map(presentComment);
}

/**
 * Stores a comment unless its id is already stored (a client retry); answers it as presented when this call wrote
 * it, else null. The author's name and the revision's number come from the caller, who has just read them, so the
 * new comment is not read back.
 */
export async function insertComment({
  db,
  values,
  authorName,
  revision,
}: {
  db: Executor;
  values: typeof comments.$inferInsert;
  authorName: string;
  revision: number | null;
}): Promise<PresentedComment | null> {
  const [comment] = await db.insert(comments).values(values).onConflictDoNothing({ target: comments.id }).returning();
  return comment ? presentComment({ comment, authorName, revision }) : null;
}

/** One comment of a pin's thread, or null (also when the id belongs to another thread). */
export async function getCommentInThread({ db, pinId, commentId }: { db: Executor; pinId: string; commentId: string }): Promise<PresentedComment | null> {
  const [row] = await selectComments(db).where(and(eq(comments.id, commentId), eq(comments.pinId, pinId)));
  return row ? presentComment(row) : null;
}

/** Stores one mention notification per user. */
export async function insertMentionNotifications({ db, userIds, payload }: { db: Executor; userIds: string[]; payload: { projectId: string; pinId: string; commentId: string; byName: string; excerpt: string } }) {
  if (userIds.length === 0) return [];
  return db
    .insert(notifications)
    .values(userIds.map((userId) => ({ userId, kind: "mention" as const, payload })))
    .returning();
}
