import "server-only";
import { and, desc, eq, inArray, sql } from "drizzle-orm";
import { getDb, type Executor } from "@/db/client";
import { jobs, modelRevisions, users, type Job } from "@/db/schema";
import { insertLiveEvent } from "./live-events";

/** What the browser sees of a job. */
export type JobView = Pick<Job, "id" | "kind" | "state" | "phase" | "percent" | "error" | "outcome"> & { revisionId: string; updatedAt: string };

const view = (job: Job): JobView => ({
  id: job.id,
  kind: job.kind,
  revisionId: job.revisionId,
  state: job.state,
  phase: job.phase,
  percent: job.percent,
  error: job.error,
  outcome: job.outcome,
  updatedAt: job.updatedAt.toISOString(),
});

/** Inserts a queued job row (the caller sends the pg-boss job in the same transaction). */
export async function insertJob(
  tx: Executor,
  values: { projectId: string; kind: Job["kind"]; revisionId: string; input?: Record<string, unknown>; requestedBy: string | null },
): Promise<JobView> {
  const [row] = await tx.insert(jobs).values(values).returning();
  return view(row);
}

/** One job of the project, or null (a job of another project is null too). */
export async function getProjectJob({ projectId, jobId, db = getDb() }: { projectId: string; jobId: string; db?: Executor }): Promise<JobView | null> {
  const [row] = await db.select().from(jobs).where(and(eq(jobs.id, jobId), eq(jobs.projectId, projectId))).limit(1);
  return row ? view(row) : null;
}

/** The newest job of each of the given revisions, of one kind (the analysis, which is the revision's status, unless told). */
export async function latestJobsOfRevisions({ revisionIds, kind = "analysis", db = getDb() }: { revisionIds: string[]; kind?: Job["kind"]; db?: Executor }): Promise<Map<string, JobView>> {
  if (revisionIds.length === 0) return new Map();
  const rows = await db
    .selectDistinctOn([jobs.revisionId])
    .from(jobs)
    .where(and(inArray(jobs.revisionId, revisionIds), eq(jobs.kind, kind)))
    .orderBy(jobs.revisionId, desc(jobs.createdAt));
  return new Map(rows.map((row) => [row.revisionId, view(row)]));
}

// Every change of a job's state, phase or percent is also a live event of kind "job" (the job's id) in the same
// transaction, so the browser's progress bar follows it over the live bus (NOTIFY on commit) rather than by polling.
const jobChanged = (tx: Executor, row: { id: string; projectId: string }) => insertLiveEvent({ db: tx, projectId: row.projectId, kind: "job", subjectId: row.id });

/**
 * Marks a queued (or, after a crash, still running) job as running and returns it; null when it is done, failed or
 * gone, so a delivery that comes twice does no work twice.
 */
export async function claimJob({ jobId, db = getDb() }: { jobId: string; db?: Executor }): Promise<Job | null> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(jobs)
      .set({ state: "running", phase: "starting", percent: 0, error: null, updatedAt: sql`now()` })
      .where(and(eq(jobs.id, jobId), inArray(jobs.state, ["queued", "running"])))
      .returning();
    if (row) await jobChanged(tx, row);
    return row ?? null;
  });
}

/** Records how far a running job is. */
export async function setJobProgress({ jobId, phase, percent, db = getDb() }: { jobId: string; phase: string; percent: number; db?: Executor }): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx.update(jobs).set({ phase, percent, updatedAt: sql`now()` }).where(and(eq(jobs.id, jobId), eq(jobs.state, "running"))).returning({ id: jobs.id, projectId: jobs.projectId });
    if (row) await jobChanged(tx, row);
  });
}

/** Marks a running job done with its outcome; false when it was not running (then the caller rolls back). */
export async function finishJob(tx: Executor, { jobId, outcome }: { jobId: string; outcome: Record<string, unknown> | null }): Promise<boolean> {
  const [row] = await tx
    .update(jobs)
    .set({ state: "done", phase: "done", percent: 100, outcome, updatedAt: sql`now()` })
    .where(and(eq(jobs.id, jobId), eq(jobs.state, "running")))
    .returning({ id: jobs.id, projectId: jobs.projectId });
  if (row) await jobChanged(tx, row);
  return Boolean(row);
}

/** Marks a running job failed with the reason shown to the team. */
export async function failJob({ jobId, error, db = getDb() }: { jobId: string; error: string; db?: Executor }): Promise<void> {
  await db.transaction(async (tx) => {
    const [row] = await tx
      .update(jobs)
      .set({ state: "failed", phase: "failed", error, updatedAt: sql`now()` })
      .where(and(eq(jobs.id, jobId), eq(jobs.state, "running")))
      .returning({ id: jobs.id, projectId: jobs.projectId });
    if (row) await jobChanged(tx, row);
  });
}

/** Puts a failed job of the project back in the queue; null unless it was failed. */
export async function requeueFailedJob(tx: Executor, { projectId, jobId }: { projectId: string; jobId: string }): Promise<JobView | null> {
  const [row] = await tx
    .update(jobs)
    .set({ state: "queued", phase: "queued", percent: 0, error: null, updatedAt: sql`now()` })
    .where(and(eq(jobs.id, jobId), eq(jobs.projectId, projectId), eq(jobs.state, "failed")))
    .returning();
  if (row) await jobChanged(tx, row);
  return row ? view(row) : null;
}

/** Whether the revision has a queued or running job of this kind (asked for by this user, when one is named). */
export async function hasActiveJob(db: Executor, { revisionId, kind, requestedBy }: { revisionId: string; kind: Job["kind"]; requestedBy?: string }): Promise<boolean> {
  const [row] = await db
    .select({ id: jobs.id })
    .from(jobs)
    .where(and(eq(jobs.revisionId, revisionId), eq(jobs.kind, kind), inArray(jobs.state, ["queued", "running"]), requestedBy ? eq(jobs.requestedBy, requestedBy) : undefined))
    .limit(1);
  return Boolean(row);
}

/** A report job of a revision as the report page lists it. */
export type ReportJobView = JobView & { requestedBy: string | null; createdAt: string };

/** The newest finished report jobs of a revision (by number; their outcome names the stored PDF), newest first, with who asked for each. */
export async function listReportJobs({ projectId, revision, limit = 5, db = getDb() }: { projectId: string; revision: number; limit?: number; db?: Executor }): Promise<ReportJobView[]> {
  const rows = await db
    .select({ job: jobs, requestedBy: users.name })
    .from(jobs)
    .innerJoin(modelRevisions, eq(modelRevisions.id, jobs.revisionId))
    .leftJoin(users, eq(users.id, jobs.requestedBy))
    .where(and(eq(jobs.projectId, projectId), eq(modelRevisions.number, revision), eq(jobs.kind, "report"), eq(jobs.state, "done")))
    .orderBy(desc(jobs.createdAt))
    .limit(limit);
  return rows.map(({ job, requestedBy }) => ({ ...view(job), requestedBy, createdAt: job.createdAt.toISOString() }));
}
