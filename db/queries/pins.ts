import "server-only";
import { and, asc, eq, gt, inArray, sql, type SQL } from "drizzle-orm";
import { getDb, type Executor } from "../client";
import { comments, pins, users } from "../schema";
import type { StoredPinViewpoint } from "../../lib/bcf/viewpoint";
import type { Anchor, PinCreateInput, PinFilter, PinState, PresentedPin, Vec3 } from "../../lib/realtime/events";

const pinColumns = {
  pin: pins,
  authorName: users.name,
  commentCount: sql<number>`(select count(*)::int from ${comments} where ${comments.pinId} = ${pins.id})`,
};

type PinRow = { pin: typeof pins.$inferSelect; authorName: string; commentCount: number };

function anchorOf(pin: typeof pins.$inferSelect): Anchor {
  const point: Vec3 | null = pin.anchorX === null || pin.anchorY === null || pin.anchorZ === null ? null : [pin.anchorX, pin.anchorY, pin.anchorZ];
  if (pin.anchorKind === "point") return { kind: "point", point: point ?? [0, 0, 0] };
  if (pin.anchorKind === "clash") return { kind: "clash", id: pin.anchorId ?? "" };
  return { kind: pin.anchorKind, id: pin.anchorId ?? "", ...(point ? { point } : {}) };
}

/** The pin as sent to browsers: anchor as one object, author by name, times as ISO strings. */
function presentPin({ pin, authorName, commentCount }: PinRow): PresentedPin {
  return {
    id: pin.id,
    projectId: pin.projectId,
    anchor: anchorOf(pin),
    revisionId: pin.revisionId,
    title: pin.title,
    state: pin.state,
    discipline: pin.discipline,
    author: { id: pin.authorId, name: authorName },
    commentCount,
    createdAt: pin.createdAt.toISOString(),
    updatedAt: pin.updatedAt.toISOString(),
  };
}

function selectPins(db: Executor, where: SQL | undefined) {
  return db.select(pinColumns).from(pins).innerJoin(users, eq(users.id, pins.authorId)).where(where).orderBy(asc(pins.createdAt));
}

/** One pin of the project, or null when it does not exist there. */
export async function getPinById({ projectId, pinId, db = getDb() }: { projectId: string; pinId: string; db?: Executor }) {
  const [row] = await selectPins(db, and(eq(pins.projectId, projectId), eq(pins.id, pinId)));
  return row ? presentPin(row) : null;
}

/** The project's pins, oldest first, narrowed by state, discipline and author. */
export async function listPinsByProject({ projectId, filter = {} }: { projectId: string; filter?: PinFilter }) {
  const conditions = [eq(pins.projectId, projectId)];
  if (filter.state) conditions.push(eq(pins.state, filter.state));
  if (filter.discipline) conditions.push(eq(pins.discipline, filter.discipline));
  if (filter.authorId) conditions.push(eq(pins.authorId, filter.authorId));
  const rows = await selectPins(getDb(), and(...conditions));
  return rows.map(presentPin);
}

/** Pins created or changed after `since` (reconnect catch-up). */
export async function listPinsChangedSince({ projectId, since }: { projectId: string; since: Date }) {
  const rows = await selectPins(getDb(), and(eq(pins.projectId, projectId), gt(pins.updatedAt, since)));
  return rows.map(presentPin);
}

/** Stores a pin unless its id is already stored (a client retry); answers whether this call wrote it. */
export async function insertPin({ db, projectId, authorId, input }: { db: Executor; projectId: string; authorId: string; input: PinCreateInput }): Promise<boolean> {
  const { anchor } = input;
  const point = "point" in anchor ? anchor.point : undefined;
  const inserted = await db
    .insert(pins)
    .values({
      id: input.id,
      projectId,
      anchorKind: anchor.kind,
      anchorId: anchor.kind === "point" ? null : anchor.id,
      anchorX: point?.[0] ?? null,
      anchorY: point?.[1] ?? null,
      anchorZ: point?.[2] ?? null,
      revisionId: input.revisionId,
      title: input.title,
      discipline: input.discipline,
      authorId,
    })
    .onConflictDoNothing({ target: pins.id })
    .returning({ id: pins.id });
  return inserted.length > 0;
}

/**
 * Marks a pin changed (its thread got a comment). A busy thread gets many comments at once: each would wait for the
 * one before it to commit (the pin row's lock), so comments on one pin queued behind each other. A comment that
 * finds the row being marked by another transaction skips it: that one stamps the same moment, give or take the
 * milliseconds the catch-up margin covers, and the stamp never moves back.
 */
export async function touchPin({ db, pinId }: { db: Executor; pinId: string }): Promise<void> {
  const free = db.select({ id: pins.id }).from(pins).where(eq(pins.id, pinId)).for("no key update", { skipLocked: true });
  await db
    .update(pins)
    .set({ updatedAt: sql`greatest(${pins.updatedAt}, ${new Date().toISOString()}::timestamptz)` })
    .where(inArray(pins.id, free));
}

/**
 * Whether the pin is in the project; holds it for the rest of the transaction. A step of the thread's record takes
 * it exclusively, so steps are written one at a time; a plain comment only keeps it from changing under it (waits
 * for a step, never for another comment: on a busy thread the comments would otherwise queue behind each other).
 */
export async function lockPinInProject({ db, projectId, pinId, exclusive }: { db: Executor; projectId: string; pinId: string; exclusive: boolean }): Promise<boolean> {
  const [pin] = await db
    .select({ id: pins.id })
    .from(pins)
    .where(and(eq(pins.id, pinId), eq(pins.projectId, projectId)))
    .for(exclusive ? "update" : "key share");
  return Boolean(pin);
}

/** Moves a thread to open, answered or closed; returns the updated pin. */
export async function setPinState({ projectId, pinId, state }: { projectId: string; pinId: string; state: PinState }) {
  await getDb()
    .update(pins)
    .set({ state })
    .where(and(eq(pins.projectId, projectId), eq(pins.id, pinId)));
  return getPinById({ projectId, pinId });
}

/** A pin's saved view and its author, or null when the pin is not the project's. */
export async function getPinViewpoint({ projectId, pinId, db = getDb() }: { projectId: string; pinId: string; db?: Executor }) {
  const [row] = await db.select({ viewpoint: pins.viewpoint, authorId: pins.authorId }).from(pins).where(and(eq(pins.projectId, projectId), eq(pins.id, pinId)));
  return row ?? null;
}

/** Stores a pin's saved view; false when the pin is not (or no longer) the project's. */
export async function setPinViewpoint({ projectId, pinId, viewpoint, db }: { projectId: string; pinId: string; viewpoint: StoredPinViewpoint; db: Executor }): Promise<boolean> {
  const rows = await db
    .update(pins)
    .set({ viewpoint, updatedAt: new Date() })
    .where(and(eq(pins.projectId, projectId), eq(pins.id, pinId)))
    .returning({ id: pins.id });
  return rows.length > 0;
}
