import "server-only";
import { and, asc, eq, inArray, notInArray, sql } from "drizzle-orm";
import { alias } from "drizzle-orm/pg-core";
import { getDb, withTransaction, type Executor } from "@/db/client";
import { clashDecisions, clashes, users, type ClashRow } from "@/db/schema";
import { detectClashes, type ClashModel } from "@/lib/clash/detect";
import type { ClashOutcome, ProposeOutcomeInput } from "@/lib/clash/outcomes";
import { ConflictError, NotFoundError } from "@/lib/http/errors";
import type { Run } from "@/lib/mep/schemas";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { recordAuditEvent } from "./audit";
import { notifyClashDecision } from "@/lib/mail/notify";

const UPSERT_BATCH = 500;

export type DetectionSummary = { found: number; hard: number; clearance: number; cleared: number };

/**
 * Runs clash detection for one revision and stores the result: clashes found again keep their row, outcome and
 * decisions (matched by stable key) with fresh geometry; new ones are added; ones no longer found are marked
 * cleared, never deleted, so decisions stay on record. Pass the transaction that changed the runs.
 */
export async function syncClashes({ db, projectId, revisionId, model, runs }: { db: Executor; projectId: string; revisionId: string; model: ClashModel; runs: Run[] }): Promise<DetectionSummary> {
  const found = detectClashes(model, runs);
  for (let k = 0; k < found.length; k += UPSERT_BATCH) {
    const rows = found.slice(k, k + UPSERT_BATCH).map((c) => ({
      projectId,
      revisionId,
      clashKey: c.id,
      memberId: c.memberId,
      runId: c.runId,
      segmentIndex: c.segmentIndex,
      kind: c.kind,
      status: "active" as const,
      gap: c.gap,
      depth: c.depth,
      requiredClearance: c.requiredClearance,
      pointX: c.point.x,
      pointY: c.point.y,
      pointZ: c.point.z,
    }));
    await db
      .insert(clashes)
      .values(rows)
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
          updatedAt: sql`now()`,
        },
      });
  }
  const keys = found.map((c) => c.id);
  const stillActive = and(eq(clashes.revisionId, revisionId), eq(clashes.status, "active"));
  const cleared = await db
    .update(clashes)
    .set({ status: "cleared" })
    .where(keys.length > 0 ? and(stillActive, notInArray(clashes.clashKey, keys)) : stillActive)
    .returning({ id: clashes.id });
  const hard = found.filter((c) => c.kind === "hard").length;
  return { found: found.length, hard, clearance: found.length - hard, cleared: cleared.length };
}

/** A clash as the API presents it (who proposed and decided, by name). */
export type ClashView = Omit<ClashRow, "createdAt" | "updatedAt" | "proposedAt" | "decidedAt" | "pointX" | "pointY" | "pointZ" | "proposedBy" | "decidedBy"> & {
  point: { x: number; y: number; z: number };
  proposedBy: string | null;
  proposedAt: string | null;
  decidedBy: string | null;
  decidedAt: string | null;
  updatedAt: string;
};

const proposer = alias(users, "proposer");
const decider = alias(users, "decider");

function present(row: { clash: ClashRow; proposedBy: string | null; decidedBy: string | null }): ClashView {
  const { pointX, pointY, pointZ, createdAt, updatedAt, proposedAt, decidedAt, ...rest } = row.clash;
  return {
    ...rest,
    point: { x: pointX, y: pointY, z: pointZ },
    proposedBy: row.proposedBy,
    proposedAt: proposedAt?.toISOString() ?? null,
    decidedBy: row.decidedBy,
    decidedAt: decidedAt?.toISOString() ?? null,
    updatedAt: (updatedAt ?? createdAt).toISOString(),
  };
}

function selectClashes(db: Executor) {
  return db
    .select({ clash: clashes, proposedBy: proposer.name, decidedBy: decider.name })
    .from(clashes)
    .leftJoin(proposer, eq(proposer.id, clashes.proposedBy))
    .leftJoin(decider, eq(decider.id, clashes.decidedBy));
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

/** The decision history of a clash, oldest first. */
export async function listClashDecisions({ clashIds, db = getDb() }: { clashIds: string[]; db?: Executor }) {
  if (clashIds.length === 0) return [];
  return db
    .select({
      id: clashDecisions.id,
      clashId: clashDecisions.clashId,
      outcome: clashDecisions.outcome,
      note: clashDecisions.note,
      conditions: clashDecisions.conditions,
      caution: clashDecisions.caution,
      decidedBy: users.name,
      createdAt: clashDecisions.createdAt,
    })
    .from(clashDecisions)
    .leftJoin(users, eq(users.id, clashDecisions.decidedBy))
    .where(inArray(clashDecisions.clashId, clashIds))
    .orderBy(asc(clashDecisions.createdAt));
}

async function recordDecision(tx: Executor, input: { projectId: string; clashId: string; outcome: ClashOutcome; note: string; conditions: string | null; actorId: string }) {
  await tx.insert(clashDecisions).values({ clashId: input.clashId, outcome: input.outcome, note: input.note, conditions: input.conditions, caution: STANDING_CAUTION, decidedBy: input.actorId });
  await notifyClashDecision({ db: tx, ...input });
  await recordAuditEvent({
    db: tx,
    projectId: input.projectId,
    actorId: input.actorId,
    action: input.outcome === "opening_accepted" ? "clash.acceptOpening" : "clash.propose",
    subjectType: "clash",
    subjectId: input.clashId,
    details: { outcome: input.outcome, note: input.note, conditions: input.conditions, caution: STANDING_CAUTION },
  });
}

/** Records a proposed outcome (who and when, with the standing caution) in one transaction. */
export async function proposeClashOutcome({ projectId, clashId, actorId, outcome, note }: { projectId: string; clashId: string; actorId: string } & ProposeOutcomeInput): Promise<ClashView> {
  await withTransaction(async (tx) => {
    const [row] = await tx
      .update(clashes)
      .set({ outcome, note, conditions: null, proposedBy: actorId, proposedAt: new Date(), decidedBy: null, decidedAt: null })
      .where(and(eq(clashes.projectId, projectId), eq(clashes.id, clashId)))
      .returning({ id: clashes.id });
    if (!row) throw new NotFoundError("No such clash on this project.");
    await recordDecision(tx, { projectId, clashId, outcome, note, conditions: null, actorId });
  });
  return (await getClashById({ projectId, clashId }))!;
}

/** Accepts a proposed opening with written conditions (structural engineer; checked by the caller). */
export async function acceptClashOpening({ projectId, clashId, actorId, conditions }: { projectId: string; clashId: string; actorId: string; conditions: string }): Promise<ClashView> {
  await withTransaction(async (tx) => {
    const [current] = await tx
      .select({ outcome: clashes.outcome })
      .from(clashes)
      .where(and(eq(clashes.projectId, projectId), eq(clashes.id, clashId)))
      .for("update");
    if (!current) throw new NotFoundError("No such clash on this project.");
    if (current.outcome !== "opening_proposed") throw new ConflictError("Only a proposed opening can be accepted; propose the opening first.");
    await tx.update(clashes).set({ outcome: "opening_accepted", conditions, decidedBy: actorId, decidedAt: new Date() }).where(eq(clashes.id, clashId));
    await recordDecision(tx, { projectId, clashId, outcome: "opening_accepted", note: "", conditions, actorId });
  });
  return (await getClashById({ projectId, clashId }))!;
}
