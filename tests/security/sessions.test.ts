// Hole 6: sessions were not revocable. A session cookie kept working after the password was changed elsewhere and
// after signing out. Each user has a session version; every request (route handlers, pages, the realtime
// handshake) refuses a session issued under an older one. A password change and "sign out everywhere else" end
// every other session and hand the current device a fresh one; signing out ends them all.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as account } from "@/app/api/account/route";
import { POST as changePassword } from "@/app/api/account/password/route";
import { DELETE as signOutEverywhereElse } from "@/app/api/account/sessions/route";
import { authOptions } from "@/lib/auth/options";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createFixtureUser, createProjectFixture, FIXTURE_PASSWORD, type FixtureUser } from "../support/fixtures";
import { buildRequest, sessionCookie } from "../support/session";
import { connectClient, realtimeClient, startRealtimeServer, type RealtimeProcess } from "../support/realtime";

const NEW_PASSWORD = "Quartz-lantern-ridge-2931";
let realtime: RealtimeProcess;

beforeAll(async () => {
  requireIntegrationEnv();
  realtime = await startRealtimeServer();
});
afterAll(async () => {
  await realtime?.stop();
  await closeDb();
});

/** GET /api/account with a raw Cookie header. */
async function accountWith(cookie: string): Promise<number> {
  return (await account(new Request("http://127.0.0.1/api/account", { headers: { cookie } }), undefined)).status;
}

/** The session cookie (name=value) a response sets, if any. */
function freshCookie(response: Response): string {
  const header = response.headers.getSetCookie().find((cookie) => /session-token=/.test(cookie));
  expect(header, "the response hands the current device a fresh session").toBeDefined();
  return header!.split(";")[0];
}

describe("sessions are revocable", () => {
  let user: FixtureUser;
  beforeAll(async () => {
    user = await createFixtureUser("sec-sessions");
  });

  it("a password change ends the session on another device and keeps this one", async () => {
    const elsewhere = await sessionCookie(user);
    expect(await accountWith(elsewhere)).toBe(200);
    const response = await changePassword(await buildRequest("/api/account/password", { method: "POST", user, body: { currentPassword: FIXTURE_PASSWORD, newPassword: NEW_PASSWORD } }), undefined);
    expect(response.status).toBe(200);
    expect(await accountWith(elsewhere)).toBe(401);
    expect(await accountWith(freshCookie(response))).toBe(200);
  });

  it("sign out everywhere else ends every other session", async () => {
    const first = await accountWith(await sessionCookie(user)); // older version: already ended above
    expect(first).toBe(401);
    const other = await createFixtureUser("sec-sessions-2");
    const phone = await sessionCookie(other);
    const laptop = await sessionCookie(other);
    const response = await signOutEverywhereElse(new Request("http://127.0.0.1/api/account/sessions", { method: "DELETE", headers: { cookie: laptop } }), undefined);
    expect(response.status).toBe(200);
    expect(await accountWith(phone)).toBe(401);
    expect(await accountWith(laptop)).toBe(401);
    expect(await accountWith(freshCookie(response))).toBe(200);
  });

  it("signing out ends the session: the captured cookie no longer works", async () => {
    const other = await createFixtureUser("sec-sessions-3");
    const cookie = await sessionCookie(other);
    expect(await accountWith(cookie)).toBe(200);
    const token = { sub: other.id, userId: other.id, email: other.email, name: other.name, sessionVersion: 0 };
    await authOptions.events!.signOut!({ token, session: null as never });
    expect(await accountWith(cookie)).toBe(401);
  });

  it("the realtime server refuses an ended session at the handshake", async () => {
    const project = await createProjectFixture("sec-sessions-rt");
    const member = project.users.architect;
    const before = await realtimeClient(realtime.url, project.projectId, member);
    await connectClient(before);
    before.disconnect();
    const ended = await realtimeClient(realtime.url, project.projectId, member);
    await signOutEverywhereElse(await buildRequest("/api/account/sessions", { method: "DELETE", user: member }), undefined);
    await expect(connectClient(ended)).rejects.toThrow();
    ended.disconnect();
  });
});
