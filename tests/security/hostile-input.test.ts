// Issue 21: hostile input against every route handler, generated from the files under app/api and each handler's
// declared inputs (lib/http/route.ts keeps them on the handler), so a new route is covered without a new test.
// Every reply must be a 4xx with an `{ error }` message; nothing may be written; another user is answered meanwhile.
import { randomUUID } from "node:crypto";
import { readdirSync } from "node:fs";
import { join, relative } from "node:path";
import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { attachments, clashes, comments, invitations, jobs, mepRuns, modelRevisions, notifications, pins } from "@/db/schema";
import { triangleModel } from "@/tests/support/fixtures/analysis-models";
import type { RouteInputs } from "@/lib/http/route";
import { database, requestBytes } from "@/lib/limits";
import { ROLES } from "@/lib/permissions";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { sessionCookie } from "../support/session";

const API = join(process.cwd(), "app/api");
const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
// next-auth's own catch-all route is the sign-in machinery; every other route is built with a wrapper.
const EXEMPT = new Set(["auth/[...nextauth]/route.ts"]);

type Handler = ((request: Request, context: { params: Promise<Record<string, string>> }) => Promise<Response>) & { inputs?: RouteInputs };
type Route = { file: string; url: string; segments: string[]; method: string; handler: Handler };

function routeFiles(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const path = join(dir, entry.name);
    if (entry.isDirectory()) return routeFiles(path);
    return entry.name === "route.ts" ? [path] : [];
  });
}

async function loadRoutes(): Promise<Route[]> {
  const routes: Route[] = [];
  for (const path of routeFiles(API)) {
    const file = relative(API, path);
    if (EXEMPT.has(file)) continue;
    const exported = (await import(path)) as Record<string, Handler | undefined>;
    const url = `/api/${file.replace(/\/?route\.ts$/, "")}`;
    const segments = [...url.matchAll(/\[([^\]]+)\]/g)].map((m) => m[1]);
    for (const method of METHODS) {
      const handler = exported[method];
      if (handler) routes.push({ file, url, segments, method, handler });
    }
  }
  return routes;
}

// ---- hostile values ----

const MEGABYTE_ID = "x".repeat(1024 * 1024);
/** Values for a dynamic segment other than the project: out of range, huge, unstorable, prototype names, unknown. */
const hostileParams = ["99999999999", "-1", MEGABYTE_ID, "a\u0000b", "\ud800", "__proto__", "constructor", randomUUID()];
/** Bodies every JSON schema must refuse, whatever its fields. */
const hostileBodies: { name: string; raw: string }[] = [
  { name: "not JSON", raw: "{ not json" },
  { name: "empty", raw: "" },
  { name: "an array", raw: "[]" },
  { name: "null", raw: "null" },
  { name: "a huge number", raw: "1e308" },
  { name: "deep nesting", raw: "[".repeat(20_000) + "]".repeat(20_000) },
  { name: "a null character", raw: JSON.stringify({ name: "a\u0000b", revision: 1, kind: "generate", body: "x\u0000" }) },
  { name: "a lone surrogate", raw: '{"name": "roof \\ud800", "title": "\\udc00", "revision": 1}' },
  { name: "a __proto__ key", raw: '{"__proto__": {"isAdmin": true}, "revision": 1}' },
];
const hostileQueries = ["revision=99999999999", "revision=-5", "revision=abc", "result=__proto__", "result=constructor", `revision=1&result=${"r".repeat(5000)}`, "commentId=a%00b", "revision=%00"];

/** A stream of `bytes` zero bytes, made as it is read (the cap must stop reading, not buffer it all). */
function zeroStream(bytes: number): ReadableStream<Uint8Array> {
  const chunk = new Uint8Array(1024 * 1024);
  let sent = 0;
  return new ReadableStream({
    pull(controller) {
      if (sent >= bytes) return controller.close();
      const size = Math.min(chunk.byteLength, bytes - sent);
      sent += size;
      controller.enqueue(chunk.subarray(0, size));
    },
  });
}

let fx: ProjectFixture;
/** Another project, with one row of each kind a route names in its path: its ids must never reach `fx`'s rows. */
let other: ProjectFixture;
const foreignIds: Record<string, string> = {};
let routes: Route[];
const cookies = new Map<string, string>();

async function call(route: Route, options: { user?: FixtureUser; params?: Record<string, string>; query?: string; body?: string | ReadableStream<Uint8Array> }) {
  const params: Record<string, string> = {};
  for (const name of route.segments) params[name] = options.params?.[name] ?? (name === "projectId" ? fx.projectId : randomUUID());
  // The handler reads params from the context; the URL only needs to be well formed.
  const path = route.url.replace(/\[([^\]]+)\]/g, (_, name: string) => (params[name].isWellFormed() ? encodeURIComponent(params[name]).slice(0, 200) : "x"));
  const headers = new Headers({ "content-type": "application/json", origin: "http://127.0.0.1" });
  if (options.user) headers.set("cookie", cookies.get(options.user.id)!);
  const init: RequestInit & { duplex?: "half" } = { method: route.method, headers };
  if (options.body !== undefined && route.method !== "GET") {
    init.body = options.body;
    if (typeof options.body !== "string") init.duplex = "half";
  }
  const request = new Request(new URL(`${path}${options.query ? `?${options.query}` : ""}`, "http://127.0.0.1"), init);
  return route.handler(request, { params: Promise.resolve(params) });
}

/** Asserts a refusal: a 4xx whose JSON body says what is wrong. */
async function expectRefusal(response: Response, what: string) {
  expect(response.status, what).toBeGreaterThanOrEqual(400);
  expect(response.status, what).toBeLessThan(500);
  const body = (await response.json().catch(() => null)) as { error?: unknown } | null;
  expect(typeof body?.error === "string" && body.error.length > 0, `${what}: the reply names the problem`).toBe(true);
  return response.status;
}

/** One row of each kind in the other project, by the name of the path segment that takes its id. */
async function makeForeignRows() {
  const db = getDb();
  const author = other.users.structural_engineer.id;
  const [revision] = await db.insert(modelRevisions).values({ projectId: other.projectId, number: 1, name: "Other roof", model: triangleModel(), source: "uploaded", createdBy: author }).returning();
  const pinId = randomUUID();
  await db.insert(pins).values({ id: pinId, projectId: other.projectId, anchorKind: "point", anchorX: 0, anchorY: 0, anchorZ: 0, title: "Other pin", discipline: "structural", authorId: author });
  const commentId = randomUUID();
  await db.insert(comments).values({ id: commentId, pinId, authorId: author, body: "Other comment" });
  const [attachment] = await db
    .insert(attachments)
    .values({ projectId: other.projectId, purpose: "comment", objectKey: `foreign/${randomUUID()}`, filename: "note.txt", contentType: "text/plain", sizeBytes: 4, uploadedBy: author, commentId, state: "ready" })
    .returning();
  const [job] = await db.insert(jobs).values({ projectId: other.projectId, kind: "analysis", revisionId: revision.id }).returning();
  const [invitation] = await db
    .insert(invitations)
    .values({ projectId: other.projectId, email: `invitee-${randomUUID().slice(0, 8)}@fixture.test`, role: "viewer", tokenHash: randomUUID(), invitedBy: other.users.owner.id, expiresAt: new Date(Date.now() + 86_400_000) })
    .returning();
  // A run and a clash on the other project's revision, and a notification of its member: ids the routes must not
  // reach through this project (the run's tag is unique to it, so only its project could find it).
  await db.insert(mepRuns).values({ revisionId: revision.id, runId: "FOREIGN-RUN-1", system: "supply air", profile: { shape: "round", diameter: 0.4 }, insulation: 0, clearance: 0.05, weightPerMetre: 0.3, points: [{ x: 0, y: 0, z: 1 }, { x: 4, y: 0, z: 1 }], createdBy: author });
  const [clash] = await db
    .insert(clashes)
    .values({ projectId: other.projectId, revisionId: revision.id, clashKey: "foreign", memberId: "AB", runId: "FOREIGN-RUN-1", segmentIndex: 0, kind: "hard", gap: -0.01, depth: 0.01, requiredClearance: 0.05, pointX: 0, pointY: 0, pointZ: 1 })
    .returning();
  const [notification] = await db
    .insert(notifications)
    .values({ userId: author, kind: "mention", payload: { projectId: other.projectId, pinId, commentId, byName: "Other", excerpt: "Other comment" } })
    .returning();
  Object.assign(foreignIds, { pinId, commentId, attachmentId: attachment.id, jobId: job.id, invitationId: invitation.id, userId: author, runId: "FOREIGN-RUN-1", clashId: clash.id, notificationId: notification.id });
}

/** Rows in every table of the app's schema, summed: a refused request must not change it. */
async function rowCount(): Promise<number> {
  const tables = await getDb().execute<{ table_name: string }>(
    sql`select table_name from information_schema.tables where table_schema = 'public' and table_type = 'BASE TABLE' and table_name not like '%drizzle%'`,
  );
  let total = 0;
  for (const { table_name } of tables.rows) {
    const result = await getDb().execute<{ n: string }>(sql`select count(*)::text as n from ${sql.identifier(table_name)}`);
    total += Number(result.rows[0].n);
  }
  return total;
}

/** Runs `hostile` while another signed-in person keeps listing their projects; every one of their requests succeeds. */
async function whileAnotherUserWorks(hostile: () => Promise<void>) {
  const projects = routes.find((r) => r.url === "/api/projects" && r.method === "GET")!;
  let done = false;
  const answered: number[] = [];
  const other = (async () => {
    while (!done) answered.push((await call(projects, { user: fx.users.viewer })).status);
  })();
  try {
    await hostile();
  } finally {
    done = true;
    await other;
  }
  expect(answered.length).toBeGreaterThan(0);
  expect(answered.every((status) => status === 200)).toBe(true);
}

beforeAll(async () => {
  requireIntegrationEnv();
  [fx, other] = await Promise.all([createProjectFixture("hostile"), createProjectFixture("hostile-other")]);
  await makeForeignRows();
  for (const user of Object.values(fx.users)) cookies.set(user.id, await sessionCookie(user));
  routes = await loadRoutes();
});
afterAll(closeDb);

describe("hostile input on every route handler (generated from app/api)", () => {
  it("finds the routes and their declared inputs", () => {
    expect(routes.length).toBeGreaterThan(20);
    expect(routes.filter((r) => r.handler.inputs?.body).length).toBeGreaterThan(5);
    expect(routes.every((r) => r.handler.inputs), "every handler is built with a lib/http/route.ts wrapper").toBe(true);
  });

  it("hostile path parameters: a 4xx with a message on every route, nothing written", async () => {
    const before = await rowCount();
    await whileAnotherUserWorks(async () => {
      for (const route of routes) {
        for (const name of route.segments) {
          const values = name === "projectId" ? ["99999999999", MEGABYTE_ID, "a\u0000b", "__proto__", randomUUID()] : hostileParams;
          for (const value of values) {
            await expectRefusal(await call(route, { user: fx.users.owner, params: { [name]: value } }), `${route.method} ${route.url} with ${name}=${value.slice(0, 20)}`);
          }
        }
      }
    });
    expect(await rowCount()).toBe(before);
  });

  it("another project's ids in the path: a 4xx with a message on every route that takes one, nothing written or changed", async () => {
    const before = await rowCount();
    const pinBefore = await getDb().select().from(pins).where(eq(pins.id, foreignIds.pinId));
    const covered = new Set<string>();
    await whileAnotherUserWorks(async () => {
      for (const route of routes) {
        for (const name of route.segments.filter((segment) => foreignIds[segment])) {
          covered.add(name);
          await expectRefusal(await call(route, { user: fx.users.owner, params: { [name]: foreignIds[name] } }), `${route.method} ${route.url} with the other project's ${name}`);
        }
      }
    });
    // each kind of id in the path met at least one route (a renamed segment would silently skip its kind)
    expect([...covered].sort()).toEqual(["attachmentId", "clashId", "invitationId", "jobId", "notificationId", "pinId", "runId", "userId"]);
    expect(await rowCount()).toBe(before);
    expect(await getDb().select().from(pins).where(eq(pins.id, foreignIds.pinId))).toEqual(pinBefore);
    expect(await getDb().select().from(notifications).where(eq(notifications.id, foreignIds.notificationId))).toMatchObject([{ readAt: null }]);
    expect(await getDb().select().from(clashes).where(eq(clashes.id, foreignIds.clashId))).toMatchObject([{ outcome: null, assigneeId: null }]);
  });

  it("another project's comment in a query finds nothing of it", async () => {
    for (const route of routes.filter((r) => r.handler.inputs?.query && r.method === "GET")) {
      const response = await call(route, { user: fx.users.owner, query: `commentId=${foreignIds.commentId}` });
      expect(response.status, `${route.url}?commentId=`).toBeLessThan(500);
      expect(await response.text(), `${route.url} shows nothing of the other project's comment`).not.toContain("note.txt");
    }
  });

  // Routes × roles × bodies is several hundred calls: 60 s was not enough at load average 27 (a bound, not a measurement).
  it("hostile bodies: every role gets a 4xx with a message, the body is read by at least one, nothing written", async () => {
    const before = await rowCount();
    await whileAnotherUserWorks(async () => {
      for (const route of routes.filter((r) => r.handler.inputs?.body)) {
        const statuses = new Set<number>();
        for (const role of ROLES) {
          for (const { name, raw } of hostileBodies) {
            statuses.add(await expectRefusal(await call(route, { user: fx.users[role], body: raw }), `${route.method} ${route.url} as ${role} with ${name}`));
          }
        }
        // 403 alone would mean no role reached the body: the route's schema was never tried
        expect([...statuses].some((s) => s === 400 || s === 413), `${route.method} ${route.url} parsed a body`).toBe(true);
      }
    });
    expect(await rowCount()).toBe(before);
  }, 240_000);

  it("bodies over the route's cap are a 413 that says the limit, read no further than the cap", async () => {
    const before = await rowCount();
    for (const route of routes.filter((r) => r.handler.inputs?.body)) {
      const cap = route.handler.inputs?.bodyBytes ?? requestBytes.json;
      for (const role of ROLES) {
        const response = await call(route, { user: fx.users[role], body: zeroStream(cap + 1) });
        const status = await expectRefusal(response, `${route.method} ${route.url} as ${role} with ${cap + 1} bytes`);
        expect([403, 413]).toContain(status);
      }
    }
    expect(await rowCount()).toBe(before);
  });

  it("hostile query strings: a 4xx with a message wherever a query is read, nothing written", async () => {
    const before = await rowCount();
    await whileAnotherUserWorks(async () => {
      for (const route of routes.filter((r) => r.handler.inputs?.query)) {
        for (const query of hostileQueries) {
          const response = await call(route, { user: fx.users.owner, query });
          expect(response.status, `${route.method} ${route.url}?${query}`).toBeLessThan(500);
          if (response.status >= 400) await expectRefusal(response, `${route.method} ${route.url}?${query}`);
        }
      }
    });
    expect(await rowCount()).toBe(before);
  });
});

describe("the database refuses to wait", () => {
  it("app connections carry a statement timeout and an idle-in-transaction timeout (lib/limits.ts)", async () => {
    const show = async (name: string) => (await getDb().execute<Record<string, string>>(sql.raw(`show ${name}`))).rows[0][name];
    // PostgreSQL reports milliseconds in its own units: 30000 ms is "30s" (PostgreSQL manual, "Setting Parameters").
    expect(await show("statement_timeout")).toBe(`${database.statementTimeoutMs / 1000}s`);
    expect(await show("idle_in_transaction_session_timeout")).toBe(`${database.idleInTransactionTimeoutMs / 1000}s`);
  });
});
