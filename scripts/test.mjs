// `npm test`: the whole suite. Type check, lint, unit tests, integration tests against a throwaway PostgreSQL on a
// free port (with the local fakes), then a production build served with every process for browser tests in
// Debian's chromium. Ends with one "N passed, N failed" line summing the vitest suites.
import { randomBytes } from "node:crypto";
import { existsSync, mkdirSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { ensureDependencies, run, stopAll } from "./stack/processes.mjs";
import { removeCluster, startPostgres, stopPostgres } from "./stack/postgres.mjs";
import { removeRedisData, startRedis, stopRedis } from "./stack/redis.mjs";
import { serviceEnv, startServices } from "./stack/services.mjs";
import { freePort } from "./stack/ports.mjs";
import { ensureChromium, ensurePoppler, ensurePostgres } from "./stack/system.mjs";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
process.chdir(root);
// Next.js would otherwise try to send anonymous telemetry; this machine has no network but the registries.
process.env.NEXT_TELEMETRY_DISABLED = "1";
const artifacts = path.join(root, ".artifacts");
const runDir = path.join(root, ".data", `test-${process.pid}`);
const pgDir = path.join(runDir, "pg");
const redisDataDir = path.join(runDir, "redis");
const tally = { passed: 0, failed: 0, skipped: 0 };
// `npm test` runs every stage. While working on one part: `npm test -- --only=integration [vitest filters]` runs
// just the named stages (checks, unit, integration, security, e2e; comma-separated) with the filters passed to vitest.
const onlyArg = process.argv.slice(2).find((arg) => arg.startsWith("--only="));
const stages = onlyArg ? new Set(onlyArg.slice("--only=".length).split(",")) : null;
const filters = process.argv.slice(2).filter((arg) => !arg.startsWith("--only="));
const wants = (stage) => !stages || stages.has(stage);

async function step(name, command, args, env = process.env) {
  console.log(`\n=== ${name} ===`);
  const code = await run(command, args, { env });
  if (code !== 0) throw new Error(`${name} failed (exit ${code}).`);
}

async function vitestProject(project, env) {
  const report = path.join(artifacts, `vitest-${project}.json`);
  rmSync(report, { force: true });
  console.log(`\n=== ${project} tests ===`);
  const code = await run("node_modules/.bin/vitest", ["run", "--project", project, "--reporter=default", "--reporter=json", `--outputFile.json=${report}`, ...filters], { env });
  if (existsSync(report)) {
    const result = JSON.parse(readFileSync(report, "utf8"));
    tally.passed += result.numPassedTests;
    tally.failed += result.numFailedTests;
    tally.skipped += result.numPendingTests + (result.numTodoTests ?? 0);
  }
  if (code !== 0) throw new Error(`${project} tests failed (exit ${code}).`);
}

async function main() {
  ensureDependencies(root);
  ensurePostgres();
  const chromium = ensureChromium();
  ensurePoppler();
  mkdirSync(artifacts, { recursive: true });

  if (wants("checks")) {
    await step("type check", "node_modules/.bin/next", ["typegen"]);
    await step("type check", "node_modules/.bin/tsc", ["--noEmit"]);
    await step("lint", "node_modules/.bin/eslint", [".", "--max-warnings=0"]);
  }
  if (wants("unit")) await vitestProject("unit", process.env);
  if (!wants("integration") && !wants("security") && !wants("e2e")) return;

  const ports = { web: await freePort(), postgres: await freePort(), realtime: await freePort(), jobs: await freePort(), s3: await freePort(), smtp: await freePort() };
  const databaseUrl = await startPostgres({ dataDir: pgDir, port: ports.postgres, throwaway: true });
  // STRUTROOM_TEST_PG_DIR lets the security suite stop and start this throwaway cluster (a database outage test).
  // The cluster test (tests/integration/cluster.test.ts) starts its own realtime nodes and job workers on this
  // Redis; every other process of the test stack runs embedded, without one.
  const redisUrl = wants("integration") ? await startRedis({ dataDir: redisDataDir, port: await freePort(), throwaway: true }) : "";
  const env = { ...serviceEnv({ databaseUrl, ports, secret: randomBytes(32).toString("hex"), dataDir: runDir }), CHROMIUM_PATH: chromium, ARTIFACTS_DIR: artifacts, STRUTROOM_TEST_PG_DIR: pgDir, STRUTROOM_TEST_REDIS_URL: redisUrl };
  await step("migrate", "node_modules/.bin/tsx", ["--conditions=react-server", "scripts/db-migrate.ts"], env);
  await startServices({ env, ports, kinds: ["backing"], quiet: true });
  if (wants("integration")) await vitestProject("integration", { ...env, NODE_ENV: "test" });
  if (wants("security")) await vitestProject("security", { ...env, NODE_ENV: "test" });
  if (!wants("e2e")) return;

  await step("build", "node_modules/.bin/next", ["build"], env);
  await step("seed demo", "node_modules/.bin/tsx", ["--conditions=react-server", "scripts/db-seed.ts"], env);
  await startServices({ env, ports, kinds: ["app"], quiet: true });
  await vitestProject("e2e", { ...env, NODE_ENV: "test", BASE_URL: env.APP_URL });
}

let exitCode = 0;
try {
  await main();
} catch (error) {
  console.error(`\n[test] ${error instanceof Error ? error.message : error}`);
  exitCode = 1;
} finally {
  await stopAll();
  try { stopPostgres(pgDir); } catch (error) { console.error(String(error)); }
  removeCluster(pgDir);
  try { await stopRedis(redisDataDir); } catch (error) { console.error(String(error)); }
  removeRedisData(redisDataDir);
  rmSync(runDir, { recursive: true, force: true });
}
console.log(`\n${tally.passed} passed, ${tally.failed} failed${tally.skipped ? `, ${tally.skipped} skipped` : ""}`);
process.exit(exitCode || (tally.failed > 0 ? 1 : 0));
