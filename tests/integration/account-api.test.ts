import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET, PATCH } from "@/app/api/account/route";
import { POST as changePassword } from "@/app/api/account/password/route";
import { verifyCredentials } from "@/db/queries/users";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { FIXTURE_PASSWORD, createFixtureUser, type FixtureUser } from "../support/fixtures";
import { buildRequest } from "../support/session";

let user: FixtureUser;

beforeAll(async () => {
  requireIntegrationEnv();
  user = await createFixtureUser("account-api");
});
afterAll(closeDb);

describe("/api/account", () => {
  it("answers 401 without a session", async () => {
    expect((await GET(await buildRequest("/api/account"), undefined)).status).toBe(401);
    expect((await PATCH(await buildRequest("/api/account", { method: "PATCH", body: { name: "X" } }), undefined)).status).toBe(401);
    expect((await changePassword(await buildRequest("/api/account/password", { method: "POST", body: {} }), undefined)).status).toBe(401);
  });

  it("shows the account without its password hash", async () => {
    const response = await GET(await buildRequest("/api/account", { user }), undefined);
    expect(await response.json()).toEqual({ user: { id: user.id, email: user.email, name: user.name } });
  });

  it("renames, refusing an empty name with an issue", async () => {
    const bad = await PATCH(await buildRequest("/api/account", { method: "PATCH", body: { name: "   " }, user }), undefined);
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues).toEqual([{ path: "name", message: "Enter your name." }]);
    const ok = await PATCH(await buildRequest("/api/account", { method: "PATCH", body: { name: "Renamed Person" }, user }), undefined);
    expect((await ok.json()).user.name).toBe("Renamed Person");
  });

  it("refuses a wrong current password and keeps the old one", async () => {
    const response = await changePassword(await buildRequest("/api/account/password", { method: "POST", body: { currentPassword: "wrong-password", newPassword: "another-long-one" }, user }), undefined);
    expect(response.status).toBe(400);
    expect((await response.json()).issues).toEqual([{ path: "currentPassword", message: expect.any(String) }]);
    expect(await verifyCredentials({ email: user.email, password: FIXTURE_PASSWORD })).not.toBeNull();
  });

  it("refuses a too-short new password", async () => {
    const response = await changePassword(await buildRequest("/api/account/password", { method: "POST", body: { currentPassword: FIXTURE_PASSWORD, newPassword: "short" }, user }), undefined);
    expect(response.status).toBe(400);
    expect((await response.json()).issues[0].path).toBe("newPassword");
  });

  it("changes the password; only the new one signs in afterwards", async () => {
    const response = await changePassword(await buildRequest("/api/account/password", { method: "POST", body: { currentPassword: FIXTURE_PASSWORD, newPassword: "a-brand-new-password" }, user }), undefined);
    expect(response.status).toBe(200);
    expect(await verifyCredentials({ email: user.email, password: FIXTURE_PASSWORD })).toBeNull();
    expect(await verifyCredentials({ email: user.email.toUpperCase(), password: "a-brand-new-password" })).toEqual({ id: user.id, email: user.email, name: "Renamed Person", sessionVersion: 1 });
  });
});
