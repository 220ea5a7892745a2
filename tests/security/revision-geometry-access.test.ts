// Who may read a revision's geometry and its overview (GET …/models/N/geometry and …/summary): the signed-out get
// 401; an outsider, a member of another project and a member removed a second ago get 404 (no probing which
// projects or revisions exist); a viewer may read both; an unknown or malformed revision number is a 404.
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { GET as getGeometry } from "@/app/api/projects/[projectId]/models/[number]/geometry/route";
import { GET as getSummary } from "@/app/api/projects/[projectId]/models/[number]/summary/route";
import { memberships } from "@/db/schema";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let number: number;
const endpoints = [
  { path: "/geometry", handler: getGeometry },
  { path: "/summary", handler: getSummary },
];

const call = async (endpoint: (typeof endpoints)[number], user: FixtureUser | undefined, n: string = String(number)) =>
  endpoint.handler(await buildRequest(`/api/projects/${fx.projectId}/models/${n}${endpoint.path}`, { user }), routeContext({ projectId: fx.projectId, number: n }));

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("geometry-access");
  const roof = { kind: "generate", params: { name: "Access grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
  const response = await createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body: roof, user: fx.users.structural_engineer }), routeContext({ projectId: fx.projectId }));
  expect(response.status).toBe(202);
  number = ((await response.json()) as { revision: { number: number } }).revision.number;
});
afterAll(closeDb);

describe.each(endpoints)("GET …/models/N$path", (endpoint) => {
  it("refuses the signed-out (401), an outsider (404) and a member of another project (404)", async () => {
    expect((await call(endpoint, undefined)).status).toBe(401);
    expect((await call(endpoint, fx.users.outsider)).status).toBe(404);
    const other = await createProjectFixture("geometry-access-other");
    expect((await call(endpoint, other.users.owner)).status).toBe(404);
  });

  it("serves the viewer role", async () => {
    expect((await call(endpoint, fx.users.viewer)).status).toBe(200);
  });

  it("answers an unknown, negative or malformed revision number with 404", async () => {
    for (const n of ["999", "0", "-1", "abc", "99999999999", "1e3"]) expect((await call(endpoint, fx.users.viewer, n)).status).toBe(404);
  });
});

describe("a member removed a second ago", () => {
  it("can no longer read either (404)", async () => {
    for (const endpoint of endpoints) expect((await call(endpoint, fx.users.architect)).status).toBe(200);
    await getDb().delete(memberships).where(and(eq(memberships.projectId, fx.projectId), eq(memberships.userId, fx.users.architect.id)));
    for (const endpoint of endpoints) expect((await call(endpoint, fx.users.architect)).status).toBe(404);
  });
});
