/**
 * Big roofs through the app (issue 13 benchmarks): `npm run bench:bigroofs [-- --grids 60,120]`. Not a test: it
 * prints a table. The stack is started as the tests start it: a throwaway PostgreSQL on a free port (migrated), the
 * built web app (`next start`; it runs `next build` first when there is no build) and a jobs process
 * (server/jobs/main.ts). For each square double-layer grid of N x N bays (3 m module, 2.5 m for 120 bays: the
 * generator's spans stop at 300 m; 60 bays is 28,800 members, 120 bays 115,200) the structural engineer generates the roof through the app (POST …/models), and the job analyses
 * and reviews it. Measured:
 *   - time to analysed: the POST until the job is done (the POST's own time, the wait in the queue, the analysis,
 *     review and storing phases from the job's phase changes, polled every 200 ms: resolution 0.2 s)
 *   - the jobs process's peak resident memory while the job runs (/proc/<pid>/status VmRSS, sampled every 200 ms)
 *   - p95 of another team member's simple requests (GET the project, one at a time) while the job runs
 *   - in headless Debian chromium (SwiftShader, no GPU), signed in as a viewer: navigation to the drawn roof
 *     (page.goto until the viewer's "viewer:colouring-drawn" mark), the API bytes fetched before the first drawn
 *     result, and the switch to a result already fetched until its colours are submitted (median / max)
 * Targets (issue 13): 120 x 120 accepted, analysed and reviewed by a job with peak memory < 1.5 GB; other users' p95
 * < 300 ms during the analysis; 60 x 60 first drawn result after < 3 MB, navigation < 2 s, switch < 50 / 100 ms;
 * the review within 3 x the analysis. A measurement that fails is printed as failed and the rest still runs.
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { encode } from "next-auth/jwt";
import { chromium, type Browser, type Page } from "playwright-core";
import { closeDb, getDb } from "@/db/client";
import { memberships, organizations, projects, users } from "@/db/schema";
import { freePort, waitForPort } from "../stack/ports.mjs";
import { ensureFreshBuild } from "./fresh-build";
import { timeResultSwitch } from "./result-switch";
import { removeCluster, startPostgres, stopPostgres } from "../stack/postgres.mjs";

const { values } = parseArgs({
  options: {
    grids: { type: "string", default: "60,120" },
    // `--navigation-only --grids 60 --runs 5`: no other user's requests during the job (the roof is still generated
    // and analysed through the app first), then several navigations, each in a fresh browser context.
    "navigation-only": { type: "boolean", default: false },
    runs: { type: "string", default: "1" },
    // Prints each navigation's waterfall: the page's own timing, scripts and API requests, marks and long tasks.
    breakdown: { type: "boolean", default: false },
    // Prints where the page's main thread spent its time until the mark (CDP Profiler, self time per function).
    profile: { type: "boolean", default: false },
  },
});
const grids = values.grids.split(",").map(Number);
const navigationRuns = Math.max(1, Number(values.runs));
const root = process.cwd();
const dataDir = path.join(root, ".data", `bench-bigroofs-${process.pid}`);
const secret = "bench-bigroofs-secret-not-for-production";
const rows: [string, string, string][] = [];
const children: ChildProcess[] = [];
const record = (what: string, value: string, target = "") => {
  rows.push([what, value, target]);
  console.log(`[bench] ${what}: ${value}`);
};
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const p95 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.95))];
const seconds = (ms: number) => `${(ms / 1000).toFixed(1)} s`;
/** How long one grid's job may take before the run gives up on it. */
const JOB_LIMIT_MS = 30 * 60_000;
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

type Person = { id: string; email: string; name: string };
const cookieOf = async (user: Person) => `next-auth.session-token=${await encode({ token: { sub: user.id, userId: user.id, email: user.email, name: user.name, sessionVersion: 0 }, secret })}`;

/** Resident memory of a process in bytes (Linux /proc), or null once it is gone. */
function residentBytes(pid: number): number | null {
  try {
    const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, "utf8"));
    return match ? Number(match[1]) * 1024 : null;
  } catch {
    return null;
  }
}

async function seed(): Promise<{ projectId: string; engineer: Person; viewer: Person }> {
  const db = getDb();
  const [org] = await db.insert(organizations).values({ name: "Bench organisation" }).returning();
  const [project] = await db.insert(projects).values({ organizationId: org.id, name: "Bench roofs" }).returning();
  const [engineer] = await db.insert(users).values({ email: "engineer@bench.test", name: "Bench engineer", passwordHash: "-" }).returning();
  const [viewer] = await db.insert(users).values({ email: "viewer@bench.test", name: "Bench viewer", passwordHash: "-" }).returning();
  await db.insert(memberships).values([
    { projectId: project.id, userId: engineer.id, role: "structural_engineer" },
    { projectId: project.id, userId: viewer.id, role: "viewer" },
  ]);
  await closeDb();
  return { projectId: project.id, engineer, viewer };
}

type Stack = { appUrl: string; jobsPid: number };

async function startStack(): Promise<Stack & { projectId: string; engineer: Person; viewer: Person }> {
  ensureFreshBuild(root);
  const ports = { web: await freePort(), postgres: await freePort(), jobs: await freePort() };
  const databaseUrl = await startPostgres({ dataDir, port: ports.postgres, throwaway: true });
  const appUrl = `http://127.0.0.1:${ports.web}`;
  const env = {
    ...process.env,
    NODE_ENV: "production" as const,
    DATABASE_URL: databaseUrl,
    NEXTAUTH_SECRET: secret,
    NEXTAUTH_URL: appUrl,
    APP_URL: appUrl,
    JOBS_PORT: String(ports.jobs),
    // No live server or mail here: the pages' sockets keep retrying and no mail is due in this run.
    REALTIME_URL: "http://127.0.0.1:9",
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: "9",
    MAIL_FROM: "Strutroom bench <no-reply@bench.test>",
  };
  process.env.DATABASE_URL = databaseUrl;
  execFileSync("node_modules/.bin/tsx", ["--conditions=react-server", "scripts/db-migrate.ts"], { env, stdio: "inherit" });
  const seeded = await seed();
  // Each in its own process group (detached) so the whole group stops at the end.
  const web = spawn("node_modules/.bin/next", ["start", "-H", "127.0.0.1", "-p", String(ports.web)], { env, stdio: "ignore", detached: true });
  // node itself (tsx as an import hook), so the pid read for memory is the jobs process's own.
  const jobs = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", "server/jobs/main.ts"], { env, stdio: ["ignore", "ignore", "inherit"], detached: true });
  children.push(web, jobs);
  await waitForPort(ports.web, "The web app", 180_000);
  await waitForPort(ports.jobs, "The jobs process", 180_000);
  return { appUrl, jobsPid: jobs.pid!, ...seeded };
}

type JobView = { state: string; phase: string; percent: number; error: string | null };

/** Generates the grid through the app and follows its job; returns the revision number. */
async function analyseThroughApp(stack: Stack & { projectId: string; engineer: Person; viewer: Person }, bays: number, measureOthers: boolean): Promise<number> {
  const engineer = await cookieOf(stack.engineer);
  const other = await cookieOf(stack.viewer);
  const api = `${stack.appUrl}/api/projects/${stack.projectId}`;
  // The generator takes spans up to 300 m (lib/limits.ts): past 100 bays the module shrinks so the grid keeps its bays.
  const spacing = Math.min(3, 300 / bays);
  const t0 = performance.now();
  const response = await fetch(`${api}/models`, {
    method: "POST",
    headers: { cookie: engineer, "content-type": "application/json", origin: stack.appUrl },
    body: JSON.stringify({ kind: "generate", params: { name: `Bench grid ${bays} x ${bays}`, spanX: bays * spacing, spanY: bays * spacing, module: spacing, depth: 2.5 } }),
  });
  if (response.status !== 202) throw new Error(`generating the ${bays} x ${bays} grid answered ${response.status}: ${await response.text()}`);
  const saved = (await response.json()) as { revision: { number: number }; job: { id: string } };
  const posted = performance.now() - t0;

  let done = false;
  const latencies: number[] = [];
  // Another team member keeps working: simple requests one after another while the job runs.
  const others = measureOthers
    ? (async () => {
        while (!done) {
          const t = performance.now();
          await (await fetch(api, { headers: { cookie: other } })).arrayBuffer();
          latencies.push(performance.now() - t);
          await sleep(100);
        }
      })()
    : Promise.resolve();
  let peak = residentBytes(stack.jobsPid) ?? 0;
  const phaseAt = new Map<string, number>();
  let job: JobView;
  for (;;) {
    const resident = residentBytes(stack.jobsPid);
    // A job whose process died, or that never ends, fails its rows instead of holding up the rest of the run.
    if (resident === null) {
      done = true;
      throw new Error(`the jobs process exited during the ${bays} x ${bays} job (its last words are above)`);
    }
    if (performance.now() - t0 > JOB_LIMIT_MS) {
      done = true;
      throw new Error(`the ${bays} x ${bays} job was not done after ${seconds(JOB_LIMIT_MS)}`);
    }
    peak = Math.max(peak, resident);
    job = ((await (await fetch(`${api}/jobs/${saved.job.id}`, { headers: { cookie: engineer } })).json()) as { job: JobView }).job;
    if (!phaseAt.has(job.phase)) phaseAt.set(job.phase, performance.now() - t0);
    if (job.state === "done" || job.state === "failed") break;
    await sleep(200);
  }
  done = true;
  await others;
  if (job.state === "failed") throw new Error(`the ${bays} x ${bays} job failed: ${job.error}`);
  const total = performance.now() - t0;
  const at = (phase: string) => phaseAt.get(phase);
  const label = `${bays} x ${bays}`;
  record(`${label}: POST answered (roof generated, job queued)`, seconds(posted));
  record(`${label}: time to analysed (POST → job done)`, seconds(total));
  const [analysis, review, storing] = [at("analysis"), at("review"), at("storing")];
  if (analysis !== undefined && review !== undefined && storing !== undefined) {
    record(`${label}: analysis / review phase`, `${seconds(review - analysis)} / ${seconds(storing - review)} (review ${((storing - review) / Math.max(1, review - analysis)).toFixed(2)} x analysis)`, "review ≤ 3 x analysis");
    record(`${label}: queued until analysing / storing`, `${seconds(analysis - posted)} / ${seconds(total - storing)}`);
  } else {
    record(`${label}: analysis / review phase`, `phases seen: ${[...phaseAt.keys()].join(", ")} (too quick for the 200 ms poll)`);
  }
  record(`${label}: jobs process peak memory`, `${(peak / 2 ** 30).toFixed(2)} GB`, bays >= 120 ? "< 1.5 GB" : "");
  if (measureOthers) record(`${label}: another user's GET project during the job, p95 / max (n)`, `${p95(latencies).toFixed(0)} / ${Math.max(...latencies).toFixed(0)} ms (${latencies.length})`, "p95 < 300 ms");
  return saved.revision.number;
}

type Waterfall = {
  navigation: { responseStart: number; responseEnd: number; domContentLoaded: number; load: number };
  resources: { name: string; kind: string; start: number; end: number; bytes: number }[];
  marks: { name: string; at: number }[];
  longTasks: { start: number; duration: number }[];
};

// Long tasks are only reported to an observer that exists when they happen: installed before the page's own scripts.
const OBSERVE_LONG_TASKS = `window.__benchLongTasks = [];
  new PerformanceObserver((list) => { for (const e of list.getEntries()) window.__benchLongTasks.push({ start: e.startTime, duration: e.duration }); }).observe({ type: "longtask", buffered: true });`;

/** The page's own timeline up to the first drawn colouring (ms since navigation start). */
const readWaterfall = (page: Page) =>
  page.evaluate(`(() => {
    const drawn = performance.getEntriesByName("viewer:colouring-drawn")[0].startTime;
    const nav = performance.getEntriesByType("navigation")[0];
    const short = (url) => { const parts = new URL(url).pathname.split("/"); return parts[1] === "api" ? ["api", ...parts.slice(4)].join("/") : parts.slice(-2).join("/"); };
    return {
      navigation: { responseStart: nav.responseStart, responseEnd: nav.responseEnd, domContentLoaded: nav.domContentLoadedEventEnd, load: nav.loadEventEnd },
      resources: performance.getEntriesByType("resource").filter((e) => e.startTime <= drawn)
        .map((e) => ({ name: short(e.name), kind: e.initiatorType, start: e.startTime, end: e.responseEnd, bytes: e.encodedBodySize })),
      marks: performance.getEntriesByType("mark").filter((e) => e.name.startsWith("viewer:")).map((e) => ({ name: e.name, at: e.startTime })),
      longTasks: window.__benchLongTasks.filter((t) => t.start <= drawn),
    };
  })()`) as Promise<Waterfall>;

function printWaterfall(label: string, run: number, w: Waterfall) {
  const ms = (x: number) => `${x.toFixed(0).padStart(5)} ms`;
  console.log(`\n[bench] ${label}, navigation ${run}: the page's timeline (ms since navigation start)`);
  console.log(`  document: first byte ${ms(w.navigation.responseStart)}, last byte ${ms(w.navigation.responseEnd)}, DOMContentLoaded ${ms(w.navigation.domContentLoaded)}, load ${ms(w.navigation.load)}`);
  for (const r of [...w.resources].sort((a, b) => a.start - b.start)) console.log(`  ${ms(r.start)} → ${ms(r.end)}  ${(r.bytes / 1e3).toFixed(0).padStart(6)} kB  ${r.kind.padEnd(6)} ${r.name}`);
  for (const m of w.marks) console.log(`  ${ms(m.at)}  mark ${m.name}`);
  const busy = w.longTasks.reduce((sum, t) => sum + t.duration, 0);
  console.log(`  long tasks (> 50 ms) before the mark: ${w.longTasks.length}, ${busy.toFixed(0)} ms: ${w.longTasks.map((t) => `${t.start.toFixed(0)}+${t.duration.toFixed(0)}`).join(", ")}`);
}

type CpuProfile = { nodes: { id: number; callFrame: { functionName: string; url: string; lineNumber: number; columnNumber: number } }[]; samples?: number[]; timeDeltas?: number[] };

/** Self time per function (name, script and position: the build is minified, so the position finds it). */
function printProfile(label: string, run: number, profile: CpuProfile) {
  const byNode = new Map(profile.nodes.map((n) => [n.id, n.callFrame]));
  const self = new Map<string, number>();
  (profile.samples ?? []).forEach((id, k) => {
    const f = byNode.get(id)!;
    const key = `${f.functionName || "(anonymous)"} ${f.url.split("/").pop()}:${f.lineNumber + 1}:${f.columnNumber + 1}`;
    self.set(key, (self.get(key) ?? 0) + (profile.timeDeltas?.[k] ?? 0) / 1000);
  });
  const top = [...self.entries()].sort((a, b) => b[1] - a[1]).slice(0, 30);
  console.log(`\n[bench] ${label}, navigation ${run}: main-thread self time by function (ms, top 30)`);
  for (const [key, ms] of top) console.log(`  ${ms.toFixed(0).padStart(6)}  ${key}`);
}

/** Opens the viewer as the viewer role: navigation (fresh context each run), bytes, and result switches. */
async function measureViewer(browser: Browser, stack: Stack & { projectId: string; viewer: Person }, bays: number, number: number) {
  const label = `${bays} x ${bays}`;
  const token = (await cookieOf(stack.viewer)).split("=")[1];
  const navigations: number[] = [];
  const marks: number[] = [];
  for (let run = 1; run <= navigationRuns; run += 1) {
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    try {
      await context.addCookies([{ name: "next-auth.session-token", value: token, domain: "127.0.0.1", path: "/" }]);
      await context.addInitScript(OBSERVE_LONG_TASKS);
      const page = await context.newPage();
      const profiler = values.profile ? await context.newCDPSession(page) : null;
      if (profiler) {
        await profiler.send("Profiler.enable");
        await profiler.send("Profiler.setSamplingInterval", { interval: 500 });
        await profiler.send("Profiler.start");
      }
      const t0 = Date.now();
      await page.goto(`${stack.appUrl}/projects/${stack.projectId}/viewer?revision=${number}`);
      await page.waitForFunction(() => performance.getEntriesByName("viewer:colouring-drawn").length > 0, null, { timeout: 600_000 });
      navigations.push(Date.now() - t0);
      // The page's own clock: the mark is set as the frame is submitted, and the poll above sees it only once the
      // software rasteriser has drawn that frame, so the difference is the first frame's drawing.
      marks.push(await page.evaluate(() => performance.getEntriesByName("viewer:colouring-drawn")[0].startTime));
      if (profiler) printProfile(label, run, (await profiler.send("Profiler.stop")).profile);
      if (values.breakdown) printWaterfall(label, run, await readWaterfall(page));
      if (run === navigationRuns) await measureDrawn(page, label, bays);
    } finally {
      await context.close();
    }
  }
  const each = navigations.length > 1 ? ` (median of ${navigations.length}: ${navigations.map((t) => seconds(t)).join(", ")})` : "";
  record(`${label}: navigation → roof drawn (page.goto → first colouring submitted)`, `${seconds(median(navigations))}${each}`, bays <= 60 ? "< 2 s" : "");
  record(`${label}: of which until the mark, by the page's clock (median)`, `${seconds(median(marks))}; the rest is the first frame's drawing before the poll sees the mark`);
}

/** Bytes before the first drawn result, and switches between results, on a page that has drawn its roof. */
async function measureDrawn(page: Page, label: string, bays: number) {
  // Scripts run in the page are passed as strings: tsx would wrap named functions in a helper the page lacks.
  const fetched = (await page.evaluate(`(() => {
    const drawn = performance.getEntriesByName("viewer:colouring-drawn")[0].startTime;
    return performance.getEntriesByType("resource").filter((e) => e.name.includes("/api/") && e.responseEnd <= drawn)
      .map((e) => ({ name: new URL(e.name).pathname.replace("/api/projects/", "").split("/").slice(1).join("/") || "project", bytes: e.encodedBodySize }));
  })()`)) as { name: string; bytes: number }[];
  const total = fetched.reduce((sum, entry) => sum + entry.bytes, 0);
  record(`${label}: API bytes before the first drawn result`, `${(total / 1e6).toFixed(2)} MB (${fetched.map((e) => `${e.name} ${(e.bytes / 1e6).toFixed(2)}`).join(", ")})`, bays <= 60 ? "< 3 MB" : "");

  if (values.breakdown) {
    // One more frame drawn now, its shaders long compiled: how much of the first frame was drawing rather than compiling.
    const frame = (await page.evaluate("window.__strutroom.measureFrame()")) as { calls: number; triangles: number; ms: number } | null;
    if (frame) console.log(`[bench] ${label}: a frame drawn again after the first: ${frame.ms.toFixed(0)} ms, ${frame.calls} draw calls, ${frame.triangles} triangles`);
  }
  const ids: string[] = await page.$$eval('[data-testid="viewer-result"] option', (options) => options.map((o) => (o as HTMLOptionElement).value));
  // First pass fetches each result's columns; the second and third draw from the ones already fetched.
  const sequence = [...ids.slice(1), ids[0]];
  for (const id of sequence) await timeResultSwitch(page, id);
  const cached: number[] = [];
  for (let pass = 0; pass < 2; pass += 1) for (const id of sequence) cached.push(await timeResultSwitch(page, id));
  record(`${label}: switch to a result already fetched, median / max (n)`, `${median(cached).toFixed(0)} / ${Math.max(...cached).toFixed(0)} ms (${cached.length})`, bays <= 60 ? "< 50 / 100 ms" : "");
}

async function main() {
  const stack = await startStack();
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run", "--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"],
  });
  try {
    const largest = Math.max(...grids);
    for (const bays of grids) {
      let number: number;
      try {
        number = await analyseThroughApp(stack, bays, bays === largest && !values["navigation-only"]);
      } catch (error) {
        record(`${bays} x ${bays}: analysis through the app`, `failed: ${error instanceof Error ? error.message : error}`);
        continue;
      }
      try {
        await measureViewer(browser, stack, bays, number);
      } catch (error) {
        record(`${bays} x ${bays}: viewer`, `failed: ${error instanceof Error ? error.message.split("\n")[0] : error}`);
      }
    }
  } finally {
    await browser.close();
  }
}

const started = performance.now();
try {
  await main();
} catch (error) {
  console.error(`[bench] failed: ${error instanceof Error ? error.message : error}`);
  process.exitCode = 1;
} finally {
  for (const child of children) if (child.pid && child.exitCode === null) process.kill(-child.pid, "SIGTERM");
  await closeDb();
  try {
    stopPostgres(dataDir);
  } catch (error) {
    console.error(String(error));
  }
  removeCluster(dataDir);
  rmSync(dataDir, { recursive: true, force: true });
}
console.log(`\nBig roofs through the app, grids ${grids.join(", ")}; headless chromium (SwiftShader, no GPU); whole run ${seconds(performance.now() - started)}\n`);
const width = Math.max(...rows.map((r) => r[0].length));
const valueWidth = Math.max(...rows.map((r) => r[1].length));
for (const [what, value, target] of rows) console.log(`${what.padEnd(width)}  ${value.padEnd(valueWidth)}  ${target}`);
