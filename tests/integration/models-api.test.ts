import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listRevisions, POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { GET as getRevision } from "@/app/api/projects/[projectId]/models/[number]/route";
import { auditEvents, modelRevisions } from "@/db/schema";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";
import { generateRoof } from "@/lib/analysis/generator";
import { runAnalysisJob } from "@/server/jobs/analysis";

let fx: ProjectFixture;
const listPath = () => `/api/projects/${fx.projectId}/models`;
const listCtx = () => routeContext({ projectId: fx.projectId });
const revCtx = (number: number) => routeContext({ projectId: fx.projectId, number: String(number) });
const revisionCount = async () => (await getDb().select().from(modelRevisions).where(eq(modelRevisions.projectId, fx.projectId))).length;

// A 6 m x 6 m two-by-two bay grid keeps the solve small.
const smallRoof = { kind: "generate", params: { name: "Test grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };

// A hand-written model with three faults: a member naming a missing node, a duplicate node id and a negative area.
const brokenModel = {
  format: "truss-model/1",
  name: "Broken",
  materials: [{ id: "S", E: 210e6, fy: 355e3, unitWeight: 78.5 }],
  sections: [{ id: "P", material: "S", area: -1e-3, radiusOfGyration: 0.03, outerDiameter: 0.0889, wallThickness: 0.004 }],
  nodes: [
    { id: "A", x: 0, y: 0, z: 0 },
    { id: "A", x: 1, y: 0, z: 0 },
  ],
  members: [{ id: "M1", i: "A", j: "Z", section: "P" }],
  supports: [{ node: "A", ux: true, uy: true, uz: true }],
  loadCases: [{ id: "G", name: "Dead", category: "dead", selfWeight: true, nodalLoads: [] }],
  combinations: [],
};

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("models-api");
});
afterAll(closeDb);

describe("POST /api/projects/[projectId]/models", () => {
  it("answers 401 without a session and 404 to a non-member", async () => {
    expect((await createRevision(await buildRequest(listPath(), { method: "POST", body: smallRoof }), listCtx())).status).toBe(401);
    expect((await createRevision(await buildRequest(listPath(), { method: "POST", body: smallRoof, user: fx.users.outsider }), listCtx())).status).toBe(404);
  });

  it.each(["owner", "architect", "mep_engineer", "viewer"] as const)("answers 403 to a %s trying to upload", async (role) => {
    const body = { kind: "uploadJson", model: brokenModel };
    const response = await createRevision(await buildRequest(listPath(), { method: "POST", body, user: fx.users[role] }), listCtx());
    expect(response.status).toBe(403);
    expect(await revisionCount()).toBe(0);
  });

  it("answers 400 listing every problem of a bad model, and stores nothing", async () => {
    const response = await createRevision(await buildRequest(listPath(), { method: "POST", body: { kind: "uploadJson", model: brokenModel }, user: fx.users.structural_engineer }), listCtx());
    expect(response.status).toBe(400);
    const body = await response.json();
    const text = body.issues.map((i: { path: string; message: string }) => `${i.path}: ${i.message}`).join("\n");
    expect(text).toMatch(/duplicate node id "A"/);
    expect(text).toMatch(/"Z"/);
    expect(text).toMatch(/area must be positive/);
    expect(body.issues.length).toBeGreaterThanOrEqual(3);
    expect(await revisionCount()).toBe(0);
  });

  it("answers 400 naming the missing CSV tables", async () => {
    const body = { kind: "uploadCsv", name: "CSV roof", tables: { "nodes.csv": "id,x,y,z\nA,0,0,0\n" } };
    const response = await createRevision(await buildRequest(listPath(), { method: "POST", body, user: fx.users.structural_engineer }), listCtx());
    expect(response.status).toBe(400);
    const paths = (await response.json()).issues.map((i: { path: string }) => i.path);
    expect(paths).toEqual(expect.arrayContaining(["members.csv", "sections.csv", "supports.csv"]));
    expect(await revisionCount()).toBe(0);
  });

  it("answers 400 for a request of an unknown kind or bad generator parameters", async () => {
    const unknown = await createRevision(await buildRequest(listPath(), { method: "POST", body: { kind: "paste" }, user: fx.users.structural_engineer }), listCtx());
    expect(unknown.status).toBe(400);
    const badSpan = { kind: "generate", params: { spanX: 7, spanY: 6, module: 3, depth: 1.5 } };
    const bad = await createRevision(await buildRequest(listPath(), { method: "POST", body: badSpan, user: fx.users.structural_engineer }), listCtx());
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues).toEqual([{ path: "params.spanX", message: expect.stringMatching(/whole number/) }]);
  });

  it("lets the structural engineer generate a roof: stored with an audit event and its analysis queued, then analysed by the job", async () => {
    const response = await createRevision(await buildRequest(listPath(), { method: "POST", body: smallRoof, user: fx.users.structural_engineer }), listCtx());
    expect(response.status).toBe(202);
    const { revision, job } = await response.json();
    expect(revision).toMatchObject({ number: 1 });
    expect(job).toMatchObject({ kind: "analysis", state: "queued", percent: 0 });
    expect(await runAnalysisJob(job.id)).toBe("done");
    const events = await getDb().select().from(auditEvents).where(eq(auditEvents.projectId, fx.projectId));
    expect(events.map((e) => e.action)).toContain("model.revision.create");
  });
});

describe("GET /api/projects/[projectId]/models and /models/[number]", () => {
  it("answers 401 without a session and 404 to a non-member", async () => {
    expect((await listRevisions(await buildRequest(listPath()), listCtx())).status).toBe(401);
    expect((await getRevision(await buildRequest(`${listPath()}/1`, { user: fx.users.outsider }), revCtx(1))).status).toBe(404);
  });

  it("lists revisions to every role, newest first", async () => {
    const response = await listRevisions(await buildRequest(listPath(), { user: fx.users.viewer }), listCtx());
    expect(response.status).toBe(200);
    const { revisions } = await response.json();
    expect(revisions).toEqual([expect.objectContaining({ number: 1, name: "Test grid", source: "generated", analysisStatus: "ok", job: expect.objectContaining({ state: "done", percent: 100 }) })]);
    // Counted when stored, so the list never loads a model.
    expect(revisions[0].memberCount).toBe(generateRoof(smallRoof.params).members.length);
  });

  it("returns the revision with results for every case and combination, in equilibrium, with cache headers", async () => {
    const response = await getRevision(await buildRequest(`${listPath()}/1`, { user: fx.users.architect }), revCtx(1));
    expect(response.status).toBe(200);
    expect(response.headers.get("cache-control")).toMatch(/private/);
    const { revision } = await response.json();
    const { model, analysis } = revision;
    const ids = [...model.loadCases, ...model.combinations].map((c: { id: string }) => c.id);
    expect(Object.keys(analysis.result.results).sort()).toEqual([...ids].sort());
    // Statics (common practice): in every load case the vertical reactions balance the applied loads, i.e.
    // sum Rz = members' weight (sum of A * L * unit weight, when self-weight is on) - sum of nodal fz.
    type Xyz = { x: number; y: number; z: number };
    const node = new Map<string, Xyz>(model.nodes.map((n: Xyz & { id: string }) => [n.id, n]));
    const area = new Map<string, number>(model.sections.map((s: { id: string; area: number }) => [s.id, s.area]));
    const weight = model.members.reduce((sum: number, m: { i: string; j: string; section: string }) => {
      const a = node.get(m.i)!;
      const b = node.get(m.j)!;
      return sum + area.get(m.section)! * Math.hypot(b.x - a.x, b.y - a.y, b.z - a.z) * model.materials[0].unitWeight;
    }, 0);
    for (const loadCase of model.loadCases as { id: string; selfWeight: boolean; nodalLoads: { fz: number }[] }[]) {
      const applied = (loadCase.selfWeight ? weight : 0) - loadCase.nodalLoads.reduce((s, l) => s + l.fz, 0);
      const reactions = Object.values(analysis.result.results[loadCase.id].reactions) as { fz: number }[];
      expect(reactions.reduce((s, r) => s + r.fz, 0)).toBeCloseTo(applied, 6);
    }
    const etag = response.headers.get("etag")!;
    const again = await getRevision(new Request(new URL(`${listPath()}/1`, "http://127.0.0.1"), { headers: { ...Object.fromEntries((await buildRequest("/", { user: fx.users.architect })).headers), "if-none-match": etag } }), revCtx(1));
    expect(again.status).toBe(304);
  });

  it("answers 404 for a revision that does not exist", async () => {
    expect((await getRevision(await buildRequest(`${listPath()}/9`, { user: fx.users.viewer }), revCtx(9))).status).toBe(404);
  });

  it("stores an uploaded JSON model as the next revision", async () => {
    const { revision } = await (await getRevision(await buildRequest(`${listPath()}/1`, { user: fx.users.structural_engineer }), revCtx(1))).json();
    const body = { kind: "uploadJson", name: "Re-uploaded", model: revision.model };
    const response = await createRevision(await buildRequest(listPath(), { method: "POST", body, user: fx.users.structural_engineer }), listCtx());
    expect(response.status).toBe(202);
    expect((await response.json()).revision).toMatchObject({ number: 2 });
    const { revisions } = await (await listRevisions(await buildRequest(listPath(), { user: fx.users.viewer }), listCtx())).json();
    expect(revisions.map((r: { number: number; source: string }) => [r.number, r.source])).toEqual([
      [2, "uploaded"],
      [1, "generated"],
    ]);
  });
});
