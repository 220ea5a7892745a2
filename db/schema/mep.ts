// MEP area: duct and pipe runs stored per model revision, the clashes found between them and the members, and the
// history of every decision on a clash (design.md, "Data").
import { date, doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { CLASH_ENTRY_KINDS, CLASH_KINDS, CLASH_OUTCOMES, CLASH_STATUSES } from "../../lib/clash/outcomes";
import type { RunPoint, RunProfile } from "../../lib/mep/schemas";
import { projectRole, projects, timestamps, users } from "./core";
import { analysisRuns, modelRevisions } from "./models";

export const clashKind = pgEnum("clash_kind", CLASH_KINDS);
export const clashOutcome = pgEnum("clash_outcome", CLASH_OUTCOMES);
export const clashStatus = pgEnum("clash_status", CLASH_STATUSES);
export const clashEntryKind = pgEnum("clash_entry_kind", CLASH_ENTRY_KINDS);

export const mepRuns = pgTable(
  "mep_runs",
  {
    id: uuid().primaryKey().defaultRandom(),
    revisionId: uuid()
      .notNull()
      .references(() => modelRevisions.id, { onDelete: "cascade" }),
    /** The designer's tag ("SA-01"); clash ids are derived from it. */
    runId: text().notNull(),
    name: text(),
    system: text().notNull(),
    profile: jsonb().$type<RunProfile>().notNull(),
    insulation: doublePrecision().notNull(),
    clearance: doublePrecision().notNull(),
    weightPerMetre: doublePrecision().notNull(),
    points: jsonb().$type<RunPoint[]>().notNull(),
    createdBy: uuid().references(() => users.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [uniqueIndex("mep_runs_revision_run_idx").on(t.revisionId, t.runId)],
);

export const clashes = pgTable(
  "clashes",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    revisionId: uuid()
      .notNull()
      .references(() => modelRevisions.id, { onDelete: "cascade" }),
    /** Stable id: hash of (member, run, segment); pins anchor to it, so threads follow across revisions. */
    clashKey: text().notNull(),
    memberId: text().notNull(),
    runId: text().notNull(),
    segmentIndex: integer().notNull(),
    kind: clashKind().notNull(),
    status: clashStatus().notNull().default("active"),
    /** Signed surface distance (m, negative = overlap), depth (overlap or clearance shortfall, m), required clearance. */
    gap: doublePrecision().notNull(),
    depth: doublePrecision().notNull(),
    requiredClearance: doublePrecision().notNull(),
    pointX: doublePrecision().notNull(),
    pointY: doublePrecision().notNull(),
    pointZ: doublePrecision().notNull(),
    /** Summary of the history (clash_decisions holds every step): the standing decision, else the open proposal. */
    outcome: clashOutcome(),
    note: text().notNull().default(""),
    conditions: text(),
    proposedBy: uuid().references(() => users.id, { onDelete: "set null" }),
    proposedAt: timestamp({ withTimezone: true }),
    decidedBy: uuid().references(() => users.id, { onDelete: "set null" }),
    decidedAt: timestamp({ withTimezone: true }),
    /** Set when a newer revision's results changed what the decision relied on ("needs another look"), in words. */
    recheckReason: text(),
    /** Why the clash was closed (its member or run changed or vanished in a newer revision). */
    closedReason: text(),
    assigneeId: uuid().references(() => users.id, { onDelete: "set null" }),
    dueOn: date({ mode: "string" }),
    ...timestamps,
  },
  (t) => [uniqueIndex("clashes_revision_key_idx").on(t.revisionId, t.clashKey), index("clashes_project_key_idx").on(t.projectId, t.clashKey)],
);

/**
 * The history of a clash, append-only (a database trigger refuses updates): every proposal, decision,
 * supersession, re-check and closure, with who (and their role then), the revision and result set it was judged on,
 * and the caution shown at the time.
 */
export const clashDecisions = pgTable(
  "clash_decisions",
  {
    id: uuid().primaryKey().defaultRandom(),
    clashId: uuid()
      .notNull()
      .references(() => clashes.id, { onDelete: "cascade" }),
    kind: clashEntryKind().notNull().default("proposal"),
    /** The outcome proposed or decided; for a supersession, re-check or closure, the outcome it concerned. */
    outcome: clashOutcome(),
    note: text().notNull().default(""),
    conditions: text(),
    /** Why: a refusal, a supersession, a re-check or a closure, in words. */
    reason: text(),
    caution: text().notNull(),
    /** Who acted (null for the system's re-checks and closures, or an account since deleted). */
    decidedBy: uuid().references(() => users.id, { onDelete: "set null" }),
    role: projectRole(),
    revisionId: uuid().references(() => modelRevisions.id, { onDelete: "set null" }),
    analysisRunId: uuid().references(() => analysisRuns.id, { onDelete: "set null" }),
    /** For a supersession: the decision it supersedes. */
    supersedesId: uuid(),
    ...timestamps,
  },
  (t) => [index("clash_decisions_clash_idx").on(t.clashId, t.createdAt)],
);

export type MepRun = typeof mepRuns.$inferSelect;
export type NewMepRun = typeof mepRuns.$inferInsert;
export type ClashRow = typeof clashes.$inferSelect;
export type ClashDecision = typeof clashDecisions.$inferSelect;
