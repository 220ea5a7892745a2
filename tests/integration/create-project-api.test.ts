import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST } from "@/app/api/projects/route";
import { auditEvents, memberships, organizations, projects } from "@/db/schema";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createFixtureUser, createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest } from "../support/session";

let fx: ProjectFixture;
let newcomer: FixtureUser;

const valid = (name: string) => ({ name, description: "Sports-hall roof, Northfield", designStandard: "EN1993-1-1", combinationStandard: "EN1990" });
const post = async (body: unknown, user?: FixtureUser) => POST(await buildRequest("/api/projects", { method: "POST", body, user }), undefined);
const projectsNamed = (name: string) => getDb().select().from(projects).where(eq(projects.name, name));

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("create-project");
  newcomer = await createFixtureUser("create-project-newcomer");
});
afterAll(closeDb);

describe("POST /api/projects", () => {
  it("answers 401 without a session and writes nothing", async () => {
    const name = `Signed out ${randomUUID()}`;
    const response = await post(valid(name));
    expect(response.status).toBe(401);
    expect(await projectsNamed(name)).toEqual([]);
  });

  it("answers 400 with issues for a missing name, an unknown standard or a body that is not JSON", async () => {
    const bad = await post({ ...valid(""), designStandard: "made-up" }, fx.users.owner);
    expect(bad.status).toBe(400);
    const { issues } = await bad.json();
    expect(issues.map((i: { path: string }) => i.path).sort()).toEqual(["designStandard", "name"]);
    const notJson = await POST(await buildRequest("/api/projects", { method: "POST", rawBody: "{", user: fx.users.owner }), undefined);
    expect(notJson.status).toBe(400);
  });

  it("creates the project in the owner's organisation, makes the creator owner and records an audit event", async () => {
    const name = `Northfield hall ${randomUUID().slice(0, 8)}`;
    const response = await post({ ...valid(name), designStandard: "AISC360-22", combinationStandard: "ASCE7-22" }, fx.users.owner);
    expect(response.status).toBe(201);
    const { project } = await response.json();
    expect(project).toMatchObject({ name, role: "owner", designStandard: "AISC360-22", combinationStandard: "ASCE7-22", organization: { id: fx.organizationId } });
    const [membership] = await getDb().select().from(memberships).where(eq(memberships.projectId, project.id));
    expect(membership).toMatchObject({ userId: fx.users.owner.id, role: "owner" });
    const events = await getDb().select().from(auditEvents).where(eq(auditEvents.projectId, project.id));
    expect(events).toEqual([expect.objectContaining({ action: "project.created", actorId: fx.users.owner.id, subjectId: project.id })]);
  });

  it("answers 409 for a name the organisation already uses and writes nothing more", async () => {
    const name = `Twice ${randomUUID().slice(0, 8)}`;
    expect((await post(valid(name), fx.users.owner)).status).toBe(201);
    const again = await post(valid(name), fx.users.owner);
    expect(again.status).toBe(409);
    expect((await again.json()).issues).toEqual([{ path: "name", message: expect.any(String) }]);
    expect(await projectsNamed(name)).toHaveLength(1);
  });

  it("asks a user without an organisation to name one, and writes nothing until they do", async () => {
    const name = `First roof ${randomUUID().slice(0, 8)}`;
    const missing = await post(valid(name), newcomer);
    expect(missing.status).toBe(400);
    expect((await missing.json()).issues).toEqual([{ path: "organizationName", message: expect.any(String) }]);
    expect(await projectsNamed(name)).toEqual([]);

    const organizationName = `Northfield Leisure ${randomUUID().slice(0, 8)}`;
    const created = await post({ ...valid(name), organizationName }, newcomer);
    expect(created.status).toBe(201);
    expect((await created.json()).project).toMatchObject({ name, role: "owner", organization: { name: organizationName } });
  });

  it("refuses a new organisation whose name is taken, leaving no organisation, project or membership behind", async () => {
    const loner = await createFixtureUser("create-project-loner");
    const [taken] = await getDb().select().from(organizations).where(eq(organizations.id, fx.organizationId));
    const name = `Taken org ${randomUUID().slice(0, 8)}`;
    const response = await post({ ...valid(name), organizationName: taken.name }, loner);
    expect(response.status).toBe(409);
    expect(await projectsNamed(name)).toEqual([]);
    expect(await getDb().select().from(memberships).where(eq(memberships.userId, loner.id))).toEqual([]);
  });
});
