// The review report as a job (issue 13 item 1, issue 17 item 15): asking for it queues a job in one transaction;
// the jobs process draws the PDF with progress and stores it (object storage and its record) with the job done;
// a failure stores nothing and can be retried by those who may make reports; outsiders and viewers are refused as
// the rule book says (report.make). The stored PDF is read back with poppler's pdfinfo and pdftotext.
import { execFileSync } from "node:child_process";
import { createHash, randomUUID } from "node:crypto";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { and, eq } from "drizzle-orm";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as download } from "@/app/api/projects/[projectId]/attachments/[attachmentId]/route";
import { GET as getJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/route";
import { POST as retryJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/retry/route";
import { POST as makeReport } from "@/app/api/projects/[projectId]/report/route";
import { listReportJobs } from "@/db/queries/jobs";
import { analysisRuns, attachments, auditEvents, clashDecisions, clashes, jobs, modelRevisions, pins, projects } from "@/db/schema";
import { analyzeModel } from "@/lib/analysis/analyze";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { markRevisionCurrent } from "@/lib/commands/mark-revision-current";
import { postComment } from "@/lib/commands/post-comment";
import { QUEUES } from "@/lib/jobs/queue";
import { reviewForStorage } from "@/lib/models/analyse";
import { buildReportPdf } from "@/lib/report/pdf";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { ListObjectsV2Command } from "@aws-sdk/client-s3";
import { bucket, getObject, s3 } from "@/lib/storage/s3";
import { runReportJob } from "@/server/jobs/report";
import { TRIPOD } from "@/tests/support/fixtures/report";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { jobRow, startQueueClient, stopQueueClient } from "../support/job-queue";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let boss: PgBoss;
let revisionId: string;
const work = mkdtempSync(path.join(tmpdir(), "strutroom-report-jobs-"));
const reportPath = () => `/api/projects/${fx.projectId}/report`;
const ask = async (user: FixtureUser | undefined, body: unknown) => makeReport(await buildRequest(reportPath(), { method: "POST", body, user }), routeContext({ projectId: fx.projectId }));
const jobCtx = (jobId: string) => routeContext({ projectId: fx.projectId, jobId });
const storedReportObjects = async () => ((await s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: `projects/${fx.projectId}/report/` }))).Contents ?? []).length;
const reportFiles = () => getDb().select().from(attachments).where(and(eq(attachments.projectId, fx.projectId), eq(attachments.purpose, "report")));

async function queued(user: FixtureUser, body: unknown = { revision: 1, combinations: ["ULS-1", "ULS-3"], compare: ["ULS-1", "ULS-3"] }) {
  const response = await ask(user, body);
  expect(response.status).toBe(202);
  return ((await response.json()) as { job: { id: string; state: string; kind: string } }).job;
}

/** pdftotext of the PDF, one string per page. */
function pagesOf(pdf: Uint8Array): string[] {
  const file = path.join(work, `${randomUUID()}.pdf`);
  writeFileSync(file, pdf);
  const pages = Number(/^Pages:\s+(\d+)/m.exec(execFileSync("pdfinfo", [file]).toString())?.[1]);
  return execFileSync("pdftotext", ["-raw", file, "-"]).toString().split("\f").slice(0, pages).map((p) => p.replace(/\s+/g, " "));
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("report-jobs");
  boss = await startQueueClient();
  const result = analyzeModel(TRIPOD);
  const revision = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "Lantern added", model: TRIPOD, source: "generated", createdBy: fx.users.structural_engineer.id, result, review: reviewForStorage(TRIPOD, result, "EN1993-1-1") });
  revisionId = revision.id;
  await markRevisionCurrent({ projectId: fx.projectId, number: revision.number, actorId: fx.users.structural_engineer.id });
  // Revision 2 (not current): 51 combinations, more than one report draws.
  const many: typeof TRIPOD = { ...TRIPOD, combinations: Array.from({ length: 51 }, (_, k) => ({ id: `U${k + 1}`, name: `${1 + k / 100}G`, factors: { dead: 1 + k / 100 } })) };
  const manyResult = analyzeModel(many);
  await createRevisionWithAnalysis({ projectId: fx.projectId, name: "Every factor", model: many, source: "generated", createdBy: fx.users.structural_engineer.id, result: manyResult, review: reviewForStorage(many, manyResult, "EN1993-1-1") });
  const [clash] = await getDb().insert(clashes).values({
    projectId: fx.projectId, revisionId, clashKey: "c-5e1d", memberId: "AB", runId: "SA-01", segmentIndex: 0, kind: "hard",
    gap: -0.02, depth: 0.02, requiredClearance: 0.05, pointX: 0.25, pointY: 0.43, pointZ: 0,
    outcome: "opening_accepted", conditions: "Sleeve 100 mm at mid-length", proposedBy: fx.users.mep_engineer.id, decidedBy: fx.users.structural_engineer.id, decidedAt: new Date("2026-03-03T10:00:00Z"),
  }).returning();
  await getDb().insert(clashDecisions).values([
    { clashId: clash.id, kind: "proposal", outcome: "opening_proposed", note: "Duct SA-01 needs a 100 mm opening", caution: STANDING_CAUTION, decidedBy: fx.users.mep_engineer.id, role: "mep_engineer", revisionId, createdAt: new Date("2026-03-02T16:00:00Z") },
    { clashId: clash.id, kind: "decision", outcome: "opening_accepted", conditions: "Sleeve 100 mm at mid-length", caution: STANDING_CAUTION, decidedBy: fx.users.structural_engineer.id, role: "structural_engineer", revisionId, createdAt: new Date("2026-03-03T10:00:00Z") },
  ]);
  await getDb().insert(pins).values({ id: randomUUID(), projectId: fx.projectId, anchorKind: "member", anchorId: "AD", title: "Can the lantern ring drop 200 mm?", discipline: "architectural", authorId: fx.users.architect.id });
  // A thread's record through the product's command: proposed, decided with conditions, superseded with a reason.
  const threadId = randomUUID();
  await getDb().insert(pins).values({ id: threadId, projectId: fx.projectId, anchorKind: "member", anchorId: "BD", title: "Cable tray through leg BD", discipline: "mep", authorId: fx.users.mep_engineer.id });
  const say = (user: FixtureUser, kind: "proposal" | "decision" | "supersession", body: string, conditions?: string) =>
    postComment({ id: randomUUID(), projectId: fx.projectId, pinId: threadId, authorId: user.id, authorName: user.name, body, kind, conditions });
  await say(fx.users.mep_engineer, "proposal", "Tray CT-3 through leg BD at 0.8 m.");
  await say(fx.users.structural_engineer, "decision", "Accepted for the tray only.", "Hole of 60 mm, edge distance 2 diameters");
  await say(fx.users.structural_engineer, "supersession", "The lantern load makes BD work harder.");
});
afterAll(async () => {
  rmSync(work, { recursive: true, force: true });
  await stopQueueClient(boss);
  await closeDb();
});

describe("asking for a report", () => {
  it("refuses the signed-out (401), outsiders (404), viewers (403: report.make) and unknown results (400, every field named), queuing nothing", async () => {
    const before = (await getDb().select().from(jobs).where(eq(jobs.projectId, fx.projectId))).length;
    expect((await ask(undefined, {})).status).toBe(401);
    expect((await ask(fx.users.outsider, {})).status).toBe(404);
    expect((await ask(fx.users.viewer, {})).status).toBe(403);
    const bad = await ask(fx.users.architect, { combinations: ["ULS-1", "NOPE"], compare: ["ULS-1", "ALSO-NOPE"] });
    expect(bad.status).toBe(400);
    const answer = await bad.json();
    expect(answer.issues.map((i: { path: string }) => i.path)).toEqual(["combinations", "compare"]);
    expect(answer.error).toContain("NOPE");
    expect((await ask(fx.users.architect, { revision: 9 })).status).toBe(404);
    expect((await ask(fx.users.architect, { compare: ["ULS-1"] })).status).toBe(400);
    expect((await getDb().select().from(jobs).where(eq(jobs.projectId, fx.projectId))).length).toBe(before);
  });

  it("refuses hostile bodies with a message, queuing nothing: a million ids, 51 results, a result twice, a revision id of another project, __proto__, 1e308", async () => {
    const before = (await getDb().select().from(jobs).where(eq(jobs.projectId, fx.projectId))).length;
    const refused = async (body: unknown, status: number) => {
      const init = typeof body === "string" ? { method: "POST", rawBody: body, user: fx.users.architect } : { method: "POST", body, user: fx.users.architect };
      const response = await makeReport(await buildRequest(reportPath(), init), routeContext({ projectId: fx.projectId }));
      expect(response.status, JSON.stringify(body).slice(0, 80)).toBe(status);
      // The message and every field's issue: what the form shows.
      const answer = (await response.json()) as { error: string; issues?: { message: string }[] };
      expect(answer.error.length).toBeGreaterThan(0);
      return [answer.error, ...(answer.issues ?? []).map((i) => i.message)].join(" ");
    };
    // A million ids is far over the JSON body cap (lib/limits.ts requestBytes.json): refused before it is parsed.
    expect(await refused({ combinations: Array.from({ length: 1_000_000 }, (_, k) => `C${k}`) }, 413)).toMatch(/\d/);
    expect(await refused({ combinations: Array.from({ length: 51 }, () => "ULS-1") }, 400)).toContain("at most 50");
    expect(await refused({ combinations: ["ULS-1", "ULS-3", "ULS-1"] }, 400)).toContain("ULS-1");
    // The body names a revision by its number within this project; a row id (another project's or not) is not a field.
    expect(await refused({ revisionId: randomUUID() }, 400)).toBeTruthy();
    expect(await refused('{"__proto__": {"combinations": ["ULS-1"]}, "revision": 1}', 400)).toBeTruthy();
    expect(await refused({ combinations: ["__proto__"] }, 400)).toContain("reserved");
    expect(await refused({ revision: 1e308 }, 400)).toContain("Revision numbers");
    // Every result of revision 2 by default: 51 combinations are more than a report draws, so the member chooses.
    expect(await refused({ revision: 2 }, 400)).toMatch(/51 .*at most 50/);
    expect((await getDb().select().from(jobs).where(eq(jobs.projectId, fx.projectId))).length).toBe(before);
  });

  it("queues one report job naming the jobs row, with an audit event; every team member may follow it", async () => {
    const job = await queued(fx.users.architect);
    expect(job).toMatchObject({ kind: "report", state: "queued" });
    const sent = await boss.fetch<{ jobId: string }>(QUEUES.report, { batchSize: 50 });
    expect(sent.filter((q) => q.data.jobId === job.id)).toHaveLength(1);
    expect(await jobRow(job.id)).toMatchObject({ revisionId, input: { revision: 1, combinations: ["ULS-1", "ULS-3"], compare: ["ULS-1", "ULS-3"] } });
    const events = await getDb().select().from(auditEvents).where(and(eq(auditEvents.projectId, fx.projectId), eq(auditEvents.action, "report.request")));
    expect(events.map((e) => e.details)).toContainEqual(expect.objectContaining({ jobId: job.id }));
    expect((await getJob(await buildRequest(`/api/projects/${fx.projectId}/jobs/${job.id}`, { user: fx.users.viewer }), jobCtx(job.id))).status).toBe(200);
    expect((await getJob(await buildRequest(`/api/projects/${fx.projectId}/jobs/${job.id}`, { user: fx.users.outsider }), jobCtx(job.id))).status).toBe(404);

    // One report at a time per member and revision: asking again while it is queued is a 409 that says to wait
    // (a member clicking twice, or a script, cannot fill the job runner); another member is not held up by it.
    const again = await ask(fx.users.architect, { revision: 1 });
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/already being made.*wait/);
    const other = await queued(fx.users.structural_engineer, { revision: 1 });
    expect(await runReportJob(job.id)).toBe("done");
    expect(await runReportJob(other.id)).toBe("done");
    expect((await ask(fx.users.architect, { revision: 1, combinations: ["ULS-1"] })).status).toBe(202);
    const last = (await getDb().select().from(jobs).where(and(eq(jobs.projectId, fx.projectId), eq(jobs.requestedBy, fx.users.architect.id), eq(jobs.state, "queued"))))[0];
    expect(await runReportJob(last.id)).toBe("done");
  });
});

describe("the report job", () => {
  it("draws with progress, stores the PDF with the job done, and the team downloads it", async () => {
    const job = await queued(fx.users.architect);
    const seen: string[] = [];
    const build: typeof buildReportPdf = async (input, onProgress) =>
      buildReportPdf(input, async (fraction) => {
        await onProgress?.(fraction);
        const row = await jobRow(job.id);
        seen.push(`${row.phase}:${row.percent}`);
      });
    expect(await runReportJob(job.id, { build })).toBe("done");
    // Drawing reports its share (10 % to 90 %) between parts, as the browser's progress bar shows it.
    expect(seen.length).toBeGreaterThanOrEqual(3);
    expect(seen.every((s) => s.startsWith("drawing:"))).toBe(true);
    const percents = seen.map((s) => Number(s.split(":")[1]));
    expect(percents).toEqual([...percents].sort((a, b) => a - b));
    expect(percents.at(-1)).toBe(90);

    const done = await jobRow(job.id);
    expect(done).toMatchObject({ state: "done", phase: "done", percent: 100, error: null });
    const outcome = done.outcome as { attachmentId: string; filename: string; pages: number; bytes: number };
    expect(outcome.filename).toBe("strutroom-review-rev1.pdf");
    const [file] = (await reportFiles()).filter((f) => f.id === outcome.attachmentId);
    expect(file).toMatchObject({ state: "ready", contentType: "application/pdf", revisionId, uploadedBy: fx.users.architect.id, sizeBytes: outcome.bytes });
    const bytes = (await getObject(file.objectKey))!;
    expect(bytes.byteLength).toBe(outcome.bytes);

    const text = pagesOf(bytes);
    expect(text).toHaveLength(outcome.pages);
    text.forEach((page, k) => expect(page, `page ${k + 1}`).toContain(STANDING_CAUTION));
    const all = text.join("\n").replace(/\s/g, "");
    const [project] = await getDb().select().from(projects).where(eq(projects.id, fx.projectId));
    const [revision] = await getDb().select().from(modelRevisions).where(eq(modelRevisions.id, revisionId));
    expect(text[0]).toContain(project.name);
    expect(text[0]).toContain("Revision 1: Lantern added");
    // Identity: who made it current (the audit event of markRevisionCurrent) and the hash of the stored model JSON.
    expect(all).toMatch(new RegExp(`Madecurrent\\d{4}-\\d{2}-\\d{2}\\d{2}:\\d{2}UTCby${fx.users.structural_engineer.name.replace(/\s/g, "")}`));
    expect(all).toContain(createHash("sha256").update(JSON.stringify(revision.model)).digest("hex"));
    // The decision history of the clash, both steps with who took them, and the reactions balance line.
    expect(all).toContain("ProposedOpeningproposed");
    expect(all).toContain("DecidedOpeningacceptedwithconditions");
    expect(all).toContain("DuctSA-01needsa100mmopening");
    expect(all).toContain("Reactionsbalance:");
    expect(all).toContain("Canthelanternringdrop200mm?");
    // The thread's record: each step with who, their role then, when, the current revision and its stored analysis
    // it was judged on, the conditions, the supersession's reason and what it supersedes, and the caution shown.
    const [analysis] = await getDb().select().from(analysisRuns).where(eq(analysisRuns.revisionId, revisionId));
    const judged = `revision 1, results of ${analysis.createdAt.toISOString().slice(0, 16).replace("T", " ")} UTC`;
    // Compared without whitespace, as table cells wrap long fixture names.
    const squeeze = (t: string) => t.replace(/\s/g, "");
    const escape = (t: string) => squeeze(t).replace(/[.*+?^${}()|[\]\\]/g, "\\$&");
    const when = "\\d{4}-\\d{2}-\\d{2}\\d{2}:\\d{2}";
    const [mep, structural] = [escape(`${fx.users.mep_engineer.name} (MEP engineer)`), escape(`${fx.users.structural_engineer.name} (Structural engineer)`)];
    expect(all).toContain("Decisionsinthreads");
    expect(all).toContain(squeeze('Thread "Cable tray through leg BD" on member BD (open)'));
    expect(all).toMatch(new RegExp(`${when}Proposed${mep}${escape(judged)}${escape("Tray CT-3 through leg BD at 0.8 m.")}`));
    expect(all).toMatch(new RegExp(`${when}Decided${structural}${escape(judged)}${escape("Accepted for the tray only. Conditions: Hole of 60 mm, edge distance 2 diameters")}`));
    expect(all).toMatch(new RegExp(`${when}Decisionsuperseded${structural}${escape(judged)}${escape(`Reason: The lantern load makes BD work harder. Supersedes the decision of ${fx.users.structural_engineer.name}`)}\\(${when}UTC\\)\\.`));
    expect(all).toContain(squeeze(`Caution shown with these steps: ${STANDING_CAUTION}`));

    const response = await download(await buildRequest(`/api/projects/${fx.projectId}/attachments/${file.id}`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId, attachmentId: file.id }));
    expect(response.status).toBe(302);
    expect((await download(await buildRequest(`/api/projects/${fx.projectId}/attachments/${file.id}`, { user: fx.users.outsider }), routeContext({ projectId: fx.projectId, attachmentId: file.id }))).status).toBe(404);
    // Delivered twice: the second delivery does nothing and stores no second file.
    const files = (await reportFiles()).length;
    expect(await runReportJob(job.id)).toBe("skipped");
    expect((await reportFiles()).length).toBe(files);
  });

  it("fails without storing anything, shows the reason, and runs again when someone who may make reports retries", async () => {
    const job = await queued(fx.users.mep_engineer);
    const before = (await reportFiles()).length;
    const objects = await storedReportObjects();
    const failing = { build: async () => { throw new Error("the plan drawing ran out of memory"); } };
    expect(await runReportJob(job.id, failing)).toBe("failed");
    expect((await reportFiles()).length).toBe(before);
    expect(await storedReportObjects()).toBe(objects);
    const failed = await (await getJob(await buildRequest(`/api/projects/${fx.projectId}/jobs/${job.id}`, { user: fx.users.viewer }), jobCtx(job.id))).json();
    expect(failed.job).toMatchObject({ kind: "report", state: "failed", error: expect.stringContaining("the plan drawing ran out of memory") });

    const retry = async (user: FixtureUser) => retryJob(await buildRequest(`/api/projects/${fx.projectId}/jobs/${job.id}/retry`, { method: "POST", user }), jobCtx(job.id));
    expect((await retry(fx.users.viewer)).status).toBe(403);
    expect((await retry(fx.users.outsider)).status).toBe(404);
    const retried = await retry(fx.users.owner);
    expect(retried.status).toBe(202);
    expect((await retried.json()).job).toMatchObject({ state: "queued", error: null });
    expect((await retry(fx.users.owner)).status).toBe(409);
    const sent = await boss.fetch<{ jobId: string }>(QUEUES.report, { batchSize: 50 });
    expect(sent.filter((q) => q.data.jobId === job.id).length).toBeGreaterThanOrEqual(1);
    const events = await getDb().select().from(auditEvents).where(eq(auditEvents.projectId, fx.projectId));
    expect(events).toContainEqual(expect.objectContaining({ action: "report.retry", actorId: fx.users.owner.id, subjectId: revisionId }));

    expect(await runReportJob(job.id)).toBe("done");
    expect((await reportFiles()).length).toBe(before + 1);
  });

  it("fails in plain words, saying what to do, when its stored request cannot be read (no validation dump), storing nothing", async () => {
    const job = await queued(fx.users.structural_engineer);
    // A row written by an older version, or by hand: the results are a string, not a list.
    await getDb().update(jobs).set({ input: { revision: 1, combinations: "ULS-1", compare: null } }).where(eq(jobs.id, job.id));
    const before = (await reportFiles()).length;
    expect(await runReportJob(job.id)).toBe("failed");
    expect((await reportFiles()).length).toBe(before);
    const failed = await (await getJob(await buildRequest(`/api/projects/${fx.projectId}/jobs/${job.id}`, { user: fx.users.viewer }), jobCtx(job.id))).json();
    expect(failed.job.error).toBe("The report stopped: the request stored with this job cannot be read (wrong: combinations), so retrying it would fail the same way; ask for a new report on the report page.");
  });

  it("stores nothing when the job stopped running before storing (retried elsewhere): the stored object is removed too", async () => {
    const job = await queued(fx.users.owner);
    const before = (await reportFiles()).length;
    const objects = await storedReportObjects();
    // The job is marked failed by another worker while this one draws: finishing must not store a file.
    const build: typeof buildReportPdf = async (input, onProgress) => {
      const built = await buildReportPdf(input, onProgress);
      await getDb().update(jobs).set({ state: "failed", error: "taken over" }).where(eq(jobs.id, job.id));
      return built;
    };
    expect(await runReportJob(job.id, { build })).toBe("skipped");
    expect((await reportFiles()).length).toBe(before);
    expect(await storedReportObjects()).toBe(objects);
    // The report page lists the finished reports only: the newest jobs here failed, the list still shows the last five made.
    const listed = await listReportJobs({ projectId: fx.projectId, revision: 1 });
    expect(listed).toHaveLength(5);
    expect(listed.every((j) => j.state === "done" && j.outcome)).toBe(true);
  });
});
