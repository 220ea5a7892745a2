import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { DELETE as cancel } from "@/app/api/projects/[projectId]/invitations/[invitationId]/route";
import { DELETE as remove } from "@/app/api/projects/[projectId]/members/[userId]/route";
import { createInvitation } from "@/lib/commands/create-invitation";
import { auditEvents, invitations, memberships } from "@/db/schema";
import { ROLES } from "@/lib/permissions";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createFixtureUser, createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("team-removal");
});
afterAll(closeDb);

const membershipOf = async (userId: string) =>
  (await getDb().select().from(memberships).where(and(eq(memberships.projectId, fx.projectId), eq(memberships.userId, userId))))[0];
const eventsOf = (action: string) => getDb().select().from(auditEvents).where(and(eq(auditEvents.projectId, fx.projectId), eq(auditEvents.action, action)));

describe("DELETE /api/projects/[projectId]/invitations/[invitationId]", () => {
  let invitationId: string;
  const path = () => `/api/projects/${fx.projectId}/invitations/${invitationId}`;
  const ctx = (id = invitationId) => routeContext({ projectId: fx.projectId, invitationId: id });
  const call = async (user?: FixtureUser, id = invitationId) => cancel(await buildRequest(path(), { method: "DELETE", user }), ctx(id));
  const stored = async () => (await getDb().select().from(invitations).where(eq(invitations.id, invitationId)))[0];

  beforeAll(async () => {
    const { invitation } = await createInvitation({ projectId: fx.projectId, email: `cancel-${fx.projectId.slice(0, 8)}@fixture.test`, role: "architect", invitedBy: fx.users.owner.id });
    invitationId = invitation.id;
  });

  it("answers 401 signed out and 404 to a non-member, keeping the invitation", async () => {
    expect((await call()).status).toBe(401);
    expect((await call(fx.users.outsider)).status).toBe(404);
    expect(await stored()).toBeDefined();
  });

  it.each(ROLES.filter((r) => r !== "owner"))("answers 403 to a %s", async (role) => {
    expect((await call(fx.users[role])).status).toBe(403);
    expect(await stored()).toBeDefined();
  });

  // Malformed ids are a 404 by the project's rule (lib/http/parse.ts parseParams); a DELETE has no body to be a 400.
  it("answers 404 for a malformed id and for an invitation of another project", async () => {
    expect((await call(fx.users.owner, "not-a-uuid")).status).toBe(404);
    const other = await createProjectFixture("team-removal-other");
    const { invitation } = await createInvitation({ projectId: other.projectId, email: `other-${other.projectId.slice(0, 8)}@fixture.test`, role: "viewer", invitedBy: other.users.owner.id });
    expect((await call(fx.users.owner, invitation.id)).status).toBe(404);
    expect((await getDb().select().from(invitations).where(eq(invitations.id, invitation.id))).length).toBe(1);
  });

  it("lets the owner cancel it, with an audit event", async () => {
    expect((await call(fx.users.owner)).status).toBe(204);
    expect(await stored()).toBeUndefined();
    expect(await eventsOf("invitation.cancelled")).toEqual([expect.objectContaining({ actorId: fx.users.owner.id, subjectId: invitationId })]);
    expect((await call(fx.users.owner)).status).toBe(404);
  });
});

describe("DELETE /api/projects/[projectId]/members/[userId]", () => {
  const path = (userId: string) => `/api/projects/${fx.projectId}/members/${userId}`;
  const call = async (target: string, user?: FixtureUser) => remove(await buildRequest(path(target), { method: "DELETE", user }), routeContext({ projectId: fx.projectId, userId: target }));

  it("answers 401 signed out and 404 to a non-member, removing no one", async () => {
    expect((await call(fx.users.viewer.id)).status).toBe(401);
    expect((await call(fx.users.viewer.id, fx.users.outsider)).status).toBe(404);
    expect(await membershipOf(fx.users.viewer.id)).toBeDefined();
  });

  it.each(ROLES.filter((r) => r !== "owner"))("answers 403 to a %s, even removing themselves or another member", async (role) => {
    expect((await call(fx.users.viewer.id, fx.users[role])).status).toBe(403);
    expect((await call(fx.users.owner.id, fx.users[role])).status).toBe(403);
    expect(await membershipOf(fx.users.viewer.id)).toBeDefined();
    expect(await membershipOf(fx.users.owner.id)).toBeDefined();
  });

  it("answers 404 for a malformed id and for someone not on the team", async () => {
    expect((await call("not-a-uuid", fx.users.owner)).status).toBe(404);
    expect((await call(fx.users.outsider.id, fx.users.owner)).status).toBe(404);
  });

  it("never removes the last owner, and writes no audit event for the refusal", async () => {
    const response = await call(fx.users.owner.id, fx.users.owner);
    expect(response.status).toBe(409);
    expect(await response.json()).toEqual({ error: expect.stringMatching(/owner/) });
    expect(await membershipOf(fx.users.owner.id)).toMatchObject({ role: "owner" });
    expect(await eventsOf("member.removed")).toEqual([]);
  });

  it("lets the owner remove a member, with an audit event; the removed member is then an outsider", async () => {
    expect((await call(fx.users.viewer.id, fx.users.owner)).status).toBe(204);
    expect(await membershipOf(fx.users.viewer.id)).toBeUndefined();
    expect(await eventsOf("member.removed")).toEqual([expect.objectContaining({ actorId: fx.users.owner.id, subjectId: fx.users.viewer.id, details: { role: "viewer" } })]);
    expect((await call(fx.users.architect.id, fx.users.viewer)).status).toBe(404);
  });

  it("lets an owner step down when another owner remains", async () => {
    const second = await createFixtureUser("team-removal-second-owner");
    await getDb().insert(memberships).values({ projectId: fx.projectId, userId: second.id, role: "owner" });
    expect((await call(fx.users.owner.id, fx.users.owner)).status).toBe(204);
    expect(await membershipOf(fx.users.owner.id)).toBeUndefined();
    expect((await call(second.id, second)).status).toBe(409);
  });
});
