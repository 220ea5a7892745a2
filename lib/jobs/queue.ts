// The job queue: pg-boss 10 on the project's PostgreSQL (design.md, "jobs"). Commands send a job inside their own
// transaction (through bossDb), so a job exists exactly when the request's rows do; the jobs process works them.
import { sql, type SQL } from "drizzle-orm";
import PgBoss from "pg-boss";

/** Every queue of Strutroom; scripts/db-migrate.ts creates them, server/jobs works them. */
export const QUEUES = {
  /** Analysis and member review of one revision: data { jobId } (a row of the jobs table). */
  analysis: "revision-analysis",
  /** "Idle for any roof load" for a whole roof: data { jobId } (a jobs row of kind any_load). */
  anyLoad: "any-load-certificate",
  /** Hanging the services of one revision as a load case of a new one: data { jobId } (a jobs row of kind hang_services). */
  hangServices: "hang-services",
  /** The review report PDF of one revision: data { jobId } (a row of the jobs table, its input the report query). */
  report: "review-report",
  /** The daily digest of open threads, on a schedule; pg-boss sends one per slot however many processes run. */
  digest: "mail-digest",
  /** Removal of uploads nobody confirmed, on a schedule. */
  uploadSweep: "upload-sweep",
} as const;

/** Data of the analysis, any-load and hang-services jobs: the jobs row the browser watches. */
export type AnalysisJobData = { jobId: string };
/** What a report job's pg-boss message carries: the jobs row, whose input holds the report query. */
export type ReportJobData = { jobId: string };

/** Anything that runs a drizzle SQL query: the database or an open transaction. */
export type SqlRunner = { execute(query: SQL): Promise<{ rows: unknown[] }> };

/**
 * pg-boss's text-and-values SQL as a drizzle query: the text between placeholders raw, each value one parameter
 * (sql.param, so an array stays one parameter and undefined is sent as null, as pg does).
 */
function withParams(text: string, values: unknown[]): SQL {
  const parts = text.split(/\$(\d+)/);
  return sql.join(parts.map((part, k) => (k % 2 === 1 ? sql.param(values[Number(part) - 1] ?? null) : sql.raw(part))));
}

/** pg-boss's database interface over a drizzle database or transaction. */
export function bossDb(runner: SqlRunner): PgBoss.Db {
  return { executeSql: async (text, values) => ({ rows: (await runner.execute(withParams(text, values))).rows }) };
}

/**
 * Sends a job through the given transaction. Never started, this pg-boss instance only writes the job row; the
 * jobs process fetches it after the transaction commits. Throws when the queue does not exist (not migrated).
 */
export async function sendJob(tx: SqlRunner, queue: string, data: object, options: PgBoss.SendOptions = {}): Promise<string> {
  const db = bossDb(tx);
  const id = await new PgBoss({ db }).send(queue, data, { ...options, db });
  if (!id) throw new Error(`The job queue "${queue}" does not exist; run the database migration.`);
  return id;
}

/** Creates pg-boss's schema (its own migrations) and every queue; run with the database migration. */
export async function installQueues(connectionString: string): Promise<void> {
  const boss = new PgBoss({ connectionString, migrate: true, schedule: false, supervise: false });
  await boss.start();
  try {
    // A crashed jobs process leaves its job active until it expires; it is then retried (our jobs row lets a rerun
    // finish it, and a failed job stays failed until someone retries it).
    for (const name of Object.values(QUEUES)) {
      if (!(await boss.getQueue(name))) await boss.createQueue(name, { name, retryLimit: 2, retryDelay: 5, expireInSeconds: 30 * 60 });
    }
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
}
