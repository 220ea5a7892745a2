// Entry of the jobs process (design.md, "jobs"): sends the mail outbox, sweeps uploads nobody confirmed and queues
// the daily digest of open threads, each on a croner schedule. All state lives in PostgreSQL (the outbox and the
// attachments table), so several job processes may run: claims use SKIP LOCKED and digests a per-day dedupe key.
import { Cron } from "croner";
import { closeDb } from "../../db/client";
import { queueDailyDigests } from "../../lib/mail/digest";
import { processOutbox } from "../../lib/mail/outbox";
import { sweepStaleUploads } from "../../lib/storage/attachments";

const log = (message: string) => console.log(`[jobs] ${message}`);
const onError = (name: string) => (error: unknown) => console.error(`[jobs] ${name} failed:`, error);

const jobs = [
  // protect: a run that is still busy is skipped, never doubled.
  new Cron("*/5 * * * * *", { name: "mail-outbox", protect: true, catch: onError("mail-outbox") }, async () => {
    const run = await processOutbox();
    if (run.sent || run.retrying || run.failed) log(`mail: ${run.sent} sent, ${run.retrying} to retry, ${run.failed} given up`);
  }),
  new Cron("*/10 * * * *", { name: "upload-sweep", protect: true, catch: onError("upload-sweep") }, async () => {
    const removed = await sweepStaleUploads({ now: new Date() });
    if (removed) log(`removed ${removed} upload(s) nobody confirmed`);
  }),
  new Cron(process.env.MAIL_DIGEST_CRON ?? "0 7 * * *", { name: "daily-digest", timezone: process.env.MAIL_DIGEST_TIMEZONE ?? "UTC", protect: true, catch: onError("daily-digest") }, async () => {
    log(`daily digest: ${await queueDailyDigests({ now: new Date() })} mail(s) queued`);
  }),
];
log(`running: ${jobs.map((job) => `${job.name} (next ${job.nextRun()?.toISOString()})`).join(", ")}`);

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  log(`${signal}: stopping`);
  for (const job of jobs) job.stop();
  await closeDb();
  process.exit(0);
}
process.on("SIGTERM", () => void stop("SIGTERM"));
process.on("SIGINT", () => void stop("SIGINT"));
