// Issue 15 item 8: support reactions and displacements per result in the node and member panels. The node endpoint
// (GET …/models/N/nodes/<id>) and a member's end nodes in its own detail, against the stored analysis and against
// hand statics of the symmetric tripod (tests/support/fixtures/report.ts), derived here:
//   legs from D(0,0,1) to A, B, C on the unit circle at z = 0: length √2, at 45° (cos θ = sin θ = 1/√2).
//   Vertical equilibrium at D under P down: 3·N·(1/√2) = P, so each support takes P/3 up and P/3 inwards
//   (towards the axis), the leg being at 45°. Vertical stiffness of D: k = 3·(EA/L)·cos²θ = 3·EA/(2√2), so
//   uz(D) = -P/k, and D does not move sideways (symmetry). AB joins two fully held supports: no force, no movement.
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getMember } from "@/app/api/projects/[projectId]/models/[number]/members/[memberId]/route";
import { GET as getNode } from "@/app/api/projects/[projectId]/models/[number]/nodes/[nodeId]/route";
import { analysisRuns } from "@/db/schema";
import { analyzeModel, type AnalysisResult } from "@/lib/analysis/analyze";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import type { MemberDetail } from "@/lib/models/member-detail";
import type { NodeDetail } from "@/lib/models/node-detail";
import { TRIPOD } from "@/tests/support/fixtures/report";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let number: number;
let stored: AnalysisResult;

const EA = TRIPOD.materials[0].E * TRIPOD.sections[0].area; // kN
const k = (3 * EA) / (2 * Math.SQRT2); // kN/m, vertical stiffness of the apex (derived above)
const P = { "ULS-1": 1.35 * 30, "ULS-3": 1.0 * 30 - 1.5 * 40, dead: 30, wind: -40 } as const; // kN down at D

const fetchNode = async (nodeId: string, user?: FixtureUser, headers: Record<string, string> = {}) => {
  const request = await buildRequest(`/api/projects/${fx.projectId}/models/${number}/nodes/${encodeURIComponent(nodeId)}`, { user });
  for (const [name, value] of Object.entries(headers)) request.headers.set(name, value);
  return getNode(request, routeContext({ projectId: fx.projectId, number: String(number), nodeId }));
};
const nodeDetail = async (nodeId: string) => {
  const response = await fetchNode(nodeId, fx.users.architect);
  expect(response.status).toBe(200);
  return (await response.json()) as NodeDetail;
};

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("node-detail");
  const revision = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "Lantern", model: TRIPOD, source: "uploaded", createdBy: fx.users.structural_engineer.id, result: analyzeModel(TRIPOD), review: null });
  number = revision.number;
  const [run] = await getDb().select().from(analysisRuns).where(and(eq(analysisRuns.revisionId, revision.id)));
  stored = run.result;
});
afterAll(closeDb);

describe("a support node's detail", () => {
  it("gives its reaction in every load case and combination: P/3 up and P/3 towards the axis (hand statics)", async () => {
    const body = await nodeDetail("A");
    expect(body.node).toEqual({ id: "A", x: 1, y: 0, z: 0 });
    expect(body.support).toEqual({ ux: true, uy: true, uz: true });
    expect(Object.keys(body.results).sort()).toEqual(Object.keys(stored.results).sort());
    for (const [resultId, load] of Object.entries(P)) {
      const { reaction, displacement } = body.results[resultId];
      // A is at (1, 0, 0): "towards the axis" is -x.
      expect(reaction!.fz).toBeCloseTo(load / 3, 9);
      expect(reaction!.fx).toBeCloseTo(-load / 3, 9);
      expect(Math.abs(reaction!.fy)).toBeLessThan(1e-9);
      // exactly what the analysis stored, and a held node does not move
      expect(reaction).toEqual(stored.results[resultId].reactions.A);
      expect(displacement).toEqual({ ux: 0, uy: 0, uz: 0, total: 0 });
    }
    expect(body.caution).toMatch(/engineer of record/);
  });

  it("the three supports' reactions balance the applied load to 1e-9 relative in every result (issue 15 item 8)", async () => {
    const supports = await Promise.all(["A", "B", "C"].map(nodeDetail));
    for (const [resultId, load] of Object.entries(P)) {
      const sum = supports.reduce((s, d) => ({ fx: s.fx + d.results[resultId].reaction!.fx, fy: s.fy + d.results[resultId].reaction!.fy, fz: s.fz + d.results[resultId].reaction!.fz }), { fx: 0, fy: 0, fz: 0 });
      // ΣR + ΣF = 0 with ΣF = (0, 0, -load)
      expect(Math.hypot(sum.fx, sum.fy, sum.fz - load) / Math.abs(load)).toBeLessThan(1e-9);
    }
  });
});

describe("a free node's detail", () => {
  it("gives ux, uy, uz and |u| in every result: uz(D) = -P/k, no sideways movement (closed form), and no reaction", async () => {
    const body = await nodeDetail("D");
    expect(body.support).toBeNull();
    for (const [resultId, load] of Object.entries(P)) {
      const { displacement, reaction } = body.results[resultId];
      expect(reaction).toBeNull();
      expect(Math.abs(displacement.uz / (-load / k) - 1)).toBeLessThan(1e-9);
      expect(Math.hypot(displacement.ux, displacement.uy)).toBeLessThan(1e-12);
      expect(displacement.total).toBeCloseTo(Math.abs(load) / k, 12);
      const { ux, uy, uz } = stored.results[resultId].displacements.D;
      expect({ ux, uy, uz }).toEqual({ ux: displacement.ux, uy: displacement.uy, uz: displacement.uz });
    }
  });

  it("is immutable: a strong ETag, cached for a year, 304 when the browser has it", async () => {
    const first = await fetchNode("D", fx.users.viewer);
    const etag = first.headers.get("etag")!;
    expect(etag).toMatch(/^"[^"]+"$/);
    expect(first.headers.get("cache-control")).toBe("private, max-age=31536000, immutable");
    expect((await fetchNode("D", fx.users.viewer, { "if-none-match": etag })).status).toBe(304);
    expect((await fetchNode("A", fx.users.viewer)).headers.get("etag")).not.toBe(etag);
  });

  it("answers an unknown node, or a node of an unknown revision, with 404", async () => {
    const unknown = await fetchNode("NO-SUCH-NODE", fx.users.viewer);
    expect(unknown.status).toBe(404);
    expect((await unknown.json()).error).toMatch(/no analysed node/);
    const missing = await getNode(await buildRequest(`/api/projects/${fx.projectId}/models/999/nodes/A`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId, number: "999", nodeId: "A" }));
    expect(missing.status).toBe(404);
  });
});

describe("a member's end nodes in its detail", () => {
  it("gives the displacement and reaction of both ends in every result, the same as the node endpoint", async () => {
    const response = await getMember(await buildRequest(`/api/projects/${fx.projectId}/models/${number}/members/AD`, { user: fx.users.mep_engineer }), routeContext({ projectId: fx.projectId, number: String(number), memberId: "AD" }));
    expect(response.status).toBe(200);
    const member = (await response.json()) as MemberDetail;
    const [a, d] = await Promise.all([nodeDetail("A"), nodeDetail("D")]);
    expect(Object.keys(member.ends).sort()).toEqual(Object.keys(stored.results).sort());
    for (const resultId of Object.keys(stored.results)) {
      expect(member.ends[resultId]).toEqual({ i: a.results[resultId], j: d.results[resultId] });
    }
    expect(member.ends["ULS-1"].j.displacement.uz).toBeLessThan(0);
    expect(member.ends["ULS-1"].i.reaction!.fz).toBeCloseTo(13.5, 9);
  });
});
