// What the viewer opens a revision with (issue 13: bytes before the first drawn roof): the binary geometry
// (lib/models/geometry-wire.ts) reads back equal to the stored model (coordinates to Float32 precision), the JSON
// overview carries the result ids, the analysis status and the review without per-member rows, and together they
// are a fraction of the whole revision's JSON, which stays for the browser what-ifs. The geometry is immutable
// (strong ETag, 304). Who may read either: tests/security/revision-geometry-access.test.ts.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { GET as getRevision } from "@/app/api/projects/[projectId]/models/[number]/route";
import { GET as getGeometry } from "@/app/api/projects/[projectId]/models/[number]/geometry/route";
import { GET as getSummary } from "@/app/api/projects/[projectId]/models/[number]/summary/route";
import { analysisRuns, modelRevisions } from "@/db/schema";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import { packGeometry, unpackGeometry } from "@/lib/models/geometry-wire";
import { backfillRevisionGeometry } from "@/lib/commands/backfill-revision-geometry";
import { runAnalysisJob } from "@/server/jobs/analysis";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let number: number;
let revisionId: string;
let model: TrussModel;
let result: AnalysisResult;

const call = async (handler: typeof getGeometry, path: string, n: number, user: FixtureUser, headers: Record<string, string> = {}) => {
  const request = await buildRequest(`/api/projects/${fx.projectId}/models/${n}${path}`, { user });
  for (const [name, value] of Object.entries(headers)) request.headers.set(name, value);
  return handler(request, routeContext({ projectId: fx.projectId, number: String(n) }));
};

async function generate(name: string) {
  const roof = { kind: "generate", params: { name, spanX: 9, spanY: 6, module: 3, depth: 1.5 } };
  const response = await createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body: roof, user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId }));
  expect(response.status).toBe(202);
  return (await response.json()) as { revision: { id: string; number: number }; job: { id: string } };
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("revision-geometry");
  // The product's path: a generated roof is saved and the jobs process analyses, reviews and stores it.
  const saved = await generate("Geometry grid");
  expect(await runAnalysisJob(saved.job.id)).toBe("done");
  number = saved.revision.number;
  revisionId = saved.revision.id;
  const [revision] = await getDb().select().from(modelRevisions).where(eq(modelRevisions.id, revisionId));
  const [run] = await getDb().select().from(analysisRuns).where(eq(analysisRuns.revisionId, revisionId));
  model = revision.model;
  result = run.result;
});
afterAll(closeDb);

describe("a revision's geometry", () => {
  it("reads back equal to the stored model, in model order", async () => {
    const response = await call(getGeometry, "/geometry", number, fx.users.viewer);
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toBe("application/octet-stream");
    const wire = unpackGeometry(await response.arrayBuffer());
    expect(wire.nodeIds).toEqual(model.nodes.map((n) => n.id));
    expect(wire.memberIds).toEqual(model.members.map((m) => m.id));
    model.nodes.forEach((node, k) => expect([...wire.coordinates.subarray(3 * k, 3 * k + 3)]).toEqual([Math.fround(node.x), Math.fround(node.y), Math.fround(node.z)]));
    model.members.forEach((member, k) => {
      expect([wire.nodeIds[wire.ends[2 * k]], wire.nodeIds[wire.ends[2 * k + 1]]]).toEqual([member.i, member.j]);
      expect(wire.sectionIds[wire.sections[k]]).toBe(member.section);
    });
  });

  it("is immutable: a strong ETag naming the revision, cached for a year, 304 when the browser has it", async () => {
    const first = await call(getGeometry, "/geometry", number, fx.users.architect);
    const etag = first.headers.get("etag")!;
    expect(etag).toMatch(/^"[^"]+"$/);
    expect(first.headers.get("cache-control")).toBe("private, max-age=31536000, immutable");
    expect(first.headers.get("vary")).toBe("Cookie");
    const again = await call(getGeometry, "/geometry", number, fx.users.architect, { "if-none-match": etag });
    expect(again.status).toBe(304);
    expect(await again.text()).toBe("");
    const other = await generate("Another grid");
    expect((await call(getGeometry, "/geometry", other.revision.number, fx.users.architect)).headers.get("etag")).not.toBe(etag);
  });

  it("is packed once, when the revision is saved, and served as stored", async () => {
    const [row] = await getDb().select({ geometry: modelRevisions.geometry }).from(modelRevisions).where(eq(modelRevisions.id, revisionId));
    expect(row.geometry).not.toBeNull();
    expect(Buffer.from(row.geometry!).equals(Buffer.from(packGeometry(model)))).toBe(true);
    const served = new Uint8Array(await (await call(getGeometry, "/geometry", number, fx.users.viewer)).arrayBuffer());
    expect(Buffer.from(served).equals(Buffer.from(row.geometry!))).toBe(true);
  });

  it("of a revision saved before geometry was stored (migration 0019) is packed from its model, the same bytes, until the migrate step stores it", async () => {
    const old = await generate("Grid saved before 0019");
    const [stored] = await getDb().select({ geometry: modelRevisions.geometry, model: modelRevisions.model }).from(modelRevisions).where(eq(modelRevisions.id, old.revision.id));
    await getDb().update(modelRevisions).set({ geometry: null }).where(eq(modelRevisions.id, old.revision.id));
    const response = await call(getGeometry, "/geometry", old.revision.number, fx.users.viewer);
    expect(response.status).toBe(200);
    const served = new Uint8Array(await response.arrayBuffer());
    expect(response.headers.get("content-length")).toBe(String(served.byteLength));
    expect(Buffer.from(served).equals(Buffer.from(stored.geometry!))).toBe(true);
    expect(unpackGeometry(served.buffer).memberIds).toEqual(stored.model.members.map((m) => m.id));
    // `npm run db:migrate` gives it the same bytes to keep
    expect(await backfillRevisionGeometry()).toBeGreaterThanOrEqual(1);
    const [filled] = await getDb().select({ geometry: modelRevisions.geometry }).from(modelRevisions).where(eq(modelRevisions.id, old.revision.id));
    expect(Buffer.from(filled.geometry!).equals(Buffer.from(stored.geometry!))).toBe(true);
  });
});

describe("a revision's overview for the viewer", () => {
  it("names the stored results and the review without per-member rows, and none of the large arrays", async () => {
    const response = await call(getSummary, "/summary", number, fx.users.viewer);
    expect(response.status).toBe(200);
    expect(response.headers.get("cache-control")).toBe("no-store");
    const { revision, abilities } = await response.json();
    expect(abilities).toEqual({ runAnalysis: false });
    expect(revision).toMatchObject({ id: revisionId, number, memberCount: model.members.length });
    expect(Object.keys(revision.model).sort()).toEqual(["combinations", "loadCases", "name", "supports"]);
    expect(revision.model.loadCases).toEqual(model.loadCases);
    expect(revision.model.supports).toEqual(model.supports);
    expect([...revision.analysis.resultIds].sort()).toEqual(Object.keys(result.results).sort());
    expect(revision.analysis.status).toBe("ok");
    // The info without its maps over every member (governing, lowForce): those come with one member's detail.
    const overview = Object.fromEntries(Object.entries(result.info).filter(([key]) => key !== "governing" && key !== "lowForce"));
    expect(revision.analysis.info).toEqual(overview);
    expect(revision.analysis.info).not.toHaveProperty("governing");
    expect(revision.analysis.review.standard).toBeTruthy();
    expect(revision.analysis.review.members).toBeUndefined();
    expect(revision.analysis).not.toHaveProperty("result");
  });

  it("with the geometry, is a fraction of the whole revision the what-ifs fetch", async () => {
    const opening = (await (await call(getSummary, "/summary", number, fx.users.viewer)).arrayBuffer()).byteLength + (await (await call(getGeometry, "/geometry", number, fx.users.viewer)).arrayBuffer()).byteLength;
    const whole = (await (await call(getRevision, "", number, fx.users.viewer)).arrayBuffer()).byteLength;
    expect(opening).toBeLessThan(whole / 4);
  });

  it("shows a revision still being analysed with its job and no analysis; the engineer may run analyses", async () => {
    const queued = await generate("Queued grid");
    const response = await call(getSummary, "/summary", queued.revision.number, fx.users.structural_engineer);
    const { revision, abilities } = await response.json();
    expect(revision.analysis).toBeNull();
    expect(revision.job).toMatchObject({ id: queued.job.id, kind: "analysis" });
    expect(abilities).toEqual({ runAnalysis: true });
  });
});
