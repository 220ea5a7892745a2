// What the job tests share: a pg-boss client that only sends and fetches (no schedule, supervision or migration: the
// jobs process and our migrations own those), and the jobs row the browser polls.
import { eq } from "drizzle-orm";
import PgBoss from "pg-boss";
import { jobs } from "@/db/schema";
import { getDb } from "./db";

export async function startQueueClient(): Promise<PgBoss> {
  const boss = new PgBoss({ connectionString: process.env.DATABASE_URL!, schedule: false, supervise: false, migrate: false });
  await boss.start();
  return boss;
}

export const stopQueueClient = (boss: PgBoss) => boss.stop({ graceful: false, wait: true });

/** The jobs row of `jobId` as stored now. */
export const jobRow = async (jobId: string) => (await getDb().select().from(jobs).where(eq(jobs.id, jobId)))[0];
