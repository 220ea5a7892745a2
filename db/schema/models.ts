// Models area: immutable model revisions (the model JSON of our format) and the analysis run stored with each
// (results and member review as jsonb, for the CLI's format and the exports; the same results as columns for the
// viewer, lib/models/result-columns.ts), so opening the viewer never waits for a solve (design.md, "Data").
import { sql } from "drizzle-orm";
import { boolean, integer, jsonb, pgEnum, pgTable, primaryKey, text, uniqueIndex, uuid, index } from "drizzle-orm/pg-core";
import type { AnalysisResult } from "../../lib/analysis/analyze";

/** The analysis's `info` without the maps that name every member: what the viewer opens with. */
export type InfoOverview = Omit<AnalysisResult["info"], "governing" | "lowForce">;
import type { TrussModel } from "../../lib/analysis/model";
import type { StoredReview } from "../../lib/models/analyse";
import { bytea } from "./bytea";
import { projects, timestamps, users } from "./core";

export const REVISION_SOURCES = ["generated", "uploaded"] as const;
export const revisionSource = pgEnum("revision_source", REVISION_SOURCES);
export const ANALYSIS_STATUSES = ["ok", "unstable"] as const;
export const analysisStatus = pgEnum("analysis_status", ANALYSIS_STATUSES);

export const modelRevisions = pgTable(
  "model_revisions",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    /** 1, 2, 3 … per project. */
    number: integer().notNull(),
    name: text().notNull(),
    /** The validated model; never updated after insert. */
    model: jsonb().$type<TrussModel>().notNull(),
    /** The model without nodes, members, materials and sections: what the viewer's summary sends (issue 13). */
    modelOverview: jsonb()
      .$type<Pick<TrussModel, "name" | "supports" | "loadCases" | "combinations">>()
      // Deleting keys (an immutable operator, as a generated column needs) leaves name, supports, load cases and combinations.
      .generatedAlwaysAs(sql`model - '{format,materials,sections,nodes,members}'::text[]`),
    source: revisionSource().notNull(),
    /** members.length of the model, so listing revisions never loads a model. */
    memberCount: integer().notNull().default(0),
    /**
     * The viewer's binary geometry (lib/models/geometry-wire.ts), packed once when the revision is saved, so opening
     * the viewer reads bytes instead of parsing the whole model (issue 13 navigation). Null for revisions saved before
     * migration 0019: those are packed on request.
     */
    geometry: bytea(),
    /** Member ids in model order: the order of every result column (one member's value is read by its index). */
    memberOrder: text().array().notNull().default(sql`'{}'::text[]`),
    createdBy: uuid().references(() => users.id, { onDelete: "set null" }),
    /** The revision the structural engineer marked current (for review); pages open it by default. */
    isCurrent: boolean().notNull().default(false),
    ...timestamps,
  },
  (t) => [
    uniqueIndex("model_revisions_project_number_idx").on(t.projectId, t.number),
    // At most one current revision per project.
    uniqueIndex("model_revisions_current_idx").on(t.projectId).where(sql`is_current`),
  ],
);

export const analysisRuns = pgTable(
  "analysis_runs",
  {
    id: uuid().primaryKey().defaultRandom(),
    revisionId: uuid()
      .notNull()
      .references(() => modelRevisions.id, { onDelete: "cascade" }),
    status: analysisStatus().notNull(),
    /** The analysis result of design.md (plus its `info`). Both JSON columns are lz4-compressed (migration 0018). */
    result: jsonb().$type<AnalysisResult>().notNull(),
    /** The member review of lib/review for the project's design standard; null when the model is unstable. */
    review: jsonb().$type<StoredReview>(),
    // The two small parts the viewer opens with (…/summary), kept apart by PostgreSQL itself: reading them from
    // `review` and `result` decompressed megabytes of per-member rows on every opening (issue 13 navigation).
    /** The review without its per-member rows. */
    reviewOverview: jsonb().$type<Omit<StoredReview, "members">>().generatedAlwaysAs(sql`review - 'members'`),
    /** The result's `info` (warnings, checks of the whole roof) without its per-member maps (governing, lowForce). */
    infoOverview: jsonb().$type<InfoOverview>().generatedAlwaysAs(sql`(result -> 'info') - '{governing,lowForce}'::text[]`),
    /** Float32 utilisation per member in member order (NaN: no check); null without a review. */
    utilisation: bytea(),
    /** Verdict code per member (lib/models/result-columns.ts VERDICT_CODES); null without a review. */
    verdicts: bytea(),
    /** Bitset of the members zero in every result. */
    zeroInAll: bytea(),
    ...timestamps,
  },
  (t) => [index("analysis_runs_revision_idx").on(t.revisionId, t.createdAt)],
);

/** One result (load case or combination) of a run as columns in member order; written with the run, never updated. */
export const resultColumns = pgTable(
  "result_columns",
  {
    analysisRunId: uuid()
      .notNull()
      .references(() => analysisRuns.id, { onDelete: "cascade" }),
    resultId: text().notNull(),
    /** Float32 axial force per member (kN, tension positive). */
    forces: bytea().notNull(),
    /** Bitset: zero-force in this result (design.md's rule). */
    zero: bytea().notNull(),
    /** Float32 ux, uy, uz per node in model node order (m). */
    displacements: bytea().notNull(),
    ...timestamps,
  },
  (t) => [primaryKey({ columns: [t.analysisRunId, t.resultId] })],
);

export type ModelRevision = typeof modelRevisions.$inferSelect;
export type NewModelRevision = typeof modelRevisions.$inferInsert;
export type AnalysisRun = typeof analysisRuns.$inferSelect;
