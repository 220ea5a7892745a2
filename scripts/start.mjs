// `npm start`: installs what is missing, starts PostgreSQL on loopback, migrates, seeds the demo, builds when the
// sources changed, starts every process of the product and prints where to go. `npm run start:cluster` (--cluster)
// also starts Redis and runs two of each of Strutroom's processes (README "Running on several machines").
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, writeFileSync, statSync, readdirSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { ensureDependencies, run, stopAll } from "./stack/processes.mjs";
import { startPostgres, stopPostgres } from "./stack/postgres.mjs";
import { serviceEnv, startServices } from "./stack/services.mjs";
import { demoPorts } from "./stack/demo-ports.mjs";
import { startRedis, stopRedis } from "./stack/redis.mjs";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
process.chdir(root);
// Next.js would otherwise try to send anonymous telemetry; this machine has no network but the registries.
process.env.NEXT_TELEMETRY_DISABLED = "1";
const dataDir = path.join(root, ".data");
const pgDir = path.join(dataDir, "pg");
const redisDataDir = path.join(dataDir, "redis");
const cluster = process.argv.includes("--cluster");

function secret() {
  const file = path.join(dataDir, "auth-secret");
  if (!existsSync(file)) writeFileSync(file, randomBytes(32).toString("hex"), { mode: 0o600 });
  return readFileSync(file, "utf8").trim();
}

function newestSource(dir) {
  let newest = 0;
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    if (entry.name.startsWith(".") || entry.name === "node_modules") continue;
    const full = path.join(dir, entry.name);
    newest = Math.max(newest, entry.isDirectory() ? newestSource(full) : statSync(full).mtimeMs);
  }
  return newest;
}

function needsBuild() {
  const buildId = path.join(root, ".next", "BUILD_ID");
  if (!existsSync(buildId)) return true;
  const built = statSync(buildId).mtimeMs;
  const sources = ["app", "components", "lib", "db", "public"].filter((d) => existsSync(d)).map((d) => newestSource(path.join(root, d)));
  const configs = ["package-lock.json", "next.config.ts", "tailwind.config.ts"].map((f) => statSync(f).mtimeMs);
  return Math.max(...sources, ...configs) > built;
}

async function shutdown(code) {
  console.log("\n[stop] stopping Strutroom…");
  await stopAll();
  try { stopPostgres(pgDir); } catch (error) { console.error(String(error)); }
  if (cluster) try { await stopRedis(redisDataDir); } catch (error) { console.error(String(error)); }
  process.exit(code);
}

/**
 * Two nodes on one Redis: node 1 is web-1 + realtime-1, node 2 web-2 + realtime-2 (each web page connects to its
 * node's realtime server; both realtime servers share every room and document), and jobs-1 and jobs-2 share the
 * PostgreSQL queue. The local fakes run once.
 */
async function startCluster(env, ports) {
  const redisUrl = await startRedis({ dataDir: redisDataDir, port: ports.redis });
  await startServices({ env, ports, kinds: ["backing"] });
  const nodes = [
    { node: "1", web: ports.web, realtime: ports.realtime, jobs: ports.jobs },
    { node: "2", web: ports.web2, realtime: ports.realtime2, jobs: ports.jobs2 },
  ];
  await Promise.all(
    nodes.map(({ node, web, realtime, jobs }) => {
      const nodePorts = { ...ports, web, realtime, jobs };
      const nodeEnv = { ...serviceEnv({ databaseUrl: env.DATABASE_URL, ports: nodePorts, secret: env.NEXTAUTH_SECRET, dataDir }), REDIS_URL: redisUrl };
      return startServices({ env: nodeEnv, ports: nodePorts, kinds: ["app"], node });
    }),
  );
  console.log("\nStrutroom cluster on loopback:");
  console.log(`  redis        ${redisUrl}  (rooms and live documents shared between the realtime servers)`);
  for (const { node, web, realtime, jobs } of nodes) {
    console.log(`  web-${node}        http://127.0.0.1:${web}  (pages and API; its pages connect to realtime-${node})`);
    console.log(`  realtime-${node}   http://127.0.0.1:${realtime}  (socket.io and shared notes, websockets only)`);
    console.log(`  jobs-${node}       http://127.0.0.1:${jobs}/health  (analysis queue, upload sweep, daily digest, mail outbox; each job runs once)`);
  }
}

async function main() {
  ensureDependencies(root);
  mkdirSync(dataDir, { recursive: true });
  const ports = demoPorts();
  const databaseUrl = await startPostgres({ dataDir: pgDir, port: ports.postgres });
  const env = serviceEnv({ databaseUrl, ports, secret: secret(), dataDir });
  for (const step of ["db-migrate.ts", "db-seed.ts"]) {
    if ((await run("node_modules/.bin/tsx", ["--conditions=react-server", `scripts/${step}`], { env })) !== 0) throw new Error(`scripts/${step} failed (see above).`);
  }
  if (needsBuild()) {
    console.log("[setup] building the web app (next build)…");
    if ((await run("node_modules/.bin/next", ["build"], { env: { ...env, NODE_ENV: "production" } })) !== 0) throw new Error("next build failed (see above).");
  }
  if (cluster) await startCluster(env, ports);
  else await startServices({ env, ports });
  const accounts = JSON.parse(readFileSync(path.join(root, "scripts/seed/demo-accounts.json"), "utf8"));
  console.log(`\nStrutroom is running: open ${env.APP_URL}\n\nDemo sign-ins (password for all: ${accounts.password}):`);
  for (const account of accounts.users) console.log(`  ${account.role.padEnd(22)} ${account.email}`);
  console.log(`\nPress Ctrl+C to stop everything (PostgreSQL${cluster ? " and Redis are" : " is"} stopped cleanly; your data stays in .data/).`);
}

process.on("SIGINT", () => shutdown(0));
process.on("SIGTERM", () => shutdown(0));
main().catch(async (error) => {
  console.error(`\n[start] ${error instanceof Error ? error.message : error}`);
  await shutdown(1);
});
