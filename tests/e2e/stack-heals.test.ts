// Issue 21 "Done when": under the real supervisor (scripts/stack/services.mjs, which `npm start` and the e2e stage
// both use, with restart and pid files), the web process and the realtime server are killed with SIGKILL; both serve
// again within 15 s, and what was written before is still there.
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, describe, expect, it } from "vitest";
import { users } from "@/db/schema";
import { COMBINATION_STANDARDS, DESIGN_STANDARDS } from "@/lib/projects/schemas";
import { appUrl } from "../support/browser";
import { closeDb, getDb } from "../support/db";
import { demoAccount } from "../support/demo";
import { sessionCookie } from "../support/session";

afterAll(closeDb);

const RESTART_BOUND_MS = 15_000;
const pidOf = (service: string) => Number(readFileSync(join(process.env.STRUTROOM_DATA_DIR!, "pids", `${service}.pid`), "utf8"));

async function status(url: string, init?: RequestInit): Promise<number> {
  try {
    return (await fetch(url, { ...init, signal: AbortSignal.timeout(2_000) })).status;
  } catch {
    return 0;
  }
}

/** Polls until `check` holds; fails after `ms` (a bound on waiting, not a measurement). */
async function until(check: () => Promise<boolean>, ms: number, what: string) {
  const deadline = Date.now() + ms;
  while (Date.now() < deadline) {
    if (await check()) return;
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error(`${what} within ${ms / 1000} s`);
}

describe("the stack heals under the supervisor", () => {
  it("web and realtime killed with SIGKILL serve again within 15 s, and a project written before is still listed", async () => {
    const [owner] = await getDb().select().from(users).where(eq(users.email, demoAccount("owner").email));
    const cookie = await sessionCookie({ id: owner.id, email: owner.email, name: owner.name, sessionVersion: owner.sessionVersion });
    const origin = new URL(appUrl("/")).origin;
    const name = `Kept across a crash ${Date.now().toString(36)}`;
    const created = await fetch(appUrl("/api/projects"), { method: "POST", headers: { cookie, origin, "content-type": "application/json" }, body: JSON.stringify({ name, designStandard: DESIGN_STANDARDS[0], combinationStandard: COMBINATION_STANDARDS[0] }) });
    expect(created.status).toBe(201);
    const realtimeHealth = `${process.env.REALTIME_URL}/health`;
    expect(await status(realtimeHealth)).toBe(200);

    const web = pidOf("web");
    const realtime = pidOf("realtime");
    process.kill(-web, "SIGKILL");
    process.kill(-realtime, "SIGKILL");
    await until(async () => (await status(appUrl("/api/health"))) === 0, 5_000, "the web process did not go down");

    await Promise.all([
      until(async () => pidOf("web") !== web && (await status(appUrl("/api/health"))) === 200, RESTART_BOUND_MS, "the web process did not serve again"),
      until(async () => pidOf("realtime") !== realtime && (await status(realtimeHealth)) === 200, RESTART_BOUND_MS, "the realtime server did not serve again"),
    ]);
    const listed = (await (await fetch(appUrl("/api/projects"), { headers: { cookie } })).json()) as { projects: { name: string }[] };
    expect(listed.projects.map((project) => project.name)).toContain(name);
  });
});
