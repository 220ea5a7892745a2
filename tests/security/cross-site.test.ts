// Hole 7: a cross-origin POST carrying the session cookie created an invitation (cross-site request forgery). Every
// state-changing route handler must refuse a request whose Origin is another site, or whose Sec-Fetch-Site says
// cross-site (Fetch Metadata, W3C), before doing anything; the socket.io and Yjs handshakes likewise.
import { readdirSync, statSync } from "node:fs";
import path from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import WebSocket from "ws";
import { POST as invite } from "@/app/api/projects/[projectId]/invitations/route";
import { invitations } from "@/db/schema";
import { YJS_PATH_PREFIX } from "@/lib/realtime/events";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { connectClient, realtimeClient, startRealtimeServer, type RealtimeProcess } from "../support/realtime";
import { routeContext, sessionCookie } from "../support/session";

const EVIL = "http://evil.test";
const run = Date.now().toString(36);
const mail = (label: string) => `${label}-${run}@fixture.test`;
let fx: ProjectFixture;
let realtime: RealtimeProcess;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("sec-cross-site");
  realtime = await startRealtimeServer();
});
afterAll(async () => {
  await realtime?.stop();
  await closeDb();
});

async function invitation(email: string, headers: Record<string, string>) {
  const request = new Request(`http://127.0.0.1/api/projects/${fx.projectId}/invitations`, {
    method: "POST",
    headers: { cookie: await sessionCookie(fx.users.owner), "content-type": "application/json", ...headers },
    body: JSON.stringify({ email, role: "architect" }),
  });
  return invite(request, routeContext({ projectId: fx.projectId }));
}

async function invited(email: string) {
  return (await getDb().select().from(invitations).where(eq(invitations.email, email))).length;
}

describe("cross-site requests to route handlers", () => {
  it("refuses an invitation posted from another site with the owner's cookie, and stores nothing", async () => {
    const response = await invitation(mail("csrf-1"), { origin: EVIL, "sec-fetch-site": "cross-site" });
    expect(response.status).toBe(403);
    expect(await invited(mail("csrf-1"))).toBe(0);
  });

  it("refuses by Origin alone and by Sec-Fetch-Site alone", async () => {
    expect((await invitation(mail("csrf-2"), { origin: EVIL })).status).toBe(403);
    expect((await invitation(mail("csrf-3"), { "sec-fetch-site": "cross-site" })).status).toBe(403);
    expect((await invitation(mail("csrf-4"), { "sec-fetch-site": "same-site" })).status).toBe(403);
    expect((await invitation(mail("csrf-5"), { origin: "null" })).status).toBe(403);
    expect(await invited(mail("csrf-2"))).toBe(0);
  });

  it("accepts the same request from the app's own pages", async () => {
    const response = await invitation(mail("csrf-ok"), { origin: new URL(process.env.APP_URL!).origin, "sec-fetch-site": "same-origin" });
    expect(response.status).toBe(201);
  });

  // Every state-changing handler under app/api, found on disk so a new route cannot be forgotten. next-auth's own
  // route is left to next-auth (its sign-in and sign-out POSTs need its double-submit CSRF token).
  const routeFiles = (function walk(dir: string): string[] {
    return readdirSync(dir).flatMap((name) => {
      const full = path.join(dir, name);
      if (statSync(full).isDirectory()) return walk(full);
      return name === "route.ts" ? [full] : [];
    });
  })(path.resolve("app/api")).filter((file) => !file.includes(`${path.sep}auth${path.sep}`));

  it.each(routeFiles.map((file) => [path.relative("app/api", file)]))("%s refuses cross-site writes before anything else", async (file) => {
    const handlers = (await import(path.resolve("app/api", file))) as Record<string, (request: Request, context: unknown) => Promise<Response>>;
    const writes = ["POST", "PUT", "PATCH", "DELETE"].filter((method) => typeof handlers[method] === "function");
    for (const method of writes) {
      // Signed out and with made-up params: a 403 (not a 401 or 404) shows the origin is checked first.
      const request = new Request("http://127.0.0.1/api/x", { method, headers: { origin: EVIL, "content-type": "application/json" }, body: "{}" });
      const context = { params: Promise.resolve(new Proxy({}, { get: () => "00000000-0000-4000-8000-000000000000" })) };
      const response = await handlers[method](request, context);
      expect(response.status, `${method} ${file}`).toBe(403);
    }
  });
});

describe("cross-site handshakes to the realtime server", () => {
  it("refuses a socket.io connection from another site", async () => {
    const socket = await realtimeClient(realtime.url, fx.projectId, fx.users.owner, { origin: EVIL });
    await expect(connectClient(socket)).rejects.toThrow();
    socket.disconnect();
  });

  it("refuses a Yjs connection from another site", async () => {
    const url = `${realtime.url.replace(/^http/, "ws")}${YJS_PATH_PREFIX}${fx.projectId}`;
    const ws = new WebSocket(url, { headers: { cookie: await sessionCookie(fx.users.owner), origin: EVIL } });
    const status = await new Promise<number>((resolve) => {
      ws.once("unexpected-response", (_request, response) => resolve(response.statusCode ?? 0));
      ws.once("open", () => resolve(101));
    });
    expect(status).toBe(403);
    // Terminating a refused handshake emits "closed before the connection was established"; that is expected here.
    ws.on("error", () => {});
    ws.terminate();
  });
});
