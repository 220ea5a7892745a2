// Jobs area: heavy work (analysis and review of a revision, hanging the services, report PDFs) runs in the jobs
// process from a pg-boss queue. This table is what the browser sees of each job (state, phase, percent, error);
// pg-boss keeps the delivery. Both rows are written in the transaction of the command that asks for the work, so a
// job never exists for half a request.
import { index, integer, jsonb, pgEnum, pgTable, text, uuid } from "drizzle-orm/pg-core";
import { JOB_KINDS } from "../../lib/jobs/kinds";
import { projects, timestamps, users } from "./core";
import { modelRevisions } from "./models";

export const jobKind = pgEnum("job_kind", JOB_KINDS);
export const JOB_STATES = ["queued", "running", "done", "failed"] as const;
export const jobState = pgEnum("job_state", JOB_STATES);

export const jobs = pgTable(
  "jobs",
  {
    id: uuid().primaryKey().defaultRandom(),
    projectId: uuid()
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    kind: jobKind().notNull(),
    /** The revision the job works on. */
    revisionId: uuid()
      .notNull()
      .references(() => modelRevisions.id, { onDelete: "cascade" }),
    state: jobState().notNull().default("queued"),
    /** What the job is doing now, in words for the progress bar ("analysis", "review", "storing"). */
    phase: text().notNull().default("queued"),
    percent: integer().notNull().default(0),
    /** Why the job failed, shown to the team; null unless failed. */
    error: text(),
    /** Kind-specific input, e.g. the revision to compare zero-force members with. */
    input: jsonb().$type<Record<string, unknown>>().notNull().default({}),
    /** Small kind-specific outcome for the browser, e.g. the zero-force change after hanging the services. */
    outcome: jsonb().$type<Record<string, unknown>>(),
    requestedBy: uuid().references(() => users.id, { onDelete: "set null" }),
    ...timestamps,
  },
  (t) => [index("jobs_revision_idx").on(t.revisionId, t.createdAt), index("jobs_project_idx").on(t.projectId, t.createdAt)],
);

export type Job = typeof jobs.$inferSelect;
