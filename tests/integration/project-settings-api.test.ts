// The project's deflection limit span/N (issue 15 item 6): only the owner and the structural engineer change it,
// every bad value is refused with each problem named, the change is audited, the analysis job reviews with the
// project's limit as it is when the job runs, and a later change leaves stored reviews as they were.
import { and, eq } from "drizzle-orm";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getProject, PATCH as patchProject } from "@/app/api/projects/[projectId]/route";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { analysisRuns, auditEvents, projects } from "@/db/schema";
import type { StoredReview } from "@/lib/models/analyse";
import { runAnalysisJob } from "@/server/jobs/analysis";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { startQueueClient, stopQueueClient } from "../support/job-queue";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let boss: PgBoss;
const path = () => `/api/projects/${fx.projectId}`;
const patch = async (user: FixtureUser | undefined, body: unknown) => patchProject(await buildRequest(path(), { method: "PATCH", user, body }), routeContext({ projectId: fx.projectId }));
const storedLimit = async () => (await getDb().select({ n: projects.deflectionLimit }).from(projects).where(eq(projects.id, fx.projectId)))[0].n;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("project-settings");
  boss = await startQueueClient();
});
afterAll(async () => {
  await stopQueueClient(boss);
  await closeDb();
});

describe("PATCH /api/projects/[projectId] (deflection limit)", () => {
  it("starts at the stated default span/250 and shows it to every member", async () => {
    const response = await getProject(await buildRequest(path(), { user: fx.users.viewer }), routeContext({ projectId: fx.projectId }));
    expect((await response.json()).project).toMatchObject({ deflectionLimit: 250, abilities: { "project.settings": false } });
  });

  it("refuses the signed-out (401), an outsider (404) and the architect, MEP engineer and viewer (403), changing nothing", async () => {
    expect((await patch(undefined, { deflectionLimit: 300 })).status).toBe(401);
    expect((await patch(fx.users.outsider, { deflectionLimit: 300 })).status).toBe(404);
    for (const role of ["architect", "mep_engineer", "viewer"] as const) expect((await patch(fx.users[role], { deflectionLimit: 300 })).status).toBe(403);
    expect(await storedLimit()).toBe(250);
  });

  it("answers 400 listing every problem: not whole, out of bounds, not a number, unknown field", async () => {
    const bad = await patch(fx.users.owner, { deflectionLimit: 99.5, colour: "red" });
    expect(bad.status).toBe(400);
    const { issues } = (await bad.json()) as { issues: { path: string; message: string }[] };
    expect(issues).toEqual(
      expect.arrayContaining([
        { path: "deflectionLimit", message: "Give a whole number: the N in span/N." },
        { path: "deflectionLimit", message: "The limit is span/100 at the loosest." },
        { path: "", message: expect.stringContaining("colour") },
      ]),
    );
    const tooStrict = await patch(fx.users.owner, { deflectionLimit: 1001 });
    expect((await tooStrict.json()).issues).toEqual([{ path: "deflectionLimit", message: "The limit is span/1000 at the strictest." }]);
    expect((await patch(fx.users.owner, { deflectionLimit: "300" })).status).toBe(400);
    expect((await patch(fx.users.owner, {})).status).toBe(400);
    expect(await storedLimit()).toBe(250);
  });

  it("the database refuses a limit out of bounds written around the command", async () => {
    await expect(getDb().update(projects).set({ deflectionLimit: 5 }).where(eq(projects.id, fx.projectId))).rejects.toThrow();
    expect(await storedLimit()).toBe(250);
  });

  it("lets the owner and the structural engineer change it, each change audited with before and after", async () => {
    const byOwner = await patch(fx.users.owner, { deflectionLimit: 300 });
    expect(byOwner.status).toBe(200);
    expect(await byOwner.json()).toEqual({ settings: { deflectionLimit: 300 } });
    expect((await patch(fx.users.structural_engineer, { deflectionLimit: 400 })).status).toBe(200);
    expect(await storedLimit()).toBe(400);
    const events = await getDb()
      .select({ actorId: auditEvents.actorId, details: auditEvents.details })
      .from(auditEvents)
      .where(and(eq(auditEvents.projectId, fx.projectId), eq(auditEvents.action, "project.settings_changed")))
      .orderBy(auditEvents.createdAt);
    expect(events).toEqual([
      { actorId: fx.users.owner.id, details: { from: { deflectionLimit: 250 }, to: { deflectionLimit: 300 } } },
      { actorId: fx.users.structural_engineer.id, details: { from: { deflectionLimit: 300 }, to: { deflectionLimit: 400 } } },
    ]);
  });
});

describe("the analysis job and the project's limit", () => {
  it("reviews with the limit the project has when the job runs, and a later change leaves the stored review as it was", async () => {
    expect((await patch(fx.users.structural_engineer, { deflectionLimit: 400 })).status).toBe(200);
    // The generated roof has the serviceability combination SLS-1 (lib/analysis/generator.ts).
    const roof = { kind: "generate", params: { name: "Limit grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
    const saved = await createRevision(await buildRequest(`${path()}/models`, { method: "POST", body: roof, user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId }));
    expect(saved.status).toBe(202);
    const { revision, job } = (await saved.json()) as { revision: { id: string }; job: { id: string } };
    expect(await runAnalysisJob(job.id)).toBe("done");
    const reviewOf = async () => (await getDb().select({ review: analysisRuns.review }).from(analysisRuns).where(eq(analysisRuns.revisionId, revision.id)))[0].review as StoredReview;
    const review = await reviewOf();
    expect(review.deflectionLimit).toBe(400);
    expect(review.deflections!.map((d) => d.combination)).toEqual(["SLS-1"]);
    for (const d of review.deflections!) {
      expect(d.limit).toBe(400);
      expect(d.allowed).toBeCloseTo(d.span / 400, 12);
    }
    expect((await patch(fx.users.owner, { deflectionLimit: 200 })).status).toBe(200);
    expect(await reviewOf()).toEqual(review);
  }, 120_000);
});
