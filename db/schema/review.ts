// Review area: pins and their comment threads, mention notifications, live review sessions and the persisted
// Yjs document of each project (design.md, "Data").
import { sql } from "drizzle-orm";
import {
  bigserial,
  boolean,
  doublePrecision,
  index,
  jsonb,
  pgEnum,
  pgTable,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";
import type { StoredPinViewpoint } from "../../lib/bcf/viewpoint";
import type { Viewpoint } from "../../lib/realtime/viewpoint";
import { ANCHOR_KINDS, COMMENT_KINDS, DISCIPLINES, PIN_STATES, type SessionView } from "../../lib/realtime/events";
import { bytea } from "./bytea";
import { projectRole, projects, timestamps, users } from "./core";
import { analysisRuns, modelRevisions } from "./models";

export const pinState = pgEnum("pin_state", PIN_STATES);
export const anchorKind = pgEnum("anchor_kind", ANCHOR_KINDS);
export const discipline = pgEnum("discipline", DISCIPLINES);
export const commentKind = pgEnum("comment_kind", COMMENT_KINDS);
export const NOTIFICATION_KINDS = ["mention"] as const;
export const notificationKind = pgEnum("notification_kind", NOTIFICATION_KINDS);

export const pins = pgTable(
  "pins",
  {
    // Chosen by the client (uuid) so a write retried after a reconnect is applied once.
    id: uuid().primaryKey(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    anchorKind: anchorKind().notNull(),
    // Member, node or clash id (stable across revisions); null for a point anchor.
    anchorId: text(),
    // A point anchor's point, or the point clicked on a member's axis or a node when the pin was placed in 3D (m).
    anchorX: doublePrecision(),
    anchorY: doublePrecision(),
    anchorZ: doublePrecision(),
    // The model revision shown when the pin was made (no foreign key: revisions live in another area's table).
    revisionId: uuid(),
    title: text().notNull(),
    state: pinState().notNull().default("open"),
    discipline: discipline().notNull(),
    authorId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    // The view the pin was made in (camera, selected member, result, colouring, section box); a BCF viewpoint.
    viewpoint: jsonb().$type<StoredPinViewpoint>(),
    // The BCF topic GUID of a pin imported from BCF (exports use it, else the pin id): re-imports merge into it.
    bcfGuid: text(),
    // Carried from BCF topics and written back on export.
    labels: text().array().notNull().default(sql`'{}'::text[]`),
    assignedTo: text(),
    dueAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [
    index("pins_project_idx").on(t.projectId, t.updatedAt),
    index("pins_anchor_idx").on(t.projectId, t.anchorKind, t.anchorId),
    uniqueIndex("pins_bcf_guid_idx").on(t.projectId, t.bcfGuid),
  ],
);

export const comments = pgTable(
  "comments",
  {
    id: uuid().primaryKey(),
    pinId: uuid()
      .notNull()
      .references(() => pins.id, { onDelete: "cascade" }),
    authorId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: "restrict" }),
    kind: commentKind().notNull().default("comment"),
    body: text().notNull(),
    // Users named with @ in the body (resolved against the project's members when the comment was written).
    mentions: uuid().array().notNull().default(sql`'{}'::uuid[]`),
    // The BCF comment GUID of an imported comment (a re-import skips it), and its author when not on the team.
    bcfGuid: text(),
    externalAuthor: text(),
    // What a step of the thread's record (a proposal, decision or supersession; lib/realtime/thread-record.ts) keeps,
    // append-only (a database trigger refuses changes and deletes): the author's role then, a decision's conditions,
    // the revision and result set it was judged on (the project's current revision and its newest analysis), the
    // standing caution shown, and for a supersession the decision it supersedes. Written for members' comments too
    // (role); null on imported ones.
    role: projectRole(),
    conditions: text(),
    revisionId: uuid().references(() => modelRevisions.id, { onDelete: "set null" }),
    analysisRunId: uuid().references(() => analysisRuns.id, { onDelete: "set null" }),
    caution: text(),
    supersedesId: uuid(),
    // The writer's view when the comment was written (camera, selected member, result, colouring, section box);
    // set once with the comment, never changed.
    viewpoint: jsonb().$type<Viewpoint>(),
    ...timestamps,
  },
  (t) => [index("comments_pin_idx").on(t.pinId, t.createdAt), uniqueIndex("comments_bcf_guid_idx").on(t.pinId, t.bcfGuid)],
);

export const notifications = pgTable(
  "notifications",
  {
    id: uuid().primaryKey().defaultRandom(),
    userId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    kind: notificationKind().notNull(),
    payload: jsonb()
      .$type<{ projectId: string; pinId: string; commentId: string; byName: string; excerpt: string }>()
      .notNull(),
    readAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  (t) => [index("notifications_user_idx").on(t.userId, t.createdAt)],
);

export const reviewSessions = pgTable(
  "review_sessions",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    presenterId: uuid()
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    // The presenter's last view (camera, selected member, chosen result) so late joiners start where it is.
    view: jsonb().$type<SessionView>(),
    startedAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    endedAt: timestamp({ withTimezone: true }),
    ...timestamps,
  },
  // At most one live session per project.
  (t) => [uniqueIndex("review_sessions_live_idx").on(t.projectId).where(sql`ended_at is null`)],
);

/** Yjs updates of each project's live document; compaction merges old rows into one `compacted` row. */
export const yjsUpdates = pgTable(
  "yjs_updates",
  {
    id: bigserial({ mode: "number" }).primaryKey(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    update: bytea().notNull(),
    compacted: boolean().notNull().default(false),
    ...timestamps,
  },
  (t) => [index("yjs_updates_project_idx").on(t.projectId, t.id)],
);

export type Pin = typeof pins.$inferSelect;
export type NewPin = typeof pins.$inferInsert;
export type Comment = typeof comments.$inferSelect;
export type Notification = typeof notifications.$inferSelect;
export type ReviewSession = typeof reviewSessions.$inferSelect;
