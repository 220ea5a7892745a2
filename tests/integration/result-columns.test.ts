// Results as columns (issue 13 item 4): the jobs process stores each result's Float32 forces, zero bitset and
// displacements, and the run's utilisation, verdicts and zero-in-all, in member order; the binary endpoint sends
// them and they read back equal to the design-format JSON stored beside them (forces to Float32 precision); one
// member's detail comes from its own endpoint. Only the team may read either (outsider, removed member: 404).
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { GET as getMember } from "@/app/api/projects/[projectId]/models/[number]/members/[memberId]/route";
import { GET as getColumns } from "@/app/api/projects/[projectId]/models/[number]/results/[resultId]/route";
import { analysisRuns, memberships, modelRevisions } from "@/db/schema";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import type { StoredReview } from "@/lib/models/analyse";
import { bitAt, unpackWire, VERDICT_CODES } from "@/lib/models/result-columns";
import { backfillResultColumns } from "@/lib/commands/backfill-result-columns";
import { insertRevision } from "@/db/queries/models";
import { runAnalysisJob } from "@/server/jobs/analysis";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";
import { packGeometry } from "@/lib/models/geometry-wire";

let fx: ProjectFixture;
let number: number;
let model: TrussModel;
let result: AnalysisResult;
let review: StoredReview;

const columnsPath = (resultId: string) => `/api/projects/${fx.projectId}/models/${number}/results/${encodeURIComponent(resultId)}`;
const fetchColumns = async (resultId: string, user?: FixtureUser, headers: Record<string, string> = {}) => {
  const request = await buildRequest(columnsPath(resultId), { user });
  for (const [name, value] of Object.entries(headers)) request.headers.set(name, value);
  return getColumns(request, routeContext({ projectId: fx.projectId, number: String(number), resultId }));
};
const fetchMember = async (memberId: string, user?: FixtureUser) =>
  getMember(await buildRequest(`/api/projects/${fx.projectId}/models/${number}/members/${encodeURIComponent(memberId)}`, { user }), routeContext({ projectId: fx.projectId, number: String(number), memberId }));

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("result-columns");
  // The product's path: a generated roof is saved, and the jobs process analyses, reviews and stores it.
  const roof = { kind: "generate", params: { name: "Columns grid", spanX: 9, spanY: 6, module: 3, depth: 1.5 } };
  const response = await createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body: roof, user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId }));
  expect(response.status).toBe(202);
  const saved = (await response.json()) as { revision: { id: string; number: number }; job: { id: string } };
  expect(await runAnalysisJob(saved.job.id)).toBe("done");
  number = saved.revision.number;
  const [revision] = await getDb().select().from(modelRevisions).where(eq(modelRevisions.id, saved.revision.id));
  const [run] = await getDb().select().from(analysisRuns).where(eq(analysisRuns.revisionId, saved.revision.id));
  model = revision.model;
  result = run.result;
  review = run.review!;
  expect(revision.memberOrder).toEqual(model.members.map((m) => m.id));
});
afterAll(closeDb);

describe("result columns", () => {
  it("read back equal to the stored JSON for every result, in member order", async () => {
    const resultIds = Object.keys(result.results);
    expect(resultIds.length).toBeGreaterThan(1);
    for (const resultId of resultIds) {
      const response = await fetchColumns(resultId, fx.users.viewer);
      expect(response.status).toBe(200);
      expect(response.headers.get("content-type")).toBe("application/octet-stream");
      const columns = unpackWire(await response.arrayBuffer());
      const json = result.results[resultId];
      expect(columns.memberCount).toBe(model.members.length);
      expect(columns.nodeCount).toBe(model.nodes.length);
      expect(columns.hasReview).toBe(true);
      const zero = new Set(json.zeroForceMembers);
      model.members.forEach((member, k) => {
        // Float32 storage: exactly the JSON value rounded to single precision.
        expect(columns.forces[k]).toBe(Math.fround(json.memberForces[member.id]));
        expect(bitAt(columns.zero, k)).toBe(zero.has(member.id) ? 1 : 0);
        expect(bitAt(columns.zeroInAll, k)).toBe(result.zeroInAll.includes(member.id) ? 1 : 0);
        const stored = review.members[member.id];
        expect(VERDICT_CODES[columns.verdicts[k] - 1]).toBe(stored.verdict);
        if (stored.utilisation === null) expect(columns.utilisation[k]).toBeNaN();
        else expect(columns.utilisation[k]).toBe(Math.fround(stored.utilisation));
      });
      model.nodes.forEach((node, k) => {
        const d = json.displacements[node.id];
        expect([...columns.displacements.subarray(k * 3, k * 3 + 3)]).toEqual([Math.fround(d.ux), Math.fround(d.uy), Math.fround(d.uz)]);
      });
    }
  });

  it("is immutable: a strong ETag, cached for a year, and 304 when the browser has it", async () => {
    const resultId = Object.keys(result.results)[0];
    const first = await fetchColumns(resultId, fx.users.architect);
    const etag = first.headers.get("etag")!;
    expect(etag).toMatch(/^"[^"]+"$/);
    expect(first.headers.get("cache-control")).toBe("private, max-age=31536000, immutable");
    const again = await fetchColumns(resultId, fx.users.architect, { "if-none-match": etag });
    expect(again.status).toBe(304);
    expect(await again.text()).toBe("");
    const other = await fetchColumns(Object.keys(result.results)[1], fx.users.architect);
    expect(other.headers.get("etag")).not.toBe(etag);
  });

  it("answers an unknown result or revision with 404 and a malformed revision with 404", async () => {
    expect((await fetchColumns("NO-SUCH-CASE", fx.users.viewer)).status).toBe(404);
    const missing = await getColumns(await buildRequest(`/api/projects/${fx.projectId}/models/999/results/x`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId, number: "999", resultId: "x" }));
    expect(missing.status).toBe(404);
    const hostile = await getColumns(await buildRequest(`/api/projects/${fx.projectId}/models/99999999999/results/x`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId, number: "99999999999", resultId: "x" }));
    expect([400, 404]).toContain(hostile.status);
  });
});

describe("who may read the columns and a member's detail", () => {
  it("refuses the signed-out (401), an outsider (404) and a member of another project (404)", async () => {
    const resultId = Object.keys(result.results)[0];
    const memberId = model.members[0].id;
    expect((await fetchColumns(resultId)).status).toBe(401);
    expect((await fetchMember(memberId)).status).toBe(401);
    expect((await fetchColumns(resultId, fx.users.outsider)).status).toBe(404);
    expect((await fetchMember(memberId, fx.users.outsider)).status).toBe(404);
    const other = await createProjectFixture("result-columns-other");
    expect((await fetchColumns(resultId, other.users.owner)).status).toBe(404);
    expect((await fetchMember(memberId, other.users.owner)).status).toBe(404);
  });

  it("refuses a member removed a second ago (404) and serves the viewer role", async () => {
    const resultId = Object.keys(result.results)[0];
    const memberId = model.members[0].id;
    expect((await fetchColumns(resultId, fx.users.mep_engineer)).status).toBe(200);
    await getDb().delete(memberships).where(and(eq(memberships.projectId, fx.projectId), eq(memberships.userId, fx.users.mep_engineer.id)));
    expect((await fetchColumns(resultId, fx.users.mep_engineer)).status).toBe(404);
    expect((await fetchMember(memberId, fx.users.mep_engineer)).status).toBe(404);
    expect((await fetchColumns(resultId, fx.users.viewer)).status).toBe(200);
    expect((await fetchMember(memberId, fx.users.viewer)).status).toBe(200);
  });
});

describe("one member's detail", () => {
  it("gives the member's force in every result, its envelope and its review with the arithmetic", async () => {
    // A member that carries force and one that is zero somewhere, so both flags are exercised.
    const someZero = model.members.find((m) => Object.values(result.results).some((r) => r.zeroForceMembers.includes(m.id)));
    const loaded = model.members.find((m) => !result.zeroInAll.includes(m.id))!;
    for (const member of [loaded, ...(someZero ? [someZero] : [])]) {
      const response = await fetchMember(member.id, fx.users.architect);
      expect(response.status).toBe(200);
      const body = await response.json();
      expect(body.member).toMatchObject({ id: member.id, i: member.i, j: member.j, section: member.section, index: model.members.indexOf(member) });
      expect(Object.keys(body.results).sort()).toEqual(Object.keys(result.results).sort());
      for (const [resultId, json] of Object.entries(result.results)) {
        expect(body.results[resultId]).toEqual({ force: Math.fround(json.memberForces[member.id]), zero: json.zeroForceMembers.includes(member.id) });
      }
      expect(body.envelope).toEqual(result.envelope[member.id]);
      expect(body.governing).toEqual(result.info.governing[member.id]);
      expect(body.review).toEqual(review.members[member.id]);
      expect(body.caution).toMatch(/engineer of record/);
    }
    expect((await fetchMember("NO-SUCH-MEMBER", fx.users.architect)).status).toBe(404);
  });
});

describe("runs stored before results were kept as columns", () => {
  it("get their columns from the migrate step's backfill, equal to their JSON", async () => {
    // A run as migration 0005 left it: JSON only, no columns.
    const revision = await insertRevision(getDb(), { projectId: fx.projectId, name: "Before columns", model, geometry: packGeometry(model), source: "generated", createdBy: null });
    await getDb().insert(analysisRuns).values({ revisionId: revision.id, status: "ok", result, review });
    const resultId = Object.keys(result.results)[1];
    const old = { projectId: fx.projectId, number: String(revision.number), resultId };
    const request = async () => getColumns(await buildRequest(`/api/projects/${fx.projectId}/models/${revision.number}/results/${resultId}`, { user: fx.users.viewer }), routeContext(old));
    expect((await request()).status).toBe(404);
    expect(await backfillResultColumns()).toBeGreaterThanOrEqual(1);
    const response = await request();
    expect(response.status).toBe(200);
    const columns = unpackWire(await response.arrayBuffer());
    model.members.forEach((member, k) => expect(columns.forces[k]).toBe(Math.fround(result.results[resultId].memberForces[member.id])));
    expect(columns.hasReview).toBe(true);
    // Nothing left to fill: a second pass does nothing.
    expect(await backfillResultColumns()).toBe(0);
  });
});
