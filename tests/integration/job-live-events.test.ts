// Job progress over the live bus (issue 13 item 1, "a real progress bar through the event bus"): every change of a
// job — claimed, each phase and percent, done, failed, queued again — is a live event { kind: "job", id } written
// in the same transaction (db/queries/jobs.ts) and published after commit to the project's open sockets only; what
// the browser reads back on each event is the job as it was then, so the bar follows the phases without polling.
import { afterAll, describe, expect, it } from "vitest";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { GET as getJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/route";
import { POST as retryJob } from "@/app/api/projects/[projectId]/jobs/[jobId]/retry/route";
import type { Invalidation } from "@/lib/realtime/live-events";
import { runAnalysisJob } from "@/server/jobs/analysis";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { connectClient, realtimeClient, until, type ClientSocket } from "../support/realtime";
import { realtimeProjectSuite } from "../support/realtime-suite";
import { buildRequest, routeContext } from "../support/session";

const rt = realtimeProjectSuite("job-live-events");
const extra: ClientSocket[] = [];
afterAll(() => extra.forEach((socket) => socket.disconnect()));

async function saveRoof(project: ProjectFixture) {
  const roof = { kind: "generate", params: { name: "Live grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
  const response = await createRevision(await buildRequest(`/api/projects/${project.projectId}/models`, { method: "POST", body: roof, user: project.users.structural_engineer }), routeContext({ projectId: project.projectId }));
  expect(response.status).toBe(202);
  return ((await response.json()) as { job: { id: string } }).job;
}

/** The job as the viewer's browser reads it back when an event arrives. */
const readJob = async (jobId: string) =>
  ((await (await getJob(await buildRequest(`/api/projects/${rt.project.projectId}/jobs/${jobId}`, { user: rt.project.users.viewer }), routeContext({ projectId: rt.project.projectId, jobId }))).json()) as { job: { state: string; phase: string; percent: number } }).job;

/** Records, for each "job" event of `jobId`, the job as read back when the event arrived. */
function follow(socket: ClientSocket, jobId: string) {
  const seen: { state: string; phase: string }[] = [];
  socket.on("live:invalidate", (event: Invalidation) => {
    if (event.kind === "job" && event.id === jobId) void readJob(jobId).then(({ state, phase }) => seen.push({ state, phase }));
  });
  return seen;
}

describe("job progress on the live bus", () => {
  it("reaches the project's sockets at every phase until done, and no other project's", async () => {
    const watcher = await rt.signedIn("viewer");
    const other = await createProjectFixture("job-live-other");
    const elsewhere = await realtimeClient(rt.server.url, other.projectId, other.users.viewer);
    extra.push(elsewhere);
    await connectClient(elsewhere);
    const heardElsewhere: unknown[] = [];
    elsewhere.on("live:invalidate", (event) => heardElsewhere.push(event));

    const job = await saveRoof(rt.project);
    const seen = follow(watcher, job.id);
    // Each phase waits until the events so far have been read back before the next is written, so the read-back of
    // a phase's event sees that phase (the claim's may already see the next one: the job moves on at once).
    const eventsBefore = { analysis: 2, review: 3, storing: 4 };
    const onPhase = (phase: keyof typeof eventsBefore) => until(() => seen.length >= eventsBefore[phase], `${eventsBefore[phase]} job events`);
    expect(await runAnalysisJob(job.id, { onPhase })).toBe("done");
    await until(() => seen.length >= 5, "the job's five events (claimed, analysis, review, storing, done)");
    expect(seen.slice(0, 3)).toEqual([
      { state: "running", phase: expect.any(String) },
      { state: "running", phase: "analysis" },
      { state: "running", phase: "review" },
    ]);
    expect(seen.at(-1)).toEqual({ state: "done", phase: "done" });
    expect(heardElsewhere).toEqual([]);
  });

  it("tells the sockets when a job fails and when it is queued again", async () => {
    const watcher = await rt.signedIn("architect");
    const job = await saveRoof(rt.project);
    const seen = follow(watcher, job.id);
    const failing = new URL("../support/analysis-workers/throws-in-review.mjs", import.meta.url);
    expect(await runAnalysisJob(job.id, { worker: failing })).toBe("failed");
    await until(() => seen.length >= 4 && seen.at(-1)?.state === "failed", "the failed job's four events (claimed, analysis, review, failed)");
    const before = seen.length;
    const retried = await retryJob(await buildRequest(`/api/projects/${rt.project.projectId}/jobs/${job.id}/retry`, { method: "POST", user: rt.project.users.structural_engineer }), routeContext({ projectId: rt.project.projectId, jobId: job.id }));
    expect(retried.status).toBe(202);
    await until(() => seen.length > before, "the retried job's event");
    expect(seen.at(-1)).toEqual({ state: "queued", phase: "queued" });
  });
});
