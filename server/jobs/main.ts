// Entry of the jobs process (design.md, "jobs"). pg-boss 10 on the project's PostgreSQL delivers the analysis,
// any-load, hang-services and report jobs that commands queue, and runs the upload sweep and the daily digest as
// pg-boss schedules: a schedule sends one job per slot however many job processes run, so two processes never send
// the digest twice (and the digest keeps its per-day dedupe key as well). The mail outbox is read every 5 s on a
// croner timer (pg-boss schedules are per minute); claims use SKIP LOCKED, so several processes may send without
// doubling a mail.
import { Cron } from "croner";
import PgBoss from "pg-boss";
import { closeDb } from "../../db/client";
import { QUEUES, type AnalysisJobData, type ReportJobData } from "../../lib/jobs/queue";
import { queueDailyDigests } from "../../lib/commands/queue-daily-digests";
import { processOutbox } from "./mail-outbox";
import { sweepStaleUploads } from "../../lib/commands/stored-files";
import { runAnalysisJob } from "./analysis";
import { runAnyLoadJob } from "./any-load";
import { runHangServicesJob } from "./hang-services";
import { runReportJob } from "./report";
import { serveHealth } from "./health";

const log = (message: string) => console.log(`[jobs] ${message}`);
const onError = (name: string) => (error: unknown) => console.error(`[jobs] ${name} failed:`, error);

const connectionString = process.env.DATABASE_URL;
if (!connectionString) throw new Error("DATABASE_URL is not set.");
const jobsPort = Number(process.env.JOBS_PORT);
if (!jobsPort) throw new Error("JOBS_PORT is not set (the port of the jobs process's health endpoint).");
const boss = new PgBoss({ connectionString, max: 4 });
boss.on("error", onError("queue"));
await boss.start();

// One analysis at a time per process: it is CPU-bound and the machine's other processes need the cores too.
await boss.work<AnalysisJobData>(QUEUES.analysis, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
  const state = await runAnalysisJob(job.data.jobId);
  log(`analysis job ${job.data.jobId}: ${state}`);
});
await boss.work<AnalysisJobData>(QUEUES.anyLoad, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
  const state = await runAnyLoadJob(job.data.jobId);
  log(`any-load job ${job.data.jobId}: ${state}`);
});
await boss.work<AnalysisJobData>(QUEUES.hangServices, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
  const state = await runHangServicesJob(job.data.jobId);
  log(`hang-services job ${job.data.jobId}: ${state}`);
});
await boss.work<ReportJobData>(QUEUES.report, { batchSize: 1, pollingIntervalSeconds: 1 }, async ([job]) => {
  const state = await runReportJob(job.data.jobId);
  log(`report job ${job.data.jobId}: ${state}`);
});
await boss.schedule(QUEUES.uploadSweep, "*/10 * * * *");
await boss.work(QUEUES.uploadSweep, async () => {
  const removed = await sweepStaleUploads({ now: new Date() });
  if (removed) log(`removed ${removed} upload(s) nobody confirmed`);
});
await boss.schedule(QUEUES.digest, process.env.MAIL_DIGEST_CRON ?? "0 7 * * *", {}, { tz: process.env.MAIL_DIGEST_TIMEZONE ?? "UTC" });
await boss.work(QUEUES.digest, async () => {
  log(`daily digest: ${await queueDailyDigests({ now: new Date() })} mail(s) queued`);
});

// protect: a run that is still busy is skipped, never doubled.
const outbox = new Cron("*/5 * * * * *", { name: "mail-outbox", protect: true, catch: onError("mail-outbox") }, async () => {
  const run = await processOutbox();
  if (run.sent || run.retrying || run.failed) log(`mail: ${run.sent} sent, ${run.retrying} to retry, ${run.failed} given up`);
});
// Listening only once the queues are served, so the supervisor's wait for the port means "ready".
const health = await serveHealth(jobsPort);
log(`running: queues ${Object.values(QUEUES).join(", ")}; mail outbox every 5 s`);

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  log(`${signal}: stopping`);
  outbox.stop();
  health.close();
  await boss.stop({ graceful: true, wait: true, timeout: 20_000 });
  await closeDb();
  process.exit(0);
}
process.on("SIGTERM", () => void stop("SIGTERM"));
process.on("SIGINT", () => void stop("SIGINT"));
