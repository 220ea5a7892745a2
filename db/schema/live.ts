// The live-events outbox: each command writes what it changed here in its own transaction; the realtime server
// is told by NOTIFY, reads the unpublished rows and pushes invalidations to the project's room. A rolled-back
// command leaves no row, and rows written while the realtime server was down are published when it starts.
import { sql } from "drizzle-orm";
import { bigserial, index, integer, pgEnum, pgTable, text, timestamp, uuid } from "drizzle-orm/pg-core";
import { LIVE_EVENT_KINDS } from "../../lib/realtime/live-events";
import { projects } from "./core";

export const liveEventKind = pgEnum("live_event_kind", LIVE_EVENT_KINDS);

export const liveEvents = pgTable(
  "live_events",
  {
    id: bigserial({ mode: "number" }).primaryKey(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    kind: liveEventKind().notNull(),
    subjectId: text().notNull(),
    revision: integer(),
    createdAt: timestamp({ withTimezone: true }).notNull().defaultNow(),
    /** Set by the realtime server once pushed; null rows are still to publish. */
    publishedAt: timestamp({ withTimezone: true }),
  },
  (t) => [index("live_events_unpublished_idx").on(t.id).where(sql`published_at is null`)],
);

export type LiveEventRow = typeof liveEvents.$inferSelect;
