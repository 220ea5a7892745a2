// Live events for the project's deflection limit and for stored report PDFs (liveevents brief items 1 and 2): the
// change of the limit (PATCH /api/projects/<id>) and the storing of a report (the report job) each write a live
// event in the very transaction that makes the change — checked through now(), which PostgreSQL fixes at the start
// of the transaction (PostgreSQL documentation, "Current Date/Time": the same value throughout one transaction),
// stamped on the event, the audit event and the job — that reaches the project's
// open sockets and no other project's; a refused change or a report that is no longer running writes none. The
// report page's list is read back over its GET route, which is refused to outsiders as the page is.
import { and, eq, sql, type AnyColumn } from "drizzle-orm";
import type PgBoss from "pg-boss";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PATCH as patchProject } from "@/app/api/projects/[projectId]/route";
import { GET as listReports, POST as makeReport } from "@/app/api/projects/[projectId]/report/route";
import { auditEvents, jobs, liveEvents } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { analyseForStorage } from "@/lib/models/analyse";
import type { Invalidation } from "@/lib/realtime/live-events";
import { runReportJob, type ReportSteps } from "@/server/jobs/report";
import { getDb } from "../support/db";
import { startQueueClient, stopQueueClient } from "../support/job-queue";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { connectClient, nextEvent, realtimeClient, type ClientSocket } from "../support/realtime";
import { realtimeProjectSuite } from "../support/realtime-suite";
import { buildRequest, routeContext } from "../support/session";

const rt = realtimeProjectSuite("settings-report-live");
let boss: PgBoss;
let other: ProjectFixture;
let elsewhere: ClientSocket;
const heardElsewhere: Invalidation[] = [];

beforeAll(async () => {
  boss = await startQueueClient();
  other = await createProjectFixture("settings-report-live-other");
  elsewhere = await realtimeClient(rt.server.url, other.projectId, other.users.owner);
  rt.sockets.push(elsewhere);
  await connectClient(elsewhere);
  elsewhere.on("live:invalidate", (event) => heardElsewhere.push(event));
});
afterAll(() => stopQueueClient(boss));

const patch = async (user: FixtureUser | undefined, body: unknown) =>
  patchProject(await buildRequest(`/api/projects/${rt.project.projectId}`, { method: "PATCH", user, body }), routeContext({ projectId: rt.project.projectId }));

/** A timestamp column to the microsecond, as PostgreSQL prints it (a JS Date would cut it to milliseconds). */
const exactly = (column: AnyColumn) => sql<string>`${column}::text`;

/** Every live event of a kind written for the project so far, oldest first, with its transaction's now(). */
const eventsOf = (projectId: string, kind: Invalidation["kind"]) =>
  getDb()
    .select({ subjectId: liveEvents.subjectId, revision: liveEvents.revision, at: exactly(liveEvents.createdAt) })
    .from(liveEvents)
    .where(and(eq(liveEvents.projectId, projectId), eq(liveEvents.kind, kind)))
    .orderBy(liveEvents.id);

/** Records every invalidation a socket hears. */
function heardBy(socket: ClientSocket) {
  const heard: Invalidation[] = [];
  socket.on("live:invalidate", (event) => heard.push(event));
  return heard;
}

describe("the deflection limit on the live bus", () => {
  it("writes no event for a refused change: signed out, outsider, architect, viewer, a bad value, the same value", async () => {
    expect((await patch(undefined, { deflectionLimit: 300 })).status).toBe(401);
    expect((await patch(rt.project.users.outsider, { deflectionLimit: 300 })).status).toBe(404);
    expect((await patch(rt.project.users.architect, { deflectionLimit: 300 })).status).toBe(403);
    expect((await patch(rt.project.users.viewer, { deflectionLimit: 300 })).status).toBe(403);
    expect((await patch(rt.project.users.owner, { deflectionLimit: 99 })).status).toBe(400);
    // 250 is the project's default (migration 0014): saving it again changes nothing, so there is nothing to tell.
    expect((await patch(rt.project.users.owner, { deflectionLimit: 250 })).status).toBe(200);
    expect(await eventsOf(rt.project.projectId, "settings")).toEqual([]);
  });

  it("tells the project's open sockets in the transaction of the change, and no other project's", async () => {
    const watcher = await rt.signedIn("viewer");
    const arrived = nextEvent(watcher, "live:invalidate", (event) => event.kind === "settings");
    const response = await patch(rt.project.users.structural_engineer, { deflectionLimit: 360 });
    expect(response.status).toBe(200);
    expect(await arrived).toEqual({ kind: "settings", id: rt.project.projectId, revision: null });

    const [event] = await eventsOf(rt.project.projectId, "settings");
    const [audit] = await getDb()
      .select({ at: exactly(auditEvents.createdAt) })
      .from(auditEvents)
      .where(and(eq(auditEvents.projectId, rt.project.projectId), eq(auditEvents.action, "project.settings_changed")));
    expect(event).toEqual({ subjectId: rt.project.projectId, revision: null, at: audit.at });
    expect(heardElsewhere.filter((e) => e.kind === "settings")).toEqual([]);
  });
});

describe("a stored report on the live bus", () => {
  // The PDF itself is tested in report-jobs.test.ts; here only its storing matters, so the drawing is a stand-in.
  const steps: ReportSteps = { build: async () => ({ pdf: Buffer.from("%PDF-1.4\n%%EOF\n"), pages: 1 }) };

  beforeAll(async () => {
    const model = generateRoof({ name: "Report roof", spanX: 6, spanY: 6, module: 3, depth: 1.5 });
    const { result, review } = analyseForStorage(model, "EN1993-1-1");
    await createRevisionWithAnalysis({ projectId: rt.project.projectId, name: "r1", model, source: "generated", createdBy: rt.project.users.structural_engineer.id, result, review });
  }, 60_000);

  async function queued(user: FixtureUser) {
    const response = await makeReport(await buildRequest(`/api/projects/${rt.project.projectId}/report`, { method: "POST", body: { revision: 1 }, user }), routeContext({ projectId: rt.project.projectId }));
    expect(response.status).toBe(202);
    return ((await response.json()) as { job: { id: string } }).job;
  }

  const reportsSeenBy = async (user: FixtureUser | undefined, revision: string) =>
    listReports(await buildRequest(`/api/projects/${rt.project.projectId}/report?revision=${revision}`, { user }), routeContext({ projectId: rt.project.projectId }));

  it("tells every open socket of the project (not only the requester's) in the transaction that stores it, and no other project's", async () => {
    const viewer = await rt.signedIn("viewer");
    const heard = heardBy(viewer);
    const job = await queued(rt.project.users.architect);
    const arrived = nextEvent(viewer, "live:invalidate", (event) => event.kind === "report");
    expect(await runReportJob(job.id, steps)).toBe("done");
    expect(await arrived).toEqual({ kind: "report", id: job.id, revision: 1 });

    const [event] = await eventsOf(rt.project.projectId, "report");
    // finishJob stamps the job with now() as it marks it done (db/queries/jobs.ts).
    const [done] = await getDb().select({ at: exactly(jobs.updatedAt) }).from(jobs).where(eq(jobs.id, job.id));
    expect(event).toEqual({ subjectId: job.id, revision: 1, at: done.at });
    expect(heard.filter((e) => e.kind === "report")).toHaveLength(1);
    expect(heardElsewhere.filter((e) => e.kind === "report")).toEqual([]);

    // What the viewer's page refetches on that event: the revision's list, the new report in it.
    const listed = await reportsSeenBy(rt.project.users.viewer, "1");
    expect(listed.status).toBe(200);
    expect(((await listed.json()) as { reports: { id: string; state: string }[] }).reports).toEqual([expect.objectContaining({ id: job.id, state: "done" })]);
  });

  it("writes no event when the job stopped running before storing (its store rolls back)", async () => {
    const job = await queued(rt.project.users.owner);
    const before = (await eventsOf(rt.project.projectId, "report")).length;
    const takenOver: ReportSteps = {
      build: async (...args) => {
        const built = await steps.build(...args);
        await getDb().update(jobs).set({ state: "failed", error: "taken over" }).where(eq(jobs.id, job.id));
        return built;
      },
    };
    expect(await runReportJob(job.id, takenOver)).toBe("skipped");
    expect(await eventsOf(rt.project.projectId, "report")).toHaveLength(before);
  });

  it("lists the reports only to the team: 401 signed out, 404 outsider, 400 for a revision that is not a number", async () => {
    expect((await reportsSeenBy(undefined, "1")).status).toBe(401);
    expect((await reportsSeenBy(rt.project.users.outsider, "1")).status).toBe(404);
    expect((await reportsSeenBy(rt.project.users.viewer, "first")).status).toBe(400);
    const none = await reportsSeenBy(rt.project.users.viewer, "7");
    expect(((await none.json()) as { reports: unknown[] }).reports).toEqual([]);
  });
});
