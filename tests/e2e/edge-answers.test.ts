// Issue 21 item 7 over HTTP against the built app served as `npm start` serves it (server/web/main.ts): the answers
// Next.js and Node give on their own — 405 for a method a route file does not export, 404 for an unknown API
// address, 431 for headers over the limit, refusals of server-action calls — carry the API's `{ error }` shape with
// what to do. Generated from the route files (tests/support/api-routes.ts) and Next's server-action manifest, so a new
// route or action is covered without a new test. Sign-in with a 100 kB e-mail says why it is refused.
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { request as httpRequest } from "node:http";
import { join } from "node:path";
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { users } from "@/db/schema";
import { headerBytes } from "@/lib/limits";
import { apiRoutes, HTTP_METHODS } from "../support/api-routes";
import { appUrl } from "../support/browser";
import { closeDb, getDb } from "../support/db";
import { demoAccount, demoProjectId } from "../support/demo";
import { sessionCookie } from "../support/session";

let projectId: string;
let viewerCookie: string;
beforeAll(async () => {
  projectId = await demoProjectId();
  const [viewer] = await getDb().select().from(users).where(eq(users.email, demoAccount("viewer").email));
  viewerCookie = await sessionCookie({ id: viewer.id, email: viewer.email, name: viewer.name, sessionVersion: viewer.sessionVersion });
});
afterAll(closeDb);

/** The route's address with each dynamic segment filled: the demo project, else a fresh uuid. */
function addressOf(url: string): string {
  return url.replace(/\[\.\.\.[^\]]+\]/g, "session").replace(/\[([^\]]+)\]/g, (_, name: string) => (name === "projectId" ? projectId : randomUUID()));
}

/** Asserts a JSON `{ error }` refusal with this status and returns the message. */
async function refusal(response: Response, status: number, what: string): Promise<string> {
  expect(response.status, what).toBe(status);
  expect(response.headers.get("content-type"), what).toMatch(/^application\/json/);
  const body = (await response.json()) as { error?: unknown };
  expect(typeof body.error === "string" && body.error.length > 0, `${what}: says what is wrong`).toBe(true);
  return body.error as string;
}

describe("405: a method a route does not take (generated from app/api)", () => {
  it("every route answers every method it does not export with a JSON 405 naming the method, and OPTIONS lists the ones it takes", async () => {
    const routes = apiRoutes();
    expect(routes.length).toBeGreaterThan(20);
    for (const route of routes) {
      expect(route.methods.size, `${route.file} exports at least one method`).toBeGreaterThan(0);
      const address = addressOf(route.url);
      for (const method of HTTP_METHODS.filter((m) => !route.methods.has(m))) {
        const message = await refusal(await fetch(appUrl(address), { method, headers: { origin: appUrl("/").replace(/\/$/, "") } }), 405, `${method} ${route.url}`);
        expect(message).toContain(`does not take ${method} requests`);
      }
      const allow = (await fetch(appUrl(address), { method: "OPTIONS" })).headers.get("allow") ?? "";
      for (const method of route.methods) expect(allow.split(", "), `OPTIONS ${route.url}`).toContain(method);
    }
  });
});

describe("404: an API address that does not exist", () => {
  it.each(["/api/nowhere", `/api/projects/${randomUUID()}/nothing-here`, `/api/${"x".repeat(4000)}`])("%s is a JSON 404 saying to check the address", async (path) => {
    expect(await refusal(await fetch(appUrl(path)), 404, path)).toMatch(/^There is no API address .*check the address/);
  });
});

/** A raw request (fetch refuses to send some of what is tested here), answered as status, type and text. */
function raw(path: string, headers: Record<string, string>): Promise<{ status: number; type: string | undefined; body: string }> {
  return new Promise((resolve, reject) => {
    const request = httpRequest(appUrl(path), { headers }, (response) => {
      let body = "";
      response.on("data", (chunk: Buffer) => (body += chunk.toString()));
      response.on("end", () => resolve({ status: response.statusCode ?? 0, type: response.headers["content-type"], body }));
    });
    request.on("error", reject);
    request.end();
  });
}

describe("431: request headers over the limit", () => {
  it.each(["/api/health", "/sign-in"])("%s with a cookie over the limit gets a JSON 431 with the limit and what to do", async (path) => {
    const reply = await raw(path, { cookie: `big=${"c".repeat(headerBytes + 1)}` });
    expect(reply.status).toBe(431);
    expect(reply.type).toBe("application/json");
    expect(JSON.parse(reply.body).error).toMatch(/larger than 16 kB: remove some cookies/);
  });
});

/** Rows in every table of the app's schema, summed: a refused request must not change it. */
async function rowCount(): Promise<number> {
  const tables = await getDb().execute<{ table_name: string }>(
    sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' and table_name not like '%drizzle%' and table_name <> 'sign_in_limits'`,
  );
  let total = 0;
  for (const { table_name } of tables.rows) total += Number((await getDb().execute<{ n: string }>(sql`select count(*)::text as n from ${sql.identifier(table_name)}`)).rows[0].n);
  return total;
}

describe("server actions: hostile calls (generated from Next's server-action manifest)", () => {
  const manifest = JSON.parse(readFileSync(join(process.cwd(), ".next/server/server-reference-manifest.json"), "utf8")) as { node: Record<string, unknown> };
  // Every action the build has, plus ids that are none: one shaped like an action id, one not.
  const actionIds = [...Object.keys(manifest.node), "7f" + "0".repeat(40), "not-an-action"];
  const bodies: Record<string, string> = {
    "not JSON": "{ not json",
    "a __proto__ key": '[{"__proto__": {"admin": true}}]',
    "a null character": '["a\\u0000b"]',
    "a lone surrogate": '["\\ud800"]',
    "2 MB": `["${"x".repeat(2 * 1024 * 1024)}"]`,
  };

  it("each gets a JSON 4xx with a message, nothing is written, and another person is answered meanwhile", async () => {
    const before = await rowCount();
    let done = false;
    const answered: number[] = [];
    const other = (async () => {
      while (!done) answered.push((await fetch(appUrl("/api/projects"), { headers: { cookie: viewerCookie } })).status);
    })();
    try {
      for (const page of ["/", "/sign-in", `/projects/${projectId}`]) {
        for (const id of actionIds) {
          for (const [name, body] of Object.entries(bodies)) {
            const response = await fetch(appUrl(page), {
              method: "POST",
              headers: { "next-action": id, "content-type": "text/plain;charset=UTF-8", origin: appUrl("/").replace(/\/$/, ""), cookie: viewerCookie },
              body,
            });
            const what = `action ${id.slice(0, 12)} on ${page} with ${name}`;
            expect(response.status, what).toBeGreaterThanOrEqual(400);
            expect(response.status, what).toBeLessThan(500);
            await refusal(response, response.status, what);
          }
        }
      }
    } finally {
      done = true;
      await other;
    }
    expect(answered.length).toBeGreaterThan(0);
    expect(answered.every((status) => status === 200)).toBe(true);
    expect(await rowCount()).toBe(before);
  });
});

describe("sign-in with a hostile e-mail", () => {
  it("a 100 kB e-mail is refused with the reason, over HTTP", async () => {
    const csrf = await fetch(appUrl("/api/auth/csrf"));
    const { csrfToken } = (await csrf.json()) as { csrfToken: string };
    const cookie = csrf.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    const response = await fetch(appUrl("/api/auth/callback/credentials"), {
      method: "POST",
      redirect: "manual",
      headers: { "content-type": "application/x-www-form-urlencoded", cookie, "x-auth-return-redirect": "1" },
      body: new URLSearchParams({ email: `${"a".repeat(100_000)}@example.test`, password: "whatever-1", csrfToken, json: "true" }),
    });
    // next-auth answers a refused sign-in with the address of its error page, the reason in `error`.
    const { url } = (await response.json()) as { url: string };
    expect(new URL(url).searchParams.get("error")).toBe("Sign-in refused: That e-mail address is too long (at most 254 characters).");
  });
});
