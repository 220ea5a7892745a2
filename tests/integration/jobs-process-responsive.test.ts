// The jobs process keeps answering while an analysis computes (issue 13): the solve, the review and the bytes to
// store run in a worker thread (server/jobs/analysis-thread.ts), so the process's event loop serves its health
// endpoint, the mail outbox and other jobs' progress meanwhile. When the computation held the event loop, a health
// request waited for the whole phase. No clock: the test counts health answers that come back while the job's row
// still says it is analysing or reviewing, one request after another until the job is done.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { freePort } from "@/scripts/stack/ports.mjs";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { jobRow } from "../support/job-queue";
import { startJobsProcess, type JobsProcess } from "../support/jobs-process";
import { until } from "../support/realtime";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let jobsProcess: JobsProcess;
let port: number;
// 50 x 50 bays, 20,000 members: a computation long enough for several health round trips on any machine.
const roof = { kind: "generate", params: { name: "Responsive grid", spanX: 150, spanY: 150, module: 3, depth: 2.5 } };

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("jobs-responsive");
  port = await freePort();
  jobsProcess = await startJobsProcess({ JOBS_PORT: String(port) });
  await until(() => jobsProcess.running(), "the jobs process serving its queues", 120_000);
});
afterAll(async () => {
  await jobsProcess.stop();
  await closeDb();
});

describe("the jobs process while an analysis computes", () => {
  it("answers its health endpoint during the analysis and review phases, and then stores the analysis", { timeout: 300_000 }, async () => {
    const response = await createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body: roof, user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId }));
    expect(response.status).toBe(202);
    const { job } = (await response.json()) as { job: { id: string } };

    let answeredWhileComputing = 0;
    for (;;) {
      const health = await fetch(`http://127.0.0.1:${port}/health`);
      expect(health.status).toBe(200);
      const row = await jobRow(job.id);
      if (row.state === "done" || row.state === "failed") break;
      if (row.phase === "analysis" || row.phase === "review") answeredWhileComputing += 1;
    }
    expect(await jobRow(job.id)).toMatchObject({ state: "done", error: null });
    expect(answeredWhileComputing).toBeGreaterThanOrEqual(3);
    expect(jobsProcess.running()).toBe(true);
  });
});
