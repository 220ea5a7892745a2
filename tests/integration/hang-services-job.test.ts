// Hanging the services as a job (issue 13 item 1): the route only checks (zod, the rule book, the revision and its
// runs) and queues one job with its audit and live event; server/jobs/hang-services.ts hangs the runs, detects the
// clashes and stores the new revision with its runs and clashes and its analysis job in one transaction. Attackers
// first: nobody without model.edit + analysis.run queues anything, hostile spacings are a 400 listing every
// problem, and runs changed between queueing and running fail the job with its reason, storing nothing.
import { and, eq } from "drizzle-orm";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as retryJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/retry/route";
import { PATCH as EDIT_RUN } from "@/app/api/projects/[projectId]/runs/[runId]/route";
import { POST as IMPORT } from "@/app/api/projects/[projectId]/runs/route";
import { POST as HANG } from "@/app/api/projects/[projectId]/services/route";
import { auditEvents, clashes, jobs, liveEvents, memberships, mepRuns, modelRevisions } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { detectClashes } from "@/lib/clash/detect";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import type { HangServicesOutcome } from "@/lib/commands/store-hung-services";
import { QUEUES } from "@/lib/jobs/queue";
import { hangServices } from "@/lib/mep/services";
import { analyseForStorage } from "@/lib/models/analyse";
import { packGeometry } from "@/lib/models/geometry-wire";
import { runHangServicesJob } from "@/server/jobs/hang-services";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { jobRow, startQueueClient, stopQueueClient } from "../support/job-queue";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let boss: PgBoss;

// Invented test roof and duct (the geometry of tests/integration/mep-clashes-api.test.ts): a 9 m × 9 m roof on 3 m
// modules, 2 m deep, and one 11 m supply-air duct at y = 1.5, z = 2 across the four y-direction top chords.
const roof = generateRoof({ name: "Hang job roof", spanX: 9, spanY: 9, module: 3, depth: 2 });
const csv = [
  "run,system,shape,diameter,width,height,rotation,insulation,clearance,weight_per_metre,x,y,z",
  "SA-01,supply air,round,0.5,,,,0.05,0.1,0.35,-1,1.5,2",
  "SA-01,,,,,,,,,,10,1.5,2",
].join("\n");

/** A fresh analysed revision of the test roof, with the duct imported onto it unless told otherwise. */
async function revisionWithRuns(project = fx, { runs = true } = {}): Promise<{ id: string; number: number }> {
  const { result, review } = analyseForStorage(roof, "EN1993-1-1");
  const revision = await createRevisionWithAnalysis({ projectId: project.projectId, name: "roof", model: roof, source: "generated", createdBy: project.users.structural_engineer.id, result, review });
  if (runs) {
    const body = { revision: revision.number, fileName: "runs.csv", text: csv, mode: "replace" };
    const imported = await IMPORT(await buildRequest(`/api/projects/${project.projectId}/runs`, { method: "POST", body, user: project.users.mep_engineer }), routeContext({ projectId: project.projectId }));
    expect(imported.status).toBe(201);
  }
  return revision;
}

/** POST …/services as `user` (null: signed out). */
const hang = async (body: unknown, user: FixtureUser | null = fx.users.structural_engineer, project = fx) =>
  HANG(await buildRequest(`/api/projects/${project.projectId}/services`, { method: "POST", body, user: user ?? undefined }), routeContext({ projectId: project.projectId }));
const hangJobsOf = (projectId: string) => getDb().select().from(jobs).where(and(eq(jobs.projectId, projectId), eq(jobs.kind, "hang_services")));
const revisionsOf = async (projectId: string) => (await getDb().select({ number: modelRevisions.number, createdBy: modelRevisions.createdBy }).from(modelRevisions).where(eq(modelRevisions.projectId, projectId))).sort((a, b) => a.number - b.number);
/** The hang-services jobs waiting in pg-boss (fetched, so each is seen once; other files' jobs may be among them). */
async function queuedHangJobIds(): Promise<string[]> {
  const fetched = await boss.fetch<{ jobId: string }>(QUEUES.hangServices, { batchSize: 100 });
  return fetched.map((job) => job.data.jobId);
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("hang-job");
  boss = await startQueueClient();
});
afterAll(async () => {
  await stopQueueClient(boss);
  await closeDb();
});

describe("who may queue hanging the services", () => {
  it("signed out 401, outsider 404, every role without model.edit + analysis.run 403: no job queued", async () => {
    const revision = await revisionWithRuns();
    expect((await hang({ revision: revision.number }, null)).status).toBe(401);
    expect((await hang({ revision: revision.number }, fx.users.outsider)).status).toBe(404);
    for (const role of ["owner", "architect", "mep_engineer", "viewer"] as const) expect((await hang({ revision: revision.number }, fx.users[role])).status).toBe(403);
    // the jobs row and its pg-boss job are written in one transaction: no row, no delivery
    expect(await hangJobsOf(fx.projectId)).toEqual([]);
  });

  it("a structural engineer removed a second ago is refused (404) and nothing is queued", async () => {
    const team = await createProjectFixture("hang-job-removed");
    const revision = await revisionWithRuns(team);
    const engineer = team.users.structural_engineer;
    await getDb().delete(memberships).where(and(eq(memberships.projectId, team.projectId), eq(memberships.userId, engineer.id)));
    expect((await hang({ revision: revision.number }, engineer, team)).status).toBe(404);
    expect(await hangJobsOf(team.projectId)).toEqual([]);
  });

  it("hostile spacings and revision numbers are a 400 naming every problem; nothing is queued", async () => {
    const revision = await revisionWithRuns();
    const bad = await hang({ revision: 1.5, hangerSpacing: 0.01 });
    expect(bad.status).toBe(400);
    const body = await bad.json();
    expect(body.issues.map((issue: { path: string }) => issue.path).sort()).toEqual(["hangerSpacing", "revision"]);
    expect(body.issues.find((issue: { path: string }) => issue.path === "hangerSpacing").message).toMatch(/closer than 0\.5 m/);
    for (const hangerSpacing of [1e6, -2.5, "2.5", null, { $gt: 0 }]) expect((await hang({ revision: revision.number, hangerSpacing })).status).toBe(400);
    // 1e999 is Infinity once parsed: a number, but not a finite one
    const infinite = await HANG(await buildRequest(`/api/projects/${fx.projectId}/services`, { method: "POST", rawBody: `{"revision":${revision.number},"hangerSpacing":1e999}`, user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId }));
    expect(infinite.status).toBe(400);
    expect(await hangJobsOf(fx.projectId)).toEqual([]);
  });

  it("a revision with no runs is a 400 and one that does not exist a 404; nothing is queued", async () => {
    const bare = await revisionWithRuns(fx, { runs: false });
    const none = await hang({ revision: bare.number });
    expect(none.status).toBe(400);
    expect((await none.json()).issues).toEqual([{ path: "revision", message: "This revision has no runs to hang." }]);
    expect((await hang({ revision: 999_999 })).status).toBe(404);
    expect(await hangJobsOf(fx.projectId)).toEqual([]);
  });
});

describe("the hang-services job", () => {
  it("goes through its phases on the live bus and stores the new revision, its runs, clashes and analysis job at once", async () => {
    const revision = await revisionWithRuns();
    const before = await revisionsOf(fx.projectId);
    const response = await hang({ revision: revision.number, hangerSpacing: 2.5 });
    expect(response.status).toBe(202);
    const { job } = await response.json();
    expect(job).toMatchObject({ kind: "hang_services", state: "queued", revisionId: revision.id });
    expect(await queuedHangJobIds()).toContain(job.id);
    // a second request while it waits would make an identical revision: refused
    const again = await hang({ revision: revision.number });
    expect(again.status).toBe(409);
    expect((await again.json()).error).toMatch(/already being hung/);

    const phases: string[] = [];
    const steps = {
      hang: async (...args: Parameters<typeof hangServices>) => {
        phases.push((await jobRow(job.id)).phase);
        return hangServices(...args);
      },
      detect: async (...args: Parameters<typeof detectClashes>) => {
        phases.push((await jobRow(job.id)).phase);
        return detectClashes(...args);
      },
    };
    expect(await runHangServicesJob(job.id, steps)).toBe("done");
    const done = await jobRow(job.id);
    expect(done).toMatchObject({ state: "done", phase: "done", percent: 100 });
    const outcome = done.outcome as HangServicesOutcome;
    // The duct is 11 m long at 0.35 kN/m: 3.85 kN hung in all (hand arithmetic); it crosses four top chords.
    expect(outcome.totalLoad).toBeCloseTo(3.85, 9);
    expect(outcome.detection).toMatchObject({ found: 4, hard: 4 });
    expect(outcome.revision.number).toBe(before.at(-1)!.number + 1);
    expect(outcome.analysisJob).toMatchObject({ kind: "analysis", state: "queued", revisionId: outcome.revision.id });
    expect(await jobRow(outcome.analysisJob.id)).toMatchObject({ input: { compareWith: revision.id } });
    expect(await getDb().select().from(mepRuns).where(eq(mepRuns.revisionId, outcome.revision.id))).toHaveLength(1);
    // the new revision is stored with its viewer geometry, packed from its own (hung) model
    const [hung] = await getDb().select({ model: modelRevisions.model, geometry: modelRevisions.geometry }).from(modelRevisions).where(eq(modelRevisions.id, outcome.revision.id));
    expect(Buffer.from(hung.geometry!).equals(Buffer.from(packGeometry(hung.model)))).toBe(true);
    expect(await getDb().select().from(clashes).where(eq(clashes.revisionId, outcome.revision.id))).toHaveLength(4);
    expect(phases).toEqual(["hanging", "clashes"]);

    // every change of the job is a live event of the job's id: queued, claimed, three phases, done
    const events = await getDb().select().from(liveEvents).where(eq(liveEvents.subjectId, job.id));
    expect(events.map((e) => e.kind)).toEqual(["job", "job", "job", "job", "job", "job"]);
    expect(await getDb().select().from(liveEvents).where(and(eq(liveEvents.kind, "revision"), eq(liveEvents.subjectId, outcome.revision.id)))).toHaveLength(1);
    const audit = (await getDb().select().from(auditEvents).where(eq(auditEvents.projectId, fx.projectId))).map((e) => e.action);
    expect(audit).toEqual(expect.arrayContaining(["services.hang", "services.store"]));
    // a second delivery of the same job does nothing
    expect(await runHangServicesJob(job.id)).toBe("skipped");
    expect(await revisionsOf(fx.projectId)).toHaveLength(before.length + 1);
  });

  it("a failing step stores nothing and says why; retried by someone allowed, it stores everything", async () => {
    const revision = await revisionWithRuns();
    const before = await revisionsOf(fx.projectId);
    const analysisJobs = () => getDb().select().from(jobs).where(and(eq(jobs.projectId, fx.projectId), eq(jobs.kind, "analysis")));
    const analysesBefore = (await analysisJobs()).length;
    const { job } = await (await hang({ revision: revision.number })).json();
    const failing = {
      hang: hangServices,
      detect: () => {
        throw new Error("out of memory while detecting clashes");
      },
    };
    expect(await runHangServicesJob(job.id, failing)).toBe("failed");
    expect(await jobRow(job.id)).toMatchObject({ state: "failed", phase: "failed", error: "Hanging the services stopped: out of memory while detecting clashes" });
    expect(await revisionsOf(fx.projectId)).toEqual(before);
    expect(await analysisJobs()).toHaveLength(analysesBefore);

    const retry = async (user: FixtureUser) => retryJob(await buildRequest(`/api/projects/${fx.projectId}/jobs/${job.id}/retry`, { method: "POST", user }), routeContext({ projectId: fx.projectId, jobId: job.id }));
    // the MEP engineer may edit runs but not models nor analyses: the retry asks both, as hanging does
    for (const role of ["mep_engineer", "architect", "viewer"] as const) expect((await retry(fx.users[role])).status).toBe(403);
    expect((await retry(fx.users.structural_engineer)).status).toBe(202);
    expect(await queuedHangJobIds()).toContain(job.id);
    expect(await runHangServicesJob(job.id)).toBe("done");
    expect(await revisionsOf(fx.projectId)).toHaveLength(before.length + 1);
  });

  it("runs changed between queueing and running fail the job with the reason, storing nothing; retry fails the same way", async () => {
    const revision = await revisionWithRuns();
    const before = await revisionsOf(fx.projectId);
    const { job } = await (await hang({ revision: revision.number })).json();
    const edit = await EDIT_RUN(
      await buildRequest(`/api/projects/${fx.projectId}/runs/SA-01`, { method: "PATCH", body: { revision: revision.number, weightPerMetre: 0.5 }, user: fx.users.mep_engineer }),
      routeContext({ projectId: fx.projectId, runId: "SA-01" }),
    );
    expect(edit.status).toBe(200);
    expect(await runHangServicesJob(job.id)).toBe("failed");
    expect((await jobRow(job.id)).error).toBe(
      `Hanging the services stopped: the runs of revision ${revision.number} changed after the hanging was queued (edited, added or removed), so it would not hang what was asked for; hang the services again to use the runs as they are now`,
    );
    expect(await revisionsOf(fx.projectId)).toEqual(before);
    // asked again, the new job hangs the runs as they are now
    const { job: fresh } = await (await hang({ revision: revision.number })).json();
    expect(await runHangServicesJob(fresh.id)).toBe("done");
    expect(((await jobRow(fresh.id)).outcome as HangServicesOutcome).totalLoad).toBeCloseTo(11 * 0.5, 9);
  });

  it("runs changed while the job computes fail it at storing, inside the transaction: nothing stored", async () => {
    const revision = await revisionWithRuns();
    const before = await revisionsOf(fx.projectId);
    const { job } = await (await hang({ revision: revision.number })).json();
    const editDuringDetection = {
      hang: hangServices,
      detect: async (...args: Parameters<typeof detectClashes>) => {
        const body = { revision: revision.number, points: [{ x: -1, y: 1.5, z: 2 }, { x: 12, y: 1.5, z: 2 }] };
        const edit = await EDIT_RUN(await buildRequest(`/api/projects/${fx.projectId}/runs/SA-01`, { method: "PATCH", body, user: fx.users.mep_engineer }), routeContext({ projectId: fx.projectId, runId: "SA-01" }));
        expect(edit.status).toBe(200);
        return detectClashes(...args);
      },
    };
    expect(await runHangServicesJob(job.id, editDuringDetection)).toBe("failed");
    expect((await jobRow(job.id)).error).toMatch(/changed after the hanging was queued/);
    expect(await revisionsOf(fx.projectId)).toEqual(before);
  });

  it("a source revision removed before the job runs takes its job with it: the delivery does nothing and stores nothing", async () => {
    const team = await createProjectFixture("hang-job-deleted");
    const revision = await revisionWithRuns(team);
    const { job } = await (await hang({ revision: revision.number }, team.users.structural_engineer, team)).json();
    await getDb().delete(modelRevisions).where(eq(modelRevisions.id, revision.id));
    expect(await runHangServicesJob(job.id)).toBe("skipped");
    expect(await revisionsOf(team.projectId)).toEqual([]);
  });

  it("a job queued by a member removed since runs as the team's work: the revision names who asked", async () => {
    const team = await createProjectFixture("hang-job-left");
    const revision = await revisionWithRuns(team);
    const engineer = team.users.structural_engineer;
    const { job } = await (await hang({ revision: revision.number }, engineer, team)).json();
    await getDb().delete(memberships).where(and(eq(memberships.projectId, team.projectId), eq(memberships.userId, engineer.id)));
    expect(await runHangServicesJob(job.id)).toBe("done");
    expect((await revisionsOf(team.projectId)).at(-1)).toEqual({ number: revision.number + 1, createdBy: engineer.id });
  });
});
