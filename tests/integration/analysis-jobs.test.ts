// The analysis queue (issue 13): a new revision is stored with a queued job in the same transaction, the jobs
// process analyses it with progress, a failure stores nothing and can be retried, and only the team sees the job.
import { eq } from "drizzle-orm";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/route";
import { POST as retryJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/retry/route";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { analysisRuns, auditEvents, jobs, modelRevisions } from "@/db/schema";
import { getRevisionForAnalysis } from "@/db/queries/models";
import { analyzeModel } from "@/lib/analysis";
import { QUEUES } from "@/lib/jobs/queue";
import { reviewForStorage } from "@/lib/models/analyse";
import { runAnalysisJob } from "@/server/jobs/analysis";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { jobRow, startQueueClient, stopQueueClient } from "../support/job-queue";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let boss: PgBoss;
const roof = { kind: "generate", params: { name: "Queued grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
const jobCtx = (jobId: string) => routeContext({ projectId: fx.projectId, jobId });
const jobPath = (jobId: string) => `/api/projects/${fx.projectId}/jobs/${jobId}`;
/** A stand-in analysis thread of tests/support/analysis-workers that fails. */
const failingWorker = (name: string) => new URL(`../support/analysis-workers/${name}.mjs`, import.meta.url);
const runsOf = async (revisionId: string) => getDb().select().from(analysisRuns).where(eq(analysisRuns.revisionId, revisionId));

async function saveRoof() {
  const response = await createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body: roof, user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId }));
  expect(response.status).toBe(202);
  return (await response.json()) as { revision: { id: string; number: number }; job: { id: string; state: string } };
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("analysis-jobs");
  boss = await startQueueClient();
});
afterAll(async () => {
  await stopQueueClient(boss);
  await closeDb();
});

describe("queued analysis", () => {
  it("stores the revision without analysis and sends one pg-boss job naming the jobs row", async () => {
    const { revision, job } = await saveRoof();
    expect(await runsOf(revision.id)).toEqual([]);
    const [stored] = await getDb().select().from(modelRevisions).where(eq(modelRevisions.id, revision.id));
    expect(stored.memberCount).toBe(stored.model.members.length);
    const queued = await boss.fetch<{ jobId: string }>(QUEUES.analysis, { batchSize: 50 });
    expect(queued.filter((q) => q.data.jobId === job.id)).toHaveLength(1);
  });

  it("lets every team member follow the job, and nobody else", async () => {
    const { job } = await saveRoof();
    expect((await getJob(await buildRequest(jobPath(job.id)), jobCtx(job.id))).status).toBe(401);
    expect((await getJob(await buildRequest(jobPath(job.id), { user: fx.users.outsider }), jobCtx(job.id))).status).toBe(404);
    const other = await createProjectFixture("analysis-jobs-other");
    // A member of another project asking for this job through their own project: no such job there.
    const foreign = await getJob(await buildRequest(`/api/projects/${other.projectId}/jobs/${job.id}`, { user: other.users.viewer }), routeContext({ projectId: other.projectId, jobId: job.id }));
    expect(foreign.status).toBe(404);
    const seen = await getJob(await buildRequest(jobPath(job.id), { user: fx.users.viewer }), jobCtx(job.id));
    expect(seen.status).toBe(200);
    expect((await seen.json()).job).toMatchObject({ id: job.id, state: "queued", phase: "queued", percent: 0 });
  });

  it("analyses and reviews the revision, reporting each phase, and stores both with the job done", async () => {
    const { revision, job } = await saveRoof();
    const phases: string[] = [];
    // Each phase the thread reports is on the jobs row (what the browser sees) before the next one is written.
    const onPhase = async (phase: string) => void phases.push(`${phase}:${(await jobRow(job.id)).phase}`);
    expect(await runAnalysisJob(job.id, { onPhase })).toBe("done");
    expect(phases).toEqual(["analysis:analysis", "review:review", "storing:storing"]);
    const [run] = await runsOf(revision.id);
    expect(run.status).toBe("ok");
    expect(run.review?.members).toBeDefined();
    expect(await jobRow(job.id)).toMatchObject({ state: "done", percent: 100, error: null });
    // Delivered twice (a crashed worker's job expiring): the second delivery does nothing.
    expect(await runAnalysisJob(job.id)).toBe("skipped");
    expect(await runsOf(revision.id)).toHaveLength(1);
  });

  it("stores the design-format JSON equal to the analysis of the stored model", async () => {
    const { revision, job } = await saveRoof();
    expect(await runAnalysisJob(job.id)).toBe("done");
    const { model, standard, deflectionLimit } = (await getRevisionForAnalysis({ revisionId: revision.id }))!;
    const [run] = await runsOf(revision.id);
    const result = analyzeModel(model);
    // jsonb keeps values, not text: compared as parsed JSON, as every reader (CLI format, exports) sees it
    expect(run.result).toEqual(JSON.parse(JSON.stringify(result)));
    expect(run.review).toEqual(JSON.parse(JSON.stringify(reviewForStorage(model, result, standard, deflectionLimit))));
  });

  it("fails without storing anything when the computation throws, shows the reason, and runs again when the structural engineer retries", async () => {
    const { revision, job } = await saveRoof();
    expect(await runAnalysisJob(job.id, { worker: failingWorker("throws-in-review") })).toBe("failed");
    expect(await runsOf(revision.id)).toEqual([]);
    const failed = await (await getJob(await buildRequest(jobPath(job.id), { user: fx.users.architect }), jobCtx(job.id))).json();
    expect(failed.job).toMatchObject({ state: "failed", error: expect.stringContaining("out of memory in the review") });

    for (const role of ["owner", "architect", "mep_engineer", "viewer"] as const) {
      expect((await retryJob(await buildRequest(`${jobPath(job.id)}/retry`, { method: "POST", user: fx.users[role] }), jobCtx(job.id))).status).toBe(403);
    }
    const retried = await retryJob(await buildRequest(`${jobPath(job.id)}/retry`, { method: "POST", user: fx.users.structural_engineer }), jobCtx(job.id));
    expect(retried.status).toBe(202);
    expect((await retried.json()).job).toMatchObject({ state: "queued", error: null });
    // Only a failed job can be retried.
    expect((await retryJob(await buildRequest(`${jobPath(job.id)}/retry`, { method: "POST", user: fx.users.structural_engineer }), jobCtx(job.id))).status).toBe(409);
    const events = await getDb().select().from(auditEvents).where(eq(auditEvents.projectId, fx.projectId));
    expect(events).toContainEqual(expect.objectContaining({ action: "analysis.retry", actorId: fx.users.structural_engineer.id, subjectId: revision.id }));

    expect(await runAnalysisJob(job.id)).toBe("done");
    expect(await runsOf(revision.id)).toHaveLength(1);
  });

  it("fails without storing anything when the computation's thread ends midway, and a retry stores the analysis", async () => {
    const { revision, job } = await saveRoof();
    expect(await runAnalysisJob(job.id, { worker: failingWorker("ends-midway") })).toBe("failed");
    expect(await runsOf(revision.id)).toEqual([]);
    expect(await jobRow(job.id)).toMatchObject({ state: "failed", error: expect.stringContaining("exit code 7") });
    const retried = await retryJob(await buildRequest(`${jobPath(job.id)}/retry`, { method: "POST", user: fx.users.structural_engineer }), jobCtx(job.id));
    expect(retried.status).toBe(202);
    expect(await runAnalysisJob(job.id)).toBe("done");
    expect(await runsOf(revision.id)).toHaveLength(1);
  });

  it("stores no revision and no job when the request is refused", async () => {
    const before = (await getDb().select().from(jobs).where(eq(jobs.projectId, fx.projectId))).length;
    const response = await createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body: roof, user: fx.users.architect }), routeContext({ projectId: fx.projectId }));
    expect(response.status).toBe(403);
    expect((await getDb().select().from(jobs).where(eq(jobs.projectId, fx.projectId))).length).toBe(before);
  });
});
