// Who may read a node's results (GET …/models/N/nodes/<id>), attack first: the signed-out (401), an outsider and a
// member of another project (404, so they cannot probe which projects or nodes exist), a member removed a second ago
// (404), another project's node id and revision, and hostile node and member ids (4xx with a message, never a 500); the viewer
// role reads it.
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as getMember } from "@/app/api/projects/[projectId]/models/[number]/members/[memberId]/route";
import { GET as getNode } from "@/app/api/projects/[projectId]/models/[number]/nodes/[nodeId]/route";
import { memberships } from "@/db/schema";
import { analyzeModel } from "@/lib/analysis/analyze";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { triangleModel, pointLoads } from "@/tests/support/fixtures/analysis-models";
import { TRIPOD } from "@/tests/support/fixtures/report";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let other: ProjectFixture;
let number: number;

const fetchNode = async (nodeId: string, user?: FixtureUser, project = fx, revision = number) =>
  getNode(
    await buildRequest(`/api/projects/${project.projectId}/models/${revision}/nodes/${nodeId.isWellFormed() ? encodeURIComponent(nodeId).slice(0, 200) : "x"}`, { user }),
    routeContext({ projectId: project.projectId, number: String(revision), nodeId }),
  );

beforeAll(async () => {
  requireIntegrationEnv();
  [fx, other] = await Promise.all([createProjectFixture("node-access"), createProjectFixture("node-access-other")]);
  const analysed = (projectId: string, model: typeof TRIPOD, createdBy: string) => createRevisionWithAnalysis({ projectId, name: model.name, model, source: "uploaded", createdBy, result: analyzeModel(model), review: null });
  number = (await analysed(fx.projectId, TRIPOD, fx.users.structural_engineer.id)).number;
  // the other project's roof has a node "C" too and one, "B", at another place; and a revision 2 this project lacks
  const foreign = triangleModel({ loadCases: [pointLoads("L1", [["C", 0, 0, -10]])] });
  await analysed(other.projectId, foreign, other.users.structural_engineer.id);
  await analysed(other.projectId, foreign, other.users.structural_engineer.id);
});
afterAll(closeDb);

describe("who may read a node's results", () => {
  it("refuses the signed-out (401), an outsider (404) and the owner of another project (404)", async () => {
    expect((await fetchNode("A")).status).toBe(401);
    expect((await fetchNode("A", fx.users.outsider)).status).toBe(404);
    expect((await fetchNode("A", other.users.owner)).status).toBe(404);
  });

  it("refuses a member removed a second ago (404) and serves the viewer role", async () => {
    expect((await fetchNode("A", fx.users.mep_engineer)).status).toBe(200);
    await getDb().delete(memberships).where(and(eq(memberships.projectId, fx.projectId), eq(memberships.userId, fx.users.mep_engineer.id)));
    expect((await fetchNode("A", fx.users.mep_engineer)).status).toBe(404);
    expect((await fetchNode("A", fx.users.viewer)).status).toBe(200);
  });

  it("never reaches another project's revision: its revision number and its own node ids answer 404 here", async () => {
    // revision 2 exists only in the other project
    expect((await fetchNode("C", fx.users.owner, fx, 2)).status).toBe(404);
    // this project's owner asking for the other project's revision through the other project's id
    expect((await fetchNode("C", fx.users.owner, other, 1)).status).toBe(404);
    // the other project's member reads its own node: the foreign roof is there, and is not this one's
    const foreign = await fetchNode("B", other.users.viewer, other, 1);
    expect(foreign.status).toBe(200);
    expect((await foreign.json()).node).toEqual({ id: "B", x: 4, y: 0, z: 0 });
  });

  // On an analysed revision, so the id reaches the query: a null character there was a 500 (PostgreSQL refuses the
  // text) on this route and on the member detail alike, until route params refused unstorable text (lib/http/parse.ts).
  it("hostile node and member ids: a 4xx that says what is wrong, never a 500", async () => {
    for (const id of ["x".repeat(1024 * 1024), "a\u0000b", "\ud800", "__proto__", "constructor", "' or 1=1 --", "*", ""]) {
      const what = JSON.stringify(id.slice(0, 20));
      const path = `/api/projects/${fx.projectId}/models/${number}/members/${id.isWellFormed() ? encodeURIComponent(id).slice(0, 200) : "x"}`;
      const member = await getMember(await buildRequest(path, { user: fx.users.owner }), routeContext({ projectId: fx.projectId, number: String(number), memberId: id }));
      for (const response of [await fetchNode(id, fx.users.owner), member]) {
        expect(response.status, what).toBeGreaterThanOrEqual(400);
        expect(response.status, what).toBeLessThan(500);
        expect(typeof (await response.json()).error, what).toBe("string");
      }
    }
  });
});
