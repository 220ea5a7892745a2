// Hole 1: taking over another project through captured mail. The owner of project B saw, on B's captured-mail page,
// project A's mails (with join links) as soon as someone invited to A was also invited to B, because the page
// picked mails by recipient. Captured mail must be the mail written for that project (each outbox row names it),
// and a join link must never create an account for an e-mail that already has one.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as invite } from "@/app/api/projects/[projectId]/invitations/route";
import { POST as accept } from "@/app/api/invitations/[token]/route";
import { memberships, users } from "@/db/schema";
import { listSentMessageIds } from "@/db/queries/mail-outbox";
import { capturedMailForProject, capturedMailPageEnabled } from "@/lib/mail/captured";
import { processOutbox } from "@/server/jobs/mail-outbox";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let a: ProjectFixture;
let b: ProjectFixture;

async function inviteTo(project: ProjectFixture, email: string): Promise<string> {
  const response = await invite(
    await buildRequest(`/api/projects/${project.projectId}/invitations`, { method: "POST", user: project.users.owner, body: { email, role: "architect" } }),
    routeContext({ projectId: project.projectId }),
  );
  expect(response.status).toBe(201);
  return (await response.json()).joinLink;
}

beforeAll(async () => {
  requireIntegrationEnv();
  [a, b] = await Promise.all([createProjectFixture("sec-mail-a"), createProjectFixture("sec-mail-b")]);
});
afterAll(closeDb);

describe("captured mail is scoped to its project", () => {
  it("shows B's owner only B's mail, never A's join link to the same person", async () => {
    const shared = `shared-${randomUUID().slice(0, 8)}@fixture.test`;
    const linkA = await inviteTo(a, shared);
    const linkB = await inviteTo(b, shared);
    // A's architect is also invited to B: A's mails to them must stay on A's page too.
    await inviteTo(b, a.users.architect.email);
    for (let sent = 1; sent > 0; ) sent = (await processOutbox({ limit: 50 })).sent;

    const onB = await capturedMailForProject({ messageIds: await listSentMessageIds({ projectId: b.projectId }) });
    const textB = onB.map((mail) => mail.text).join("\n");
    expect(textB).toContain(linkB);
    expect(textB).not.toContain(linkA);
    expect(onB.every((mail) => !mail.subject.includes(a.projectId))).toBe(true);
    const onA = await capturedMailForProject({ messageIds: await listSentMessageIds({ projectId: a.projectId }) });
    expect(onA.map((mail) => mail.text).join("\n")).toContain(linkA);
    expect(onA.map((mail) => mail.text).join("\n")).not.toContain(linkB);
  });

  it("is only on where the SMTP server is the local capturing fake", () => {
    const saved = { NODE_ENV: process.env.NODE_ENV, MAIL_CAPTURE_LOCAL: process.env.MAIL_CAPTURE_LOCAL };
    try {
      process.env.MAIL_CAPTURE_LOCAL = "";
      for (const mode of ["development", "test", "production"]) {
        (process.env as Record<string, string>).NODE_ENV = mode;
        expect(capturedMailPageEnabled(), mode).toBe(false);
      }
      process.env.MAIL_CAPTURE_LOCAL = "1";
      expect(capturedMailPageEnabled()).toBe(true);
    } finally {
      Object.assign(process.env, saved);
    }
  });
});

describe("a join link never takes over an existing account", () => {
  it("refuses to create an account for an e-mail that has one, and changes nothing", async () => {
    const target = b.users.outsider;
    const link = await inviteTo(a, target.email);
    const token = new URL(link).pathname.split("/").pop()!;
    const [before] = await getDb().select().from(users).where(eq(users.id, target.id));
    const response = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: { name: "Attacker", password: "a-brand-new-password-9" } }), routeContext({ token }));
    expect(response.status).toBe(401);
    const [after] = await getDb().select().from(users).where(eq(users.id, target.id));
    expect(after.passwordHash).toBe(before.passwordHash);
    expect(after.name).toBe(before.name);
    expect(await getDb().select().from(memberships).where(eq(memberships.userId, target.id))).toHaveLength(0);
    // Signed in as someone else, the link does not work either.
    const other = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: {}, user: b.users.viewer }), routeContext({ token }));
    expect(other.status).toBe(403);
    // Signed in as the invited person, it does.
    const own = await accept(await buildRequest(`/api/invitations/${token}`, { method: "POST", body: {}, user: target }), routeContext({ token }));
    expect(own.status).toBe(201);
  });
});
