// "Idle for any roof load" for the whole roof as a job (issue 15 item 9): started from the viewer's endpoint by the
// structural engineer only, worked by server/jobs/any-load.ts with progress, stored into the analysis's review in one
// transaction (a failure stores nothing and can be retried), refused for an unstable, certified or busy revision.
// The roof here is small; a roof past the whole-roof limit is stood in for by the same review with the certificate
// left out, as reviewForStorage leaves it out past 10,000 members (lib/models/analyse.test.ts).
import { and, eq } from "drizzle-orm";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as retryJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/retry/route";
import { POST as startAnyLoad } from "@/app/api/projects/[projectId]/models/[number]/any-load/route";
import { GET as getRevision } from "@/app/api/projects/[projectId]/models/[number]/route";
import { analysisRuns, auditEvents, jobs, memberships } from "@/db/schema";
import { analyzeModel, generateRoof } from "@/lib/analysis";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { QUEUES } from "@/lib/jobs/queue";
import { analyseForStorage, storedAnyLoad, type StoredReview } from "@/lib/models/analyse";
import { idleForAnyLoad, idleForAnyLoadAsync } from "@/lib/review/any-load";
import { createReviewContext } from "@/lib/review/context";
import { runAnyLoadJob } from "@/server/jobs/any-load";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { jobRow, startQueueClient, stopQueueClient } from "../support/job-queue";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { triangleModel } from "../support/fixtures/analysis-models";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let boss: PgBoss;
const model = generateRoof({ name: "Big roof stand-in", spanX: 9, spanY: 6, module: 3, depth: 1.5 });

async function saveUncertified(project = fx): Promise<{ id: string; number: number }> {
  const { result, review } = analyseForStorage(model, "EN1993-1-1");
  const uncertified: StoredReview = { ...structuredClone(review!), wholeRoofChecksLeftOut: "left out (stand-in for a roof past the limit)" };
  delete uncertified.anyLoad;
  for (const member of Object.values(uncertified.members)) delete member.anyLoad;
  return createRevisionWithAnalysis({ projectId: project.projectId, name: "uncertified", model, source: "generated", createdBy: project.users.structural_engineer.id, result, review: uncertified });
}
const start = async (number: number, user = fx.users.structural_engineer, project = fx) =>
  startAnyLoad(await buildRequest(`/api/projects/${project.projectId}/models/${number}/any-load`, { method: "POST", user }), routeContext({ projectId: project.projectId, number: String(number) }));
const reviewOf = async (revisionId: string) => (await getDb().select().from(analysisRuns).where(eq(analysisRuns.revisionId, revisionId)))[0].review!;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("any-load-job");
  boss = await startQueueClient();
});
afterAll(async () => {
  await stopQueueClient(boss);
  await closeDb();
});

describe("the whole-roof any-load job", () => {
  it("only the structural engineer may start it; it is queued once, and a second start while it runs is refused", async () => {
    const revision = await saveUncertified();
    for (const role of ["owner", "architect", "mep_engineer", "viewer"] as const) expect((await start(revision.number, fx.users[role])).status).toBe(403);
    expect((await start(revision.number, fx.users.outsider)).status).toBe(404);
    const response = await start(revision.number);
    expect(response.status).toBe(202);
    const { job } = await response.json();
    expect(job).toMatchObject({ kind: "any_load", state: "queued", revisionId: revision.id });
    const queued = await boss.fetch<{ jobId: string }>(QUEUES.anyLoad, { batchSize: 50 });
    expect(queued.filter((q) => q.data.jobId === job.id)).toHaveLength(1);
    const again = await start(revision.number);
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/already being checked/);
    // the revision answers the any-load job beside its analysis status, which it does not replace
    const read = await getRevision(await buildRequest(`/api/projects/${fx.projectId}/models/${revision.number}`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId, number: String(revision.number) }));
    const body = await read.json();
    expect(body.revision.anyLoadJob).toMatchObject({ id: job.id, state: "queued" });
    expect(body.revision.job).toBeNull();
    expect(body.abilities).toEqual({ runAnalysis: false });
    expect(read.headers.get("cache-control")).toBe("private, no-cache");
  });

  it("a failure stores nothing and says why; retried, it stores every member's answer with the job done", async () => {
    const revision = await saveUncertified();
    const { job } = await (await start(revision.number)).json();
    const phases: string[] = [];
    const failing = {
      certify: async (...args: Parameters<typeof idleForAnyLoadAsync>) => {
        await args[2](0.5);
        phases.push((await jobRow(job.id)).phase);
        throw new Error("out of memory in the unit loads");
      },
    };
    expect(await runAnyLoadJob(job.id, failing)).toBe("failed");
    expect(phases).toEqual(["unit loads"]);
    expect(await jobRow(job.id)).toMatchObject({ state: "failed", error: expect.stringContaining("out of memory in the unit loads") });
    const untouched = await reviewOf(revision.id);
    expect(untouched.anyLoad).toBeUndefined();
    expect(Object.values(untouched.members).every((m) => m.anyLoad === undefined)).toBe(true);

    const retried = await retryJob(await buildRequest(`/api/projects/${fx.projectId}/jobs/${job.id}/retry`, { method: "POST", user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId, jobId: job.id }));
    expect(retried.status).toBe(202);
    const requeued = await boss.fetch<{ jobId: string }>(QUEUES.anyLoad, { batchSize: 50 });
    expect(requeued.some((q) => q.data.jobId === job.id)).toBe(true);
    expect(await runAnyLoadJob(job.id)).toBe("done");
    expect(await jobRow(job.id)).toMatchObject({ state: "done", percent: 100, outcome: { idleForAnyLoad: expect.any(Number) } });

    // what was stored is the certificate of lib/review/any-load.ts on the same model (its own tests check statics)
    const expected = storedAnyLoad(model, idleForAnyLoad(createReviewContext(model, analyzeModel(model), { standard: "EN1993-1-1" })));
    const review = await reviewOf(revision.id);
    expect(review.anyLoad).toEqual(expected.anyLoad);
    for (const member of model.members) expect(review.members[member.id].anyLoad).toEqual(expected.members[member.id]);
    expect(Object.keys(review.members)).toHaveLength(model.members.length);
    expect(review.members[model.members[0].id].verdict).toBeDefined(); // the rest of each member's review is kept
    const actions = (await getDb().select().from(auditEvents).where(eq(auditEvents.subjectId, revision.id))).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(["anyLoad.start", "anyLoad.store"]));
    // certified: nothing left to start, and a second delivery of the job does nothing
    expect((await start(revision.number)).status).toBe(409);
    expect(await runAnyLoadJob(job.id)).toBe("skipped");
  });

  it("a structural engineer removed a second ago cannot start it, and nothing is queued", async () => {
    const team = await createProjectFixture("any-load-job-removed");
    const revision = await saveUncertified(team);
    const engineer = team.users.structural_engineer;
    await getDb().delete(memberships).where(and(eq(memberships.projectId, team.projectId), eq(memberships.userId, engineer.id)));
    const response = await start(revision.number, engineer, team);
    expect(response.status).toBe(404);
    expect(await getDb().select().from(jobs).where(eq(jobs.revisionId, revision.id))).toEqual([]);
    expect((await reviewOf(revision.id)).anyLoad).toBeUndefined();
  });

  it("is refused for an unstable revision", async () => {
    const unstable = triangleModel({ supports: [["A", true, true, true], ["B", false, true, true]] });
    const result = analyzeModel(unstable);
    expect(result.status).toBe("unstable");
    const revision = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "unstable", model: unstable, source: "uploaded", createdBy: fx.users.structural_engineer.id, result, review: null });
    const response = await start(revision.number);
    expect(response.status).toBe(409);
    expect((await response.json()).error).toMatch(/unstable/);
  });
});
