import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listInvitations, POST as invite } from "@/app/api/projects/[projectId]/invitations/route";
import { GET as checkToken, POST as accept } from "@/app/api/invitations/[token]/route";
import { auditEvents, invitations, memberships, users } from "@/db/schema";
import { hashToken } from "@/lib/team/invitation-link";
import { ROLES } from "@/lib/permissions";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createFixtureUser, createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
const path = () => `/api/projects/${fx.projectId}/invitations`;
const ctx = () => routeContext({ projectId: fx.projectId });
let counter = 0;
const freshEmail = () => `invitee-${Date.now().toString(36)}-${counter++}@fixture.test`;

async function createAsOwner(email: string, role = "architect") {
  const response = await invite(await buildRequest(path(), { method: "POST", body: { email, role }, user: fx.users.owner }), ctx());
  expect(response.status).toBe(201);
  const body = await response.json();
  const token = new URL(body.joinLink).pathname.split("/").pop()!;
  return { body, token };
}

const tokenCtx = (token: string) => routeContext({ token });

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("invitations-api");
});
afterAll(closeDb);

describe("POST/GET /api/projects/[projectId]/invitations", () => {
  it("answers 401 without a session and 404 to a non-member", async () => {
    expect((await invite(await buildRequest(path(), { method: "POST", body: { email: freshEmail(), role: "viewer" } }), ctx())).status).toBe(401);
    expect((await listInvitations(await buildRequest(path()), ctx())).status).toBe(401);
    expect((await invite(await buildRequest(path(), { method: "POST", body: { email: freshEmail(), role: "viewer" }, user: fx.users.outsider }), ctx())).status).toBe(404);
  });

  it.each(ROLES.filter((r) => r !== "owner"))("answers 403 to a %s", async (role) => {
    expect((await invite(await buildRequest(path(), { method: "POST", body: { email: freshEmail(), role: "viewer" }, user: fx.users[role] }), ctx())).status).toBe(403);
    expect((await listInvitations(await buildRequest(path(), { user: fx.users[role] }), ctx())).status).toBe(403);
  });

  it("answers 400 with an issue per malformed field", async () => {
    const response = await invite(await buildRequest(path(), { method: "POST", body: { email: "not-an-email", role: "boss" }, user: fx.users.owner }), ctx());
    expect(response.status).toBe(400);
    const { issues } = await response.json();
    expect(issues.map((i: { path: string }) => i.path).sort()).toEqual(["email", "role"]);
  });

  it("creates an invitation with a join link, stores only the token's hash, and audits it", async () => {
    const email = freshEmail();
    const { body, token } = await createAsOwner(email.toUpperCase());
    expect(body.invitation).toMatchObject({ email, role: "architect", acceptedAt: null });
    expect(body.joinLink).toMatch(/\/join\/[A-Za-z0-9_-]{40,}$/);
    const [row] = await getDb().select().from(invitations).where(eq(invitations.id, body.invitation.id));
    expect(row.tokenHash).toBe(hashToken(token));
    expect(row.tokenHash).not.toContain(token);
    const [event] = await getDb().select().from(auditEvents).where(eq(auditEvents.subjectId, body.invitation.id));
    expect(event).toMatchObject({ action: "invitation.created", actorId: fx.users.owner.id });
    const list = await (await listInvitations(await buildRequest(path(), { user: fx.users.owner }), ctx())).json();
    expect(list.invitations.map((i: { id: string }) => i.id)).toContain(body.invitation.id);
    expect(JSON.stringify(list)).not.toMatch(/tokenHash/);
  });

  it("refuses a duplicate: someone already on the team, or a pending invitation", async () => {
    const member = await invite(await buildRequest(path(), { method: "POST", body: { email: fx.users.viewer.email, role: "architect" }, user: fx.users.owner }), ctx());
    expect(member.status).toBe(409);
    expect((await member.json()).issues).toEqual([{ path: "email", message: expect.any(String) }]);
    const email = freshEmail();
    await createAsOwner(email);
    const again = await invite(await buildRequest(path(), { method: "POST", body: { email, role: "viewer" }, user: fx.users.owner }), ctx());
    expect(again.status).toBe(409);
  });
});

describe("GET/POST /api/invitations/[token]", () => {
  it("answers 404 for an unknown token", async () => {
    const token = "x".repeat(43);
    expect((await checkToken(await buildRequest(`/api/invitations/${token}`), tokenCtx(token))).status).toBe(404);
    expect((await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "A", password: "long-enough-pw" } }), tokenCtx(token))).status).toBe(404);
  });

  it("lets a newcomer join with a name and password, once", async () => {
    const email = freshEmail();
    const { token } = await createAsOwner(email, "mep_engineer");
    const check = await (await checkToken(await buildRequest(`/api/invitations/${token}`), tokenCtx(token))).json();
    expect(check.invitation).toMatchObject({ status: "pending", email, role: "mep_engineer", accountExists: false, project: { id: fx.projectId } });

    const bad = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "", password: "short" } }), tokenCtx(token));
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues.map((i: { path: string }) => i.path).sort()).toEqual(["name", "password"]);

    const ok = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "Nadia Quill", password: "a-long-password" } }), tokenCtx(token));
    expect(ok.status).toBe(201);
    const { user } = await ok.json();
    expect(user).toEqual({ id: expect.any(String), email, name: "Nadia Quill" });
    const [membership] = await getDb().select().from(memberships).where(eq(memberships.userId, user.id));
    expect(membership).toMatchObject({ projectId: fx.projectId, role: "mep_engineer" });

    const used = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "Nadia Quill", password: "a-long-password" } }), tokenCtx(token));
    expect(used.status).toBe(410);
    expect((await used.json()).error).toMatch(/already been used/);
    const status = await (await checkToken(await buildRequest(`/api/invitations/${token}`), tokenCtx(token))).json();
    expect(status.invitation.status).toBe("accepted");
  });

  it("refuses an expired invitation and writes nothing", async () => {
    const email = freshEmail();
    const { token } = await createAsOwner(email);
    await getDb().update(invitations).set({ expiresAt: new Date(Date.now() - 1000) }).where(eq(invitations.tokenHash, hashToken(token)));
    const response = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "Late Comer", password: "a-long-password" } }), tokenCtx(token));
    expect(response.status).toBe(410);
    expect((await response.json()).error).toMatch(/expired/);
    expect(await getDb().select().from(users).where(eq(users.email, email))).toEqual([]);
  });

  it("asks an existing account to sign in, and refuses a different signed-in account", async () => {
    const existing = await createFixtureUser("invitations-existing");
    const { token } = await createAsOwner(existing.email, "viewer");
    const check = await (await checkToken(await buildRequest(`/api/invitations/${token}`), tokenCtx(token))).json();
    expect(check.invitation.accountExists).toBe(true);

    const anonymous = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "Someone", password: "a-long-password" } }), tokenCtx(token));
    expect(anonymous.status).toBe(401);
    const wrongPerson = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: {}, user: fx.users.outsider }), tokenCtx(token));
    expect(wrongPerson.status).toBe(403);
    expect(await getDb().select().from(memberships).where(eq(memberships.userId, existing.id))).toEqual([]);

    const ok = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: {}, user: existing }), tokenCtx(token));
    expect(ok.status).toBe(201);
    const [membership] = await getDb().select().from(memberships).where(eq(memberships.userId, existing.id));
    expect(membership.role).toBe("viewer");
    const [inv] = await getDb().select().from(invitations).where(eq(invitations.tokenHash, hashToken(token)));
    expect(inv.acceptedBy).toBe(existing.id);
  });
});
