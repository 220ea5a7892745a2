// Who may read a revision's MEP runs, its clash list and the clashes CSV (GET …/runs, …/clashes, …/exports/clashes.csv),
// which look the revision up by its number within the route's project: the signed-out get 401; an outsider, a member
// of another project and a member removed a second ago get 404; a revision number that exists only in another
// project is a 404, never that project's runs or clashes; hostile revision numbers are a 4xx, never a 500.
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listClashes } from "@/app/api/projects/[projectId]/clashes/route";
import { GET as clashesCsv } from "@/app/api/projects/[projectId]/exports/clashes.csv/route";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { GET as listRuns } from "@/app/api/projects/[projectId]/runs/route";
import { memberships } from "@/db/schema";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let other: ProjectFixture;
const endpoints = [
  { name: "runs", path: "/runs", handler: listRuns },
  { name: "clash list", path: "/clashes", handler: listClashes },
  { name: "clashes CSV", path: "/exports/clashes.csv", handler: clashesCsv },
];

/** `revision` goes into the query string as given (already percent-encoded). */
const call = async (endpoint: (typeof endpoints)[number], user: FixtureUser | undefined, revision = "1") =>
  endpoint.handler(await buildRequest(`/api/projects/${fx.projectId}${endpoint.path}?revision=${revision}`, { user }), routeContext({ projectId: fx.projectId }));

async function generate(project: ProjectFixture, name: string) {
  const roof = { kind: "generate", params: { name, spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
  const response = await createRevision(await buildRequest(`/api/projects/${project.projectId}/models`, { method: "POST", body: roof, user: project.users.structural_engineer }), routeContext({ projectId: project.projectId }));
  expect(response.status).toBe(202);
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("mep-reads-access");
  other = await createProjectFixture("mep-reads-access-other");
  await generate(fx, "Access grid");
  // the other project has revisions 1 and 2; this one only 1
  await generate(other, "Other grid 1");
  await generate(other, "Other grid 2");
});
afterAll(closeDb);

describe.each(endpoints)("GET the $name of a revision", (endpoint) => {
  it("refuses the signed-out (401), an outsider (404) and a member of another project (404)", async () => {
    expect((await call(endpoint, undefined)).status).toBe(401);
    expect((await call(endpoint, fx.users.outsider)).status).toBe(404);
    expect((await call(endpoint, other.users.owner)).status).toBe(404);
  });

  it("serves the project's own revision, and a number only another project has is a 404", async () => {
    expect((await call(endpoint, fx.users.owner)).status).toBe(200);
    expect((await call(endpoint, fx.users.owner, "2")).status).toBe(404);
  });

  it("answers hostile revision numbers with a 4xx, never a 500", async () => {
    // a null byte, a lone surrogate (as the bytes a browser would send) and a 100 kB value among them
    for (const revision of ["0", "-1", "abc", "99999999999", "1e308", "1%00", "%ED%A0%80", "__proto__", "x".repeat(100_000)]) {
      const status = (await call(endpoint, fx.users.owner, revision)).status;
      expect([400, 404], `revision=${revision.slice(0, 20)} answered ${status}`).toContain(status);
    }
  });
});

describe("a member removed a second ago", () => {
  it("can no longer read the runs or the clash list (404)", async () => {
    const readers = endpoints.slice(0, 2);
    for (const endpoint of readers) expect((await call(endpoint, fx.users.architect)).status).toBe(200);
    await getDb().delete(memberships).where(and(eq(memberships.projectId, fx.projectId), eq(memberships.userId, fx.users.architect.id)));
    for (const endpoint of readers) expect((await call(endpoint, fx.users.architect)).status).toBe(404);
  });
});
