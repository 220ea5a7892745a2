import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as DECIDE } from "@/app/api/projects/[projectId]/clashes/[clashId]/decision/route";
import { POST as PROPOSE } from "@/app/api/projects/[projectId]/clashes/[clashId]/proposal/route";
import { GET as GET_CLASH } from "@/app/api/projects/[projectId]/clashes/[clashId]/route";
import { GET as LIST_CLASHES, POST as DETECT } from "@/app/api/projects/[projectId]/clashes/route";
import { POST as CREATE_REVISION } from "@/app/api/projects/[projectId]/models/route";
import { DELETE as DELETE_RUN, PATCH as EDIT_RUN } from "@/app/api/projects/[projectId]/runs/[runId]/route";
import { GET as LIST_RUNS, POST as IMPORT } from "@/app/api/projects/[projectId]/runs/route";
import { POST as HANG } from "@/app/api/projects/[projectId]/services/route";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { auditEvents, clashDecisions, jobs } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { memberEnvelopeState } from "@/lib/clash/envelope-state";
import { analyseForStorage } from "@/lib/models/analyse";
import { ROLES } from "@/lib/permissions";
import { runAnalysisJob } from "@/server/jobs/analysis";
import { runHangServicesJob } from "@/server/jobs/hang-services";
import type { HangServicesOutcome } from "@/lib/commands/store-hung-services";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

// Caution text copied from glossary.md (the project never reads ../shared at test time).
const CAUTION =
  "Advisory results for coordination. Any removal, opening or change to a structural member needs the written approval of the engineer of record under the applicable local codes.";

let fx: ProjectFixture;
let stored: ReturnType<typeof analyseForStorage>;
const ctx = () => routeContext({ projectId: fx.projectId });

// A 9 m × 9 m roof on 3 m modules, 2 m deep: top chords at z = 2. A duct along x at y = 1.5, z = 2 crosses the
// four y-direction top chords TCY-i-0 (x = 0, 3, 6, 9) — hard clashes (see lib/clash/detect.test.ts for the
// same geometry worked by hand).
const csv = [
  "run,system,shape,diameter,width,height,rotation,insulation,clearance,weight_per_metre,x,y,z",
  "SA-01,supply air,round,0.5,,,,0.05,0.1,0.35,-1,1.5,2",
  "SA-01,,,,,,,,,,10,1.5,2",
].join("\n");

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("mep-clashes");
  const model = generateRoof({ name: "Test roof", spanX: 9, spanY: 9, module: 3, depth: 2 });
  stored = analyseForStorage(model, "EN1993-1-1");
  const { result, review } = stored;
  await createRevisionWithAnalysis({ projectId: fx.projectId, name: "r1", model, source: "generated", createdBy: fx.users.structural_engineer.id, result, review });
});
afterAll(closeDb);

const importBody = (text = csv) => ({ revision: 1, fileName: "runs.csv", text, mode: "replace" });

describe("runs import", () => {
  const path = () => `/api/projects/${fx.projectId}/runs`;

  it("answers 401 signed out, 404 to outsiders, 403 to roles without runs.edit", async () => {
    expect((await IMPORT(await buildRequest(path(), { method: "POST", body: importBody() }), ctx())).status).toBe(401);
    expect((await IMPORT(await buildRequest(path(), { method: "POST", body: importBody(), user: fx.users.outsider }), ctx())).status).toBe(404);
    for (const role of ["owner", "architect", "viewer"] as const) {
      expect((await IMPORT(await buildRequest(path(), { method: "POST", body: importBody(), user: fx.users[role] }), ctx())).status).toBe(403);
    }
  });

  it("answers 400 listing every problem by row, and stores nothing", async () => {
    const bad = csv.replace("0.5,,,,0.05", "big,,,,0.05").replace("10,1.5,2", "10,1.5,high");
    const response = await IMPORT(await buildRequest(path(), { method: "POST", body: importBody(bad), user: fx.users.mep_engineer }), ctx());
    expect(response.status).toBe(400);
    const body = await response.json();
    expect(body.issues.map((i: { path: string }) => i.path)).toEqual(["row 2.diameter", "row 3.z"]);
    const list = await LIST_RUNS(await buildRequest(`${path()}?revision=1`, { user: fx.users.viewer }), ctx());
    expect((await list.json()).runs).toEqual([]);
  });

  it("imports runs for an MEP engineer and detects the clashes", async () => {
    const response = await IMPORT(await buildRequest(path(), { method: "POST", body: importBody(), user: fx.users.mep_engineer }), ctx());
    expect(response.status).toBe(201);
    const { detection } = await response.json();
    expect(detection).toMatchObject({ found: 4, hard: 4, clearance: 0 });
    const list = await LIST_RUNS(await buildRequest(`${path()}?revision=1`, { user: fx.users.viewer }), ctx());
    expect((await list.json()).runs.map((r: { id: string }) => r.id)).toEqual(["SA-01"]);
  });

  it("answers 404 for a revision the project does not have", async () => {
    const response = await IMPORT(await buildRequest(path(), { method: "POST", body: { ...importBody(), revision: 7 }, user: fx.users.mep_engineer }), ctx());
    expect(response.status).toBe(404);
  });
});

describe("clashes", () => {
  const listPath = () => `/api/projects/${fx.projectId}/clashes?revision=1`;
  async function list(user = fx.users.viewer) {
    const response = await LIST_CLASHES(await buildRequest(listPath(), { user }), ctx());
    expect(response.status).toBe(200);
    return response.json();
  }

  it("lists clashes with system, the member's force state and the caller's abilities", async () => {
    expect((await LIST_CLASHES(await buildRequest(listPath()), ctx())).status).toBe(401);
    const body = await list();
    expect(body.caution).toBe(CAUTION);
    expect(body.abilities).toEqual({ propose: false, decide: false, assign: false, editRuns: false, hangServices: false });
    expect(body.clashes.map((c: { memberId: string }) => c.memberId).sort()).toEqual(["TCY-0-0", "TCY-1-0", "TCY-2-0", "TCY-3-0"]);
    for (const clash of body.clashes) {
      expect(clash).toMatchObject({ kind: "hard", status: "active", system: "supply air", runId: "SA-01", outcome: null });
      // each row shows its own member's envelope (default low-force line 5 kN) and verdict, as stored
      expect(clash.envelopeState).toBe(memberEnvelopeState(stored.result.envelope[clash.memberId], 5));
      expect(clash.verdict).toBe(stored.review!.members[clash.memberId].verdict);
      expect(["load-bearing", "stabilising", "bracing", "idle"]).toContain(clash.verdict);
    }
    // the load patterns every "idle" verdict rests on, read from the stored review (issue 15 item 7)
    expect(body.analysedPatterns.map((p: { id: string }) => p.id)).toEqual(["dead", "services", "snow", "wind-uplift"]);
    expect((await list(fx.users.structural_engineer)).abilities).toEqual({ propose: true, decide: true, assign: true, editRuns: true, hangServices: true });
  });

  it("a viewer and an architect cannot propose; bad outcomes are a 400", async () => {
    const [clash] = (await list()).clashes;
    const path = `/api/projects/${fx.projectId}/clashes/${clash.id}/proposal`;
    const cctx = routeContext({ projectId: fx.projectId, clashId: clash.id });
    expect((await PROPOSE(await buildRequest(path, { method: "POST", body: { outcome: "opening_proposed" } }), cctx)).status).toBe(401);
    for (const role of ["viewer", "architect", "owner"] as const) {
      expect((await PROPOSE(await buildRequest(path, { method: "POST", body: { outcome: "opening_proposed" }, user: fx.users[role] }), cctx)).status).toBe(403);
    }
    const bad = await PROPOSE(await buildRequest(path, { method: "POST", body: { outcome: "opening_accepted" }, user: fx.users.mep_engineer }), cctx);
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues[0].path).toBe("outcome");
  });

  it("settles a clash end to end: MEP proposes an opening, only the structural engineer accepts it, with conditions", async () => {
    const [clash] = (await list()).clashes;
    const cctx = routeContext({ projectId: fx.projectId, clashId: clash.id });
    const base = `/api/projects/${fx.projectId}/clashes/${clash.id}`;

    // Accepting before anything is proposed is a conflict.
    const early = await DECIDE(await buildRequest(`${base}/decision`, { method: "POST", body: { outcome: "opening_accepted", conditions: "Sleeve and stiffening ring, see sketch S-12." }, user: fx.users.structural_engineer }), cctx);
    expect(early.status).toBe(409);

    const proposed = await PROPOSE(await buildRequest(`${base}/proposal`, { method: "POST", body: { outcome: "opening_proposed", note: "Duct cannot drop: ceiling height." }, user: fx.users.mep_engineer }), cctx);
    expect(proposed.status).toBe(200);
    const proposedBody = await proposed.json();
    expect(proposedBody.caution).toBe(CAUTION);
    expect(proposedBody.clash).toMatchObject({ outcome: "opening_proposed", proposedBy: fx.users.mep_engineer.name, decidedBy: null });

    for (const role of ["mep_engineer", "viewer", "owner", "architect"] as const) {
      const refused = await DECIDE(await buildRequest(`${base}/decision`, { method: "POST", body: { outcome: "opening_accepted", conditions: "Sleeve and stiffening ring." }, user: fx.users[role] }), cctx);
      expect(refused.status).toBe(403);
    }
    const noConditions = await DECIDE(await buildRequest(`${base}/decision`, { method: "POST", body: { outcome: "opening_accepted", conditions: "" }, user: fx.users.structural_engineer }), cctx);
    expect(noConditions.status).toBe(400);
    expect((await noConditions.json()).issues[0].path).toBe("conditions");

    const accepted = await DECIDE(await buildRequest(`${base}/decision`, { method: "POST", body: { outcome: "opening_accepted", conditions: "Sleeve and stiffening ring, see sketch S-12." }, user: fx.users.structural_engineer }), cctx);
    expect(accepted.status).toBe(200);
    expect((await accepted.json()).clash).toMatchObject({ outcome: "opening_accepted", conditions: "Sleeve and stiffening ring, see sketch S-12.", decidedBy: fx.users.structural_engineer.name, decidedAt: expect.any(String) });

    const history = await (await GET_CLASH(await buildRequest(base, { user: fx.users.viewer }), cctx)).json();
    expect(history.history.map((d: { kind: string; outcome: string; decidedBy: string; role: string; revision: number; caution: string }) => [d.kind, d.outcome, d.decidedBy, d.role, d.revision, d.caution])).toEqual([
      ["proposal", "opening_proposed", fx.users.mep_engineer.name, "mep_engineer", 1, CAUTION],
      ["decision", "opening_accepted", fx.users.structural_engineer.name, "structural_engineer", 1, CAUTION],
    ]);
    const audits = await getDb().select().from(auditEvents).where(eq(auditEvents.subjectId, clash.id));
    expect(audits.map((a) => a.action).sort()).toEqual(["clash.decide", "clash.propose"]);
  });

  it("keeps clash ids when the run moves a little (the decision, made on the run where it was, is closed with the reason), and clears clashes when it moves away", async () => {
    const before = (await list()).clashes;
    const runPath = `/api/projects/${fx.projectId}/runs/SA-01`;
    const rctx = routeContext({ projectId: fx.projectId, runId: "SA-01" });
    const nudge = await EDIT_RUN(await buildRequest(runPath, { method: "PATCH", body: { revision: 1, points: [{ x: -1, y: 1.5, z: 2.05 }, { x: 10, y: 1.5, z: 2.05 }] }, user: fx.users.mep_engineer }), rctx);
    expect(nudge.status).toBe(200);
    const after = (await list()).clashes;
    expect(after.map((c: { id: string; clashKey: string }) => [c.id, c.clashKey]).sort()).toEqual(before.map((c: { id: string; clashKey: string }) => [c.id, c.clashKey]).sort());
    const decided = before.find((c: { outcome: string | null }) => c.outcome === "opening_accepted");
    expect(after.filter((c: { outcome: string | null }) => c.outcome !== null)).toEqual([]);
    const history = (await (await GET_CLASH(await buildRequest(`/api/projects/${fx.projectId}/clashes/${decided.id}`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId, clashId: decided.id }))).json()).history;
    expect(history.map((d: { kind: string; reason: string | null }) => [d.kind, d.reason])).toEqual([
      ["proposal", null],
      ["decision", null],
      ["closure", "The decision no longer holds: run SA-01 was moved or resized in revision 1."],
    ]);

    // Above the roof (z = 4): no clashes remain active; they stay on record as cleared.
    const away = await EDIT_RUN(await buildRequest(runPath, { method: "PATCH", body: { revision: 1, points: [{ x: -1, y: 1.5, z: 4 }, { x: 10, y: 1.5, z: 4 }] }, user: fx.users.mep_engineer }), rctx);
    expect((await away.json()).detection).toMatchObject({ found: 0, cleared: 4 });
    const cleared = (await list()).clashes;
    expect(cleared.every((c: { status: string }) => c.status === "cleared")).toBe(true);
    expect(await getDb().select().from(clashDecisions)).not.toHaveLength(0);

    const badEdit = await EDIT_RUN(await buildRequest(runPath, { method: "PATCH", body: { revision: 1, points: [{ x: 0, y: 0, z: 0 }] }, user: fx.users.mep_engineer }), rctx);
    expect(badEdit.status).toBe(400);
    const viewerEdit = await EDIT_RUN(await buildRequest(runPath, { method: "PATCH", body: { revision: 1, clearance: 0.2 }, user: fx.users.viewer }), rctx);
    expect(viewerEdit.status).toBe(403);
  });

  it("re-runs detection on request (runs.edit) and removes runs", async () => {
    const path = `/api/projects/${fx.projectId}/clashes`;
    expect((await DETECT(await buildRequest(path, { method: "POST", body: { revision: 1 }, user: fx.users.viewer }), ctx())).status).toBe(403);
    const detect = await DETECT(await buildRequest(path, { method: "POST", body: { revision: 1 }, user: fx.users.structural_engineer }), ctx());
    expect((await detect.json()).detection).toMatchObject({ found: 0 });
    const rctx = routeContext({ projectId: fx.projectId, runId: "SA-01" });
    const removed = await DELETE_RUN(await buildRequest(`/api/projects/${fx.projectId}/runs/SA-01?revision=1`, { method: "DELETE", user: fx.users.mep_engineer }), rctx);
    expect(removed.status).toBe(200);
    const again = await DELETE_RUN(await buildRequest(`/api/projects/${fx.projectId}/runs/SA-01?revision=1`, { method: "DELETE", user: fx.users.mep_engineer }), rctx);
    expect(again.status).toBe(404);
  });
});

it("every role may read the clash list", async () => {
  for (const role of ROLES) {
    const response = await LIST_CLASHES(await buildRequest(`/api/projects/${fx.projectId}/clashes?revision=1`, { user: fx.users[role] }), ctx());
    expect(response.status).toBe(200);
  }
});

describe("hang the services", () => {
  const path = () => `/api/projects/${fx.projectId}/services`;

  it("is for the structural engineer only, and needs runs", async () => {
    expect((await HANG(await buildRequest(path(), { method: "POST", body: { revision: 1 } }), ctx())).status).toBe(401);
    for (const role of ["mep_engineer", "owner", "architect", "viewer"] as const) {
      expect((await HANG(await buildRequest(path(), { method: "POST", body: { revision: 1 }, user: fx.users[role] }), ctx())).status).toBe(403);
    }
    // The runs were removed above: nothing to hang.
    expect((await HANG(await buildRequest(path(), { method: "POST", body: { revision: 1 }, user: fx.users.structural_engineer }), ctx())).status).toBe(400);
  });

  it("queues a job that creates a revision with the runs' weight, carrying the runs and their clashes over, and a job that analyses it", async () => {
    await IMPORT(await buildRequest(`/api/projects/${fx.projectId}/runs`, { method: "POST", body: importBody(), user: fx.users.mep_engineer }), ctx());
    const response = await HANG(await buildRequest(path(), { method: "POST", body: { revision: 1, hangerSpacing: 2.5 }, user: fx.users.structural_engineer }), ctx());
    expect(response.status).toBe(202);
    const body = await response.json();
    expect(body.job).toMatchObject({ state: "queued", kind: "hang_services" });
    expect(await runHangServicesJob(body.job.id)).toBe("done");
    const [hanging] = await getDb().select().from(jobs).where(eq(jobs.id, body.job.id));
    const hung = hanging.outcome as HangServicesOutcome;
    // The run is 11 m long at 0.35 kN/m: 3.85 kN hung in all (hand arithmetic).
    expect(hung.totalLoad).toBeCloseTo(3.85, 9);
    expect(hung.revision).toMatchObject({ number: 2 });
    expect(hung.detection).toMatchObject({ found: 4 });
    expect(hung.analysisJob).toMatchObject({ state: "queued", kind: "analysis" });
    expect(await runAnalysisJob(hung.analysisJob.id)).toBe("done");
    const [job] = await getDb().select().from(jobs).where(eq(jobs.id, hung.analysisJob.id));
    expect(job.outcome).toEqual({ status: "ok", zeroForce: { noLongerZero: expect.any(Array), newlyZero: expect.any(Array) } });
    const list = await (await LIST_CLASHES(await buildRequest(`/api/projects/${fx.projectId}/clashes?revision=2`, { user: fx.users.viewer }), ctx())).json();
    const first = await (await LIST_CLASHES(await buildRequest(`/api/projects/${fx.projectId}/clashes?revision=1`, { user: fx.users.viewer }), ctx())).json();
    // Same member, run and segment: the same stable clash keys on the new revision, so threads follow.
    const keys = (rows: { clashKey: string; status: string }[]) => rows.filter((r) => r.status === "active").map((r) => r.clashKey).sort();
    expect(keys(list.clashes)).toEqual(keys(first.clashes));
  });
});

describe("a model change: bringing runs onto a new revision", () => {
  it("copies the runs of revision 1 onto a fresh revision, keeps clash keys, and refuses a second copy", async () => {
    const model = generateRoof({ name: "Test roof, deeper", spanX: 9, spanY: 9, module: 3, depth: 2 });
    const { result, review } = analyseForStorage(model, "EN1993-1-1");
    const fresh = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "r3", model, source: "generated", createdBy: fx.users.structural_engineer.id, result, review });
    const path = `/api/projects/${fx.projectId}/clashes`;
    const body = { revision: fresh.number, copyRunsFrom: 1 };
    expect((await DETECT(await buildRequest(path, { method: "POST", body, user: fx.users.architect }), ctx())).status).toBe(403);
    const copied = await DETECT(await buildRequest(path, { method: "POST", body, user: fx.users.mep_engineer }), ctx());
    expect(copied.status).toBe(200);
    expect((await copied.json()).detection).toMatchObject({ found: 4, hard: 4 });
    const again = await DETECT(await buildRequest(path, { method: "POST", body, user: fx.users.mep_engineer }), ctx());
    expect(again.status).toBe(409);
  });
});

describe("a model change through the models route", () => {
  it("carries the latest previous revision's runs onto the uploaded revision and detects its clashes", async () => {
    const before = await (await LIST_CLASHES(await buildRequest(`/api/projects/${fx.projectId}/clashes?revision=3`, { user: fx.users.viewer }), ctx())).json();
    // The same 9 m × 9 m roof as revision 1 (unchanged geometry), sent as generator parameters.
    const body = { kind: "generate", params: { name: "Test roof, reissued", spanX: 9, spanY: 9, module: 3, depth: 2 } };
    const response = await CREATE_REVISION(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body, user: fx.users.structural_engineer }), ctx());
    expect(response.status).toBe(202);
    const { revision } = await response.json();
    expect(revision.number).toBe(4);
    const runs = await (await LIST_RUNS(await buildRequest(`/api/projects/${fx.projectId}/runs?revision=4`, { user: fx.users.viewer }), ctx())).json();
    expect(runs.runs.map((r: { id: string }) => r.id)).toEqual(["SA-01"]);
    const after = await (await LIST_CLASHES(await buildRequest(`/api/projects/${fx.projectId}/clashes?revision=4`, { user: fx.users.viewer }), ctx())).json();
    const keys = (rows: { clashKey: string; status: string }[]) => rows.filter((r) => r.status === "active").map((r) => r.clashKey).sort();
    // The duct crosses the four y-direction top chords (see the geometry note at the top): four clashes, with the
    // same stable keys as on the revision the runs came from.
    expect(keys(after.clashes)).toHaveLength(4);
    expect(keys(after.clashes)).toEqual(keys(before.clashes));
  });
});
