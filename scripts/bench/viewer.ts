/**
 * Viewer benchmark: `npm run bench:viewer [-- --bays 60]`. Not a test: it prints a table.
 * A square double-layer grid of N x N bays (generator, 3 m module; 60 bays is about 29,000 members) is analysed and
 * stored as a revision in a throwaway PostgreSQL, the built app (built first when there is no build or the code changed since) is served on a free port, and
 * the viewer is opened in Debian's chromium (headless, WebGL on SwiftShader). Measured in the page:
 *   - results fetched → first frame with the colouring drawn (User Timing marks set by the viewer)
 *   - frame time while orbiting (a mouse drag on the canvas, intervals between animation frames) and the render
 *     time of a single frame (render + read back one pixel)
 *   - draw calls and triangles of a frame (three.js renderer.info)
 *   - load case / combination switch → the next frame with the new colours submitted, for every result
 * "Submitted" is the mark set in the frame callback, before the GPU (here the software rasteriser) draws; the
 * rasterising time of one frame is reported separately as the single-frame render time.
 * Targets (issue 5): first frame under 1.5 s, members in at most 10 draw calls, switching under 100 ms.
 */
import { execFileSync, spawn, type ChildProcess } from "node:child_process";
import { rmSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { encode } from "next-auth/jwt";
import { chromium } from "playwright-core";
import { closeDb, getDb } from "@/db/client";
import { insertRevisionWithAnalysis } from "@/db/queries/models";
import { memberships, organizations, projects, users } from "@/db/schema";
import { analyzeModel, generateRoof } from "@/lib/analysis";
import { encodeResultColumns } from "@/lib/models/result-columns";
import { freePort, waitForPort } from "../stack/ports.mjs";
import { ensureFreshBuild } from "./fresh-build";
import { timeResultSwitch } from "./result-switch";
import { removeCluster, startPostgres, stopPostgres } from "../stack/postgres.mjs";
import { packGeometry } from "@/lib/models/geometry-wire";

const { values } = parseArgs({ options: { bays: { type: "string", default: "60" } } });
const bays = Number(values.bays);
const root = process.cwd();
const dataDir = path.join(root, ".data", `bench-viewer-${process.pid}`);
const rows: [string, string, string][] = [];
let web: ChildProcess | undefined;
const record = (what: string, value: string, target = "") => {
  rows.push([what, value, target]);
  console.log(`[bench] ${what}: ${value}`);
};

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const p95 = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(xs.length * 0.95))];

async function storeModel(): Promise<{ projectId: string; user: { id: string; email: string; name: string } }> {
  let t = performance.now();
  const model = generateRoof({ name: `Bench grid ${bays} x ${bays}`, spanX: bays * 3, spanY: bays * 3, module: 3, depth: 2.5 });
  const result = analyzeModel(model);
  record("model", `${model.members.length} members, ${model.nodes.length} nodes, ${model.loadCases.length} cases + ${model.combinations.length} combinations`);
  record("analysis (server side, at save time)", `${((performance.now() - t) / 1000).toFixed(2)} s`);
  const db = getDb();
  const [org] = await db.insert(organizations).values({ name: "Bench organisation" }).returning();
  const [project] = await db.insert(projects).values({ organizationId: org.id, name: "Bench roof" }).returning();
  const [user] = await db.insert(users).values({ email: "bench@bench.test", name: "Bench engineer", passwordHash: "-" }).returning();
  await db.insert(memberships).values({ projectId: project.id, userId: user.id, role: "structural_engineer" });
  t = performance.now();
  // The member review is left out: it is not drawn by the force-state colouring measured here.
  await insertRevisionWithAnalysis(db, { projectId: project.id, name: model.name, model, geometry: packGeometry(model), source: "generated", createdBy: user.id, result, review: null, columns: encodeResultColumns(model, result, null) });
  record("stored revision", `${((performance.now() - t) / 1000).toFixed(2)} s`);
  return { projectId: project.id, user };
}

async function main() {
  ensureFreshBuild(root);
  const ports = { web: await freePort(), postgres: await freePort() };
  const databaseUrl = await startPostgres({ dataDir, port: ports.postgres, throwaway: true });
  const secret = "bench-viewer-secret-not-for-production";
  const env = { ...process.env, NODE_ENV: "production" as const, DATABASE_URL: databaseUrl, NEXTAUTH_SECRET: secret, NEXTAUTH_URL: `http://127.0.0.1:${ports.web}`, APP_URL: `http://127.0.0.1:${ports.web}`,
    // The viewer page embeds the live review; no realtime process runs here, so its socket just keeps retrying.
    REALTIME_URL: "http://127.0.0.1:9" };
  process.env.DATABASE_URL = databaseUrl;
  execFileSync("node_modules/.bin/tsx", ["--conditions=react-server", "scripts/db-migrate.ts"], { env, stdio: "inherit" });
  const { projectId, user } = await storeModel();
  await closeDb();

  web = spawn("node_modules/.bin/next", ["start", "-H", "127.0.0.1", "-p", String(ports.web)], { env, stdio: "ignore", detached: true });
  await waitForPort(ports.web, "The web app", 120_000);
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
    headless: true,
    args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run", "--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"],
  });
  try {
    const context = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    const token = await encode({ token: { sub: user.id, userId: user.id, email: user.email, name: user.name }, secret });
    await context.addCookies([{ name: "next-auth.session-token", value: token, domain: "127.0.0.1", path: "/" }]);
    const page = await context.newPage();
    const t0 = Date.now();
    await page.goto(`http://127.0.0.1:${ports.web}/projects/${projectId}/viewer`);
    await page.getByTestId("viewer-legend").waitFor({ timeout: 300_000 });
    await page.waitForFunction(() => performance.getEntriesByName("viewer:colouring-drawn").length > 0, null, { timeout: 300_000 });
    record("page open → legend shown (incl. download)", `${((Date.now() - t0) / 1000).toFixed(2)} s`);
    const firstFrame = await page.evaluate(() => {
      const fetched = performance.getEntriesByName("viewer:results-fetched")[0].startTime;
      const drawn = performance.getEntriesByName("viewer:colouring-drawn")[0].startTime;
      return drawn - fetched;
    });
    record("results fetched → first frame submitted", `${firstFrame.toFixed(0)} ms`, "< 1500 ms");
    // What the page downloaded from our API before the first result was drawn (bodies as sent, after compression).
    const apiBytes = (await page.evaluate(`(() => {
      const drawn = performance.getEntriesByName("viewer:colouring-drawn")[0].startTime;
      return performance.getEntriesByType("resource").filter((e) => e.name.includes("/api/") && e.responseEnd <= drawn)
        .map((e) => ({ name: new URL(e.name).pathname.split("/").slice(4).join("/"), bytes: e.encodedBodySize }));
    })()`)) as { name: string; bytes: number }[];
    const total = apiBytes.reduce((sum, entry) => sum + entry.bytes, 0);
    record("API bytes before the first drawn result", `${(total / 1e6).toFixed(2)} MB (${apiBytes.map((e) => `${e.name} ${(e.bytes / 1e6).toFixed(2)}`).join(", ")})`, "< 3 MB");

    const frames: { calls: number; triangles: number; ms: number }[] = [];
    for (let k = 0; k < 10; k += 1) frames.push((await page.evaluate(() => window.__strutroom!.measureFrame()))!);
    record("draw calls per frame (whole scene)", String(frames[0].calls), "members ≤ 10");
    record("triangles per frame", frames[0].triangles.toLocaleString("en-GB"));
    record("single frame render, median / p95", `${median(frames.map((f) => f.ms)).toFixed(1)} / ${p95(frames.map((f) => f.ms)).toFixed(1)} ms`);

    // Orbit: drag across the canvas while the page records the intervals between animation frames.
    const box = (await page.locator("canvas").boundingBox())!;
    // Scripts run in the page are passed as strings: tsx would wrap named functions in a helper the page lacks.
    await page.evaluate(`(() => {
      const stamps = [];
      window.__stamps = stamps;
      const tick = (t) => { stamps.push(t); if (stamps.length < 100000) requestAnimationFrame(tick); };
      requestAnimationFrame(tick);
    })()`);
    const cx = box.x + box.width / 2;
    const cy = box.y + box.height / 2;
    await page.mouse.move(cx, cy);
    await page.mouse.down();
    for (let k = 1; k <= 20; k += 1) await page.mouse.move(cx + Math.sin(k / 10) * box.width * 0.3, cy + Math.cos(k / 15) * 40);
    await page.mouse.up();
    const intervals = (await page.evaluate(`window.__stamps.slice(1).map((t, k) => t - window.__stamps[k])`)) as number[];
    record("frame time while orbiting, median / p95", `${median(intervals).toFixed(1)} / ${p95(intervals).toFixed(1)} ms (${intervals.length} frames)`);

    const ids: string[] = await page.$$eval('[data-testid="viewer-result"] option', (options) => options.map((o) => (o as HTMLOptionElement).value));
    const switches: number[] = [];
    // The viewer opens on the first option; start from the second so every step changes the result shown.
    const sequence = [...ids.slice(1), ids[0], ...ids.slice(1), ids[0]];
    for (const id of sequence) {
      switches.push(await timeResultSwitch(page, id));
    }
    // The first pass fetches each result's columns; the second draws from the ones already fetched.
    const fetched = switches.slice(0, ids.length);
    const cached = switches.slice(ids.length);
    record("switch to a result not yet fetched → new colours submitted, median / max", `${median(fetched).toFixed(0)} / ${Math.max(...fetched).toFixed(0)} ms`);
    record("switch to a result already fetched → new colours submitted, median / max", `${median(cached).toFixed(0)} / ${Math.max(...cached).toFixed(0)} ms`, "< 50 / 100 ms");
  } finally {
    await browser.close();
  }
}

try {
  await main();
  console.log(`\nViewer benchmark, ${bays} x ${bays} bays, headless chromium (SwiftShader, no GPU)\n`);
  const width = Math.max(...rows.map((r) => r[0].length));
  const valueWidth = Math.max(...rows.map((r) => r[1].length));
  for (const [what, value, target] of rows) console.log(`${what.padEnd(width)}  ${value.padEnd(valueWidth)}  ${target}`);
} catch (error) {
  console.error(`[bench] failed: ${error instanceof Error ? error.message : error}`);
  process.exitCode = 1;
} finally {
  // The server runs in its own process group (detached): stop the whole group.
  if (web?.pid) process.kill(-web.pid, "SIGTERM");
  await closeDb();
  try {
    stopPostgres(dataDir);
  } catch (error) {
    console.error(String(error));
  }
  removeCluster(dataDir);
  rmSync(dataDir, { recursive: true, force: true });
}
