import "server-only";
import { and, asc, desc, eq, inArray, isNotNull, ne, notInArray, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb, type Executor } from "@/db/client";
import { clashDecisions, clashes, modelRevisions, users, type ClashRow } from "@/db/schema";

const UPSERT_BATCH = 500;

export type ClashInsert = typeof clashes.$inferInsert;

/**
 * Stores detected clashes of a revision: a clash found again (same stable key) keeps its row, outcome and decisions
 * with fresh geometry; a new one is added. Pass the transaction that changed the runs.
 */
export async function upsertClashes({ db, rows }: { db: Executor; rows: ClashInsert[] }): Promise<void> {
  for (let k = 0; k < rows.length; k += UPSERT_BATCH) {
    await db
      .insert(clashes)
      .values(rows.slice(k, k + UPSERT_BATCH))
      .onConflictDoUpdate({
        target: [clashes.revisionId, clashes.clashKey],
        set: {
          kind: sql`excluded.kind`,
          status: sql`excluded.status`,
          gap: sql`excluded.gap`,
          depth: sql`excluded.depth`,
          requiredClearance: sql`excluded.required_clearance`,
          pointX: sql`excluded.point_x`,
          pointY: sql`excluded.point_y`,
          pointZ: sql`excluded.point_z`,
          // Found again: no longer closed (its closure stays in its history).
          closedReason: sql`null`,
          updatedAt: sql`now()`,
        },
      });
  }
}

/** Marks the revision's active clashes whose key is not in `keepKeys` cleared (never deleted, so decisions stay); answers how many. */
export async function markClashesCleared({ db, revisionId, keepKeys }: { db: Executor; revisionId: string; keepKeys: string[] }): Promise<number> {
  const stillActive = and(eq(clashes.revisionId, revisionId), eq(clashes.status, "active"));
  const cleared = await db
    .update(clashes)
    .set({ status: "cleared" })
    .where(keepKeys.length > 0 ? and(stillActive, notInArray(clashes.clashKey, keepKeys)) : stillActive)
    .returning({ id: clashes.id });
  return cleared.length;
}

/** A clash as the API presents it (who proposed and decided, by name). */
export type ClashView = Omit<ClashRow, "createdAt" | "updatedAt" | "proposedAt" | "decidedAt" | "pointX" | "pointY" | "pointZ" | "proposedBy" | "decidedBy" | "assigneeId"> & {
  point: { x: number; y: number; z: number };
  /** The proposer's user id, for the two-person rule on openings (lib/permissions.ts canDecideClash). */
  proposerId: string | null;
  proposedBy: string | null;
  assigneeId: string | null;
  assignee: string | null;
  proposedAt: string | null;
  decidedBy: string | null;
  decidedAt: string | null;
  updatedAt: string;
};

const proposer = alias(users, "proposer");
const decider = alias(users, "decider");
const assignee = alias(users, "assignee");

function present(row: { clash: ClashRow; proposedBy: string | null; decidedBy: string | null; assignee: string | null }): ClashView {
  const { pointX, pointY, pointZ, createdAt, updatedAt, proposedAt, decidedAt, proposedBy, ...rest } = row.clash;
  return {
    ...rest,
    point: { x: pointX, y: pointY, z: pointZ },
    proposerId: proposedBy,
    proposedBy: row.proposedBy,
    assignee: row.assignee,
    proposedAt: proposedAt?.toISOString() ?? null,
    decidedBy: row.decidedBy,
    decidedAt: decidedAt?.toISOString() ?? null,
    updatedAt: (updatedAt ?? createdAt).toISOString(),
  };
}

function selectClashes(db: Executor) {
  return db
    .select({ clash: clashes, proposedBy: proposer.name, decidedBy: decider.name, assignee: assignee.name })
    .from(clashes)
    .leftJoin(proposer, eq(proposer.id, clashes.proposedBy))
    .leftJoin(decider, eq(decider.id, clashes.decidedBy))
    .leftJoin(assignee, eq(assignee.id, clashes.assigneeId));
}

/** Every clash of a revision (active first), by run, segment and member. */
export async function listClashesByRevision({ revisionId, db = getDb() }: { revisionId: string; db?: Executor }): Promise<ClashView[]> {
  const rows = await selectClashes(db)
    .where(eq(clashes.revisionId, revisionId))
    .orderBy(asc(clashes.status), asc(clashes.runId), asc(clashes.segmentIndex), asc(clashes.memberId));
  return rows.map(present);
}

/** One clash of a project by row id, or null. */
export async function getClashById({ projectId, clashId, db = getDb() }: { projectId: string; clashId: string; db?: Executor }): Promise<ClashView | null> {
  const [row] = await selectClashes(db).where(and(eq(clashes.projectId, projectId), eq(clashes.id, clashId))).limit(1);
  return row ? present(row) : null;
}

/** The row of a clash, locked until the transaction ends, so two decisions on it are taken one after the other. */
export async function lockClash(tx: Executor, { projectId, clashId }: { projectId: string; clashId: string }): Promise<ClashRow | null> {
  const [row] = await tx.select().from(clashes).where(and(eq(clashes.projectId, projectId), eq(clashes.id, clashId))).for("update");
  return row ?? null;
}

export type ClashEntryInput = Omit<typeof clashDecisions.$inferInsert, "id" | "createdAt" | "updatedAt">;

/** Appends one step to a clash's history (never updated afterwards), with the caution shown at the time. */
export async function appendClashEntry(tx: Executor, entry: ClashEntryInput): Promise<string> {
  const [row] = await tx
    .insert(clashDecisions)
    .values(entry)
    .returning({ id: clashDecisions.id });
  return row.id;
}

export type ClashSummaryPatch = Partial<Pick<ClashRow, "outcome" | "note" | "conditions" | "proposedBy" | "proposedAt" | "decidedBy" | "decidedAt" | "recheckReason" | "closedReason" | "status" | "assigneeId" | "dueOn">>;

/** Updates the summary columns of a clash (its history is appended separately, in the same transaction). */
export async function updateClashSummary(tx: Executor, clashId: string, patch: ClashSummaryPatch): Promise<void> {
  await tx.update(clashes).set(patch).where(eq(clashes.id, clashId));
}

/** The newest decision entry of a clash across its revisions (same project and stable key), or null. */
export async function latestDecisionEntry(tx: Executor, { projectId, clashKey }: { projectId: string; clashKey: string }): Promise<{ id: string } | null> {
  const [row] = await tx
    .select({ id: clashDecisions.id })
    .from(clashDecisions)
    .innerJoin(clashes, eq(clashes.id, clashDecisions.clashId))
    .where(and(eq(clashes.projectId, projectId), eq(clashes.clashKey, clashKey), eq(clashDecisions.kind, "decision")))
    .orderBy(desc(clashDecisions.createdAt))
    .limit(1);
  return row ?? null;
}

/**
 * The history of clashes, oldest first: every entry recorded on any revision's row of the same stable key, so a
 * clash carried to a newer revision shows what was proposed and decided on the earlier ones.
 */
export async function listClashHistory({ projectId, clashKeys, db = getDb() }: { projectId: string; clashKeys: string[]; db?: Executor }) {
  if (clashKeys.length === 0) return [];
  const rows = await db
    .select({
      id: clashDecisions.id,
      clashId: clashDecisions.clashId,
      clashKey: clashes.clashKey,
      kind: clashDecisions.kind,
      outcome: clashDecisions.outcome,
      note: clashDecisions.note,
      conditions: clashDecisions.conditions,
      reason: clashDecisions.reason,
      caution: clashDecisions.caution,
      decidedBy: users.name,
      role: clashDecisions.role,
      revision: modelRevisions.number,
      supersedesId: clashDecisions.supersedesId,
      createdAt: clashDecisions.createdAt,
    })
    .from(clashDecisions)
    .innerJoin(clashes, eq(clashes.id, clashDecisions.clashId))
    .leftJoin(users, eq(users.id, clashDecisions.decidedBy))
    .leftJoin(modelRevisions, eq(modelRevisions.id, clashDecisions.revisionId))
    .where(and(eq(clashes.projectId, projectId), inArray(clashes.clashKey, clashKeys)))
    .orderBy(asc(clashDecisions.createdAt), asc(clashDecisions.id));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}
export type ClashHistoryEntry = Awaited<ReturnType<typeof listClashHistory>>[number];

/** Sets (or clears) who a clash is assigned to and by when. */
export async function setClashAssignment(tx: Executor, { clashId, assigneeId, dueOn }: { clashId: string; assigneeId: string | null; dueOn: string | null }): Promise<void> {
  await tx.update(clashes).set({ assigneeId, dueOn }).where(eq(clashes.id, clashId));
}

/** The clashes of a revision that carry a proposal or decision and are not closed. */
export async function listDecidedClashes(db: Executor, { revisionId }: { revisionId: string }): Promise<ClashRow[]> {
  return db
    .select()
    .from(clashes)
    .where(and(eq(clashes.revisionId, revisionId), isNotNull(clashes.outcome), ne(clashes.status, "closed")));
}

/** For each stable clash key, the revision its newest proposal or decision was judged on. */
export async function judgedOnRevisions(db: Executor, { projectId, clashKeys }: { projectId: string; clashKeys: string[] }): Promise<Map<string, string>> {
  if (clashKeys.length === 0) return new Map();
  const rows = await db
    .selectDistinctOn([clashes.clashKey], { clashKey: clashes.clashKey, revisionId: clashDecisions.revisionId })
    .from(clashDecisions)
    .innerJoin(clashes, eq(clashes.id, clashDecisions.clashId))
    .where(and(eq(clashes.projectId, projectId), inArray(clashes.clashKey, clashKeys), inArray(clashDecisions.kind, ["proposal", "decision"])))
    .orderBy(clashes.clashKey, desc(clashDecisions.createdAt));
  return new Map(rows.filter((r) => r.revisionId).map((r) => [r.clashKey, r.revisionId!]));
}
