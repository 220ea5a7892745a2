import "server-only";
import { and, asc, desc, eq, inArray, or, sql } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { comments, modelRevisions, pins, users, type NewPin } from "../schema";

/** The project's pins with their comments and authors' e-mails, oldest first: what a BCF export writes. */
export async function listPinsForBcf({ projectId, db = getDb() }: { projectId: string; db?: Executor }) {
  const pinRows = await db
    .select({ pin: pins, authorEmail: users.email })
    .from(pins)
    .innerJoin(users, eq(users.id, pins.authorId))
    .where(eq(pins.projectId, projectId))
    .orderBy(asc(pins.createdAt));
  const ids = pinRows.map((r) => r.pin.id);
  const commentRows = ids.length
    ? await db
        .select({ comment: comments, authorEmail: users.email })
        .from(comments)
        .innerJoin(users, eq(users.id, comments.authorId))
        .where(inArray(comments.pinId, ids))
        .orderBy(asc(comments.createdAt), asc(comments.id))
    : [];
  return pinRows.map(({ pin, authorEmail }) => ({ pin, authorEmail, comments: commentRows.filter((c) => c.comment.pinId === pin.id) }));
}

/** Pins of the project known under these topic GUIDs (imported ones by their BCF GUID, ours by their id). */
export async function findPinsByTopicGuids({ projectId, guids, db }: { projectId: string; guids: string[]; db: Executor }): Promise<Map<string, string>> {
  if (guids.length === 0) return new Map();
  const rows = await db
    .select({ id: pins.id, bcfGuid: pins.bcfGuid })
    .from(pins)
    .where(and(eq(pins.projectId, projectId), or(inArray(pins.bcfGuid, guids), inArray(sql`${pins.id}::text`, guids))));
  return new Map(rows.map((r) => [r.bcfGuid ?? r.id, r.id]));
}

/** The comment GUIDs a pin already holds (BCF GUID of imported comments, id of ours). */
export async function listCommentGuids({ pinId, db }: { pinId: string; db: Executor }): Promise<Set<string>> {
  const rows = await db.select({ id: comments.id, bcfGuid: comments.bcfGuid }).from(comments).where(eq(comments.pinId, pinId));
  return new Set(rows.flatMap((r) => [r.id, r.bcfGuid].filter((v): v is string => v !== null)));
}

/** Inserts a pin made from a BCF topic. */
export async function insertImportedPin({ row, db }: { row: NewPin; db: Executor }): Promise<void> {
  await db.insert(pins).values(row);
}

/** Inserts comments read from BCF; a GUID already on the pin is skipped by the unique index. */
export async function insertImportedComments({ rows, db }: { rows: (typeof comments.$inferInsert)[]; db: Executor }): Promise<number> {
  if (rows.length === 0) return 0;
  const inserted = await db.insert(comments).values(rows).onConflictDoNothing().returning({ id: comments.id });
  return inserted.length;
}

/** Marks a pin as changed after new comments arrived. */
export async function touchPin({ pinId, db }: { pinId: string; db: Executor }): Promise<void> {
  await db.update(pins).set({ updatedAt: new Date() }).where(eq(pins.id, pinId));
}

/** The member ids of the project's newest revision (BCF components are matched against them), or none. */
export async function listLatestMemberIds({ projectId, db = getDb() }: { projectId: string; db?: Executor }): Promise<string[]> {
  const [row] = await db
    .select({ model: modelRevisions.model })
    .from(modelRevisions)
    .where(eq(modelRevisions.projectId, projectId))
    .orderBy(desc(modelRevisions.number))
    .limit(1);
  return row ? row.model.members.map((m) => m.id) : [];
}
