import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET, PATCH } from "@/app/api/projects/[projectId]/members/route";
import { auditEvents, memberships } from "@/db/schema";
import { ROLES } from "@/lib/permissions";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
const path = () => `/api/projects/${fx.projectId}/members`;
const ctx = () => routeContext({ projectId: fx.projectId });

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("members-api");
});
afterAll(closeDb);

describe("GET /api/projects/[projectId]/members", () => {
  it("answers 401 without a session and 404 to a non-member", async () => {
    expect((await GET(await buildRequest(path()), ctx())).status).toBe(401);
    expect((await GET(await buildRequest(path(), { user: fx.users.outsider }), ctx())).status).toBe(404);
  });

  it("lists the team, owner first, without password hashes", async () => {
    const response = await GET(await buildRequest(path(), { user: fx.users.viewer }), ctx());
    expect(response.status).toBe(200);
    const { members } = await response.json();
    expect(members.map((m: { role: string }) => m.role)).toEqual([...ROLES]);
    expect(JSON.stringify(members)).not.toMatch(/password/i);
  });
});

describe("PATCH /api/projects/[projectId]/members", () => {
  const change = (role: string) => ({ userId: fx.users.architect.id, role });

  it("answers 401 without a session and 404 to a non-member", async () => {
    expect((await PATCH(await buildRequest(path(), { method: "PATCH", body: change("viewer") }), ctx())).status).toBe(401);
    expect((await PATCH(await buildRequest(path(), { method: "PATCH", body: change("viewer"), user: fx.users.outsider }), ctx())).status).toBe(404);
  });

  it.each(ROLES.filter((r) => r !== "owner"))("answers 403 to a %s", async (role) => {
    const response = await PATCH(await buildRequest(path(), { method: "PATCH", body: change("viewer"), user: fx.users[role] }), ctx());
    expect(response.status).toBe(403);
  });

  it("answers 400 with issues for an unknown role or a malformed body", async () => {
    const bad = await PATCH(await buildRequest(path(), { method: "PATCH", body: change("chief"), user: fx.users.owner }), ctx());
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues).toEqual([{ path: "role", message: expect.any(String) }]);
    const notJson = await PATCH(await buildRequest(path(), { method: "PATCH", rawBody: "{", user: fx.users.owner }), ctx());
    expect(notJson.status).toBe(400);
  });

  it("lets the owner change a role and records an audit event", async () => {
    const response = await PATCH(await buildRequest(path(), { method: "PATCH", body: change("viewer"), user: fx.users.owner }), ctx());
    expect(response.status).toBe(200);
    expect((await response.json()).member).toMatchObject({ userId: fx.users.architect.id, role: "viewer" });
    const events = await getDb().select().from(auditEvents).where(eq(auditEvents.projectId, fx.projectId));
    expect(events).toContainEqual(expect.objectContaining({ action: "member.role_changed", subjectId: fx.users.architect.id, actorId: fx.users.owner.id, details: { from: "architect", to: "viewer" } }));
  });

  it("refuses to remove the last owner and changes nothing", async () => {
    const response = await PATCH(await buildRequest(path(), { method: "PATCH", body: { userId: fx.users.owner.id, role: "viewer" }, user: fx.users.owner }), ctx());
    expect(response.status).toBe(409);
    const [row] = await getDb().select().from(memberships).where(eq(memberships.userId, fx.users.owner.id));
    expect(row.role).toBe("owner");
  });

  it("answers 404 for someone who is not on the team", async () => {
    const response = await PATCH(await buildRequest(path(), { method: "PATCH", body: { userId: fx.users.outsider.id, role: "viewer" }, user: fx.users.owner }), ctx());
    expect(response.status).toBe(404);
  });
});
