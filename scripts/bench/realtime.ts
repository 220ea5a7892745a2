// `npm run bench:realtime [-- --clients 50 --duration 60 --cursor-hz 10 --comment-every 3 --nodes 1 --threads 2]`:
// simulated members in one project room on loopback, each moving a cursor and posting comments, against the real
// realtime process and its own throwaway PostgreSQL. With --nodes N, N realtime processes share a throwaway Redis and
// the clients are spread over them evenly. The clients run in --threads worker threads (realtime-clients.mjs), so
// their CPU is their own and measured apart. --cursor-hz 0 or --comment-every 0 leaves that traffic out, so the CPU
// of each kind of message can be measured alone. Reports fan-out latency percentiles, messages lost (must be 0),
// comments persisted against comments sent, each server's memory and CPU, the CPU of PostgreSQL, Redis and the
// clients, the CPU per message, and the load average (the machine may be shared).
// Lost and superseded cursor moves: only a cursor's newest place matters, so the server sends each cursor's newest
// move per frame (older moves of the frame are dropped) and may skip a frame for a receiver whose connection is busy
// (socket.io volatile); a later move supersedes those. A move is "superseded" when the receiver never got it but got
// a newer move of the same sender; it is "lost" when the receiver got neither it nor anything newer, i.e. the
// receiver's last known place of that sender is not the sender's last move when the run has drained. Lost must be 0.
// CPU is read from /proc (utime + stime of each process, the same counters process.cpuUsage reads inside it), so a
// loaded machine slows the run but not the CPU a message costs.
// Targets: cursor p95 under 100 ms, comment p95 under 150 ms on a 2-core machine.
import { execFileSync, spawn } from "node:child_process";
import { randomBytes, randomUUID } from "node:crypto";
import { existsSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { Worker } from "node:worker_threads";
import { encode } from "next-auth/jwt";
import { cpus, loadavg } from "node:os";
import { clusterDir, removeCluster, startPostgres, stopPostgres } from "../stack/postgres.mjs";
import { redisDir, removeRedisData, startRedis, stopRedis } from "../stack/redis.mjs";
import { freePort, waitForPort } from "../stack/ports.mjs";

const { values: flags } = parseArgs({
  options: {
    clients: { type: "string", default: "50" },
    duration: { type: "string", default: "60" },
    "cursor-hz": { type: "string", default: "10" },
    "comment-every": { type: "string", default: "3" },
    nodes: { type: "string", default: "1" },
    threads: { type: "string", default: "2" },
  },
});
const CLIENTS = Number(flags.clients);
const DURATION_S = Number(flags.duration);
const CURSOR_HZ = Number(flags["cursor-hz"]);
const COMMENT_EVERY_S = Number(flags["comment-every"]);
const NODES = Math.max(1, Number(flags.nodes));
const THREADS = Math.max(1, Math.min(CLIENTS, Number(flags.threads)));
const DRAIN_MS = 3000;
/** The drain waits for every comment's answer up to this long (a queue that builds up is measured, not cut off). */
const DRAIN_MAX_MS = 120_000;

/** What a client thread reports at the end (realtime-clients.mjs). */
type ClientResults = {
  type: string;
  cursorLatencies: Float64Array;
  commentLatencies: Float64Array;
  cursorsSent: Record<string, number>;
  commentsSent: number;
  commentsAcked: number;
  commentErrors: number;
  commentEventsReceived: number;
};
const root = path.resolve(import.meta.dirname, "../..");
const runDir = path.join(root, ".data", `bench-realtime-${process.pid}`);

function percentile(sorted: ArrayLike<number>, p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

/** The node process under tsx's launcher (tsx runs the script in a child), found through /proc. */
function nodeChildOf(pid: number): number {
  const children = readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number);
  return children[0] ?? pid;
}

const TICKS_PER_S = Number(execFileSync("getconf", ["CLK_TCK"]).toString().trim()) || 100;

/** The processes under pid (PostgreSQL's backends under the postmaster), found through /proc. */
function descendants(pid: number): number[] {
  const children = existsSync(`/proc/${pid}/task/${pid}/children`)
    ? readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number)
    : [];
  return children.flatMap((child) => [child, ...descendants(child)]);
}

/** CPU seconds used by pid, its live descendants and the children it has already reaped. */
function cpuSeconds(pid: number): number {
  let ticks = 0;
  for (const [i, p] of [pid, ...descendants(pid)].entries()) {
    if (!existsSync(`/proc/${p}/stat`)) continue;
    // Fields after the command name: state is 3rd; utime, stime, cutime, cstime are the 14th to 17th.
    const fields = readFileSync(`/proc/${p}/stat`, "utf8").split(") ")[1].split(" ");
    ticks += Number(fields[11]) + Number(fields[12]) + (i === 0 ? Number(fields[13]) + Number(fields[14]) : 0);
  }
  return ticks / TICKS_PER_S;
}

function pidFrom(file: string): number | null {
  return existsSync(file) ? Number(readFileSync(file, "utf8").split("\n")[0].trim()) || null : null;
}

function rssMb(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, "utf8").split("\n").find((l) => l.startsWith("VmRSS:"));
  return line ? Number(line.split(/\s+/)[1]) / 1024 : NaN;
}

async function run(command: string, args: string[], env: NodeJS.ProcessEnv) {
  const code = await new Promise<number>((resolve) => spawn(command, args, { env, stdio: "inherit" }).on("exit", (c) => resolve(c ?? 1)));
  if (code !== 0) throw new Error(`${command} ${args.join(" ")} failed (exit ${code}).`);
}

async function main() {
  const pgPort = await freePort();
  const realtimePorts = await Promise.all(Array.from({ length: NODES }, () => freePort()));
  const secret = randomBytes(32).toString("hex");
  const databaseUrl = await startPostgres({ dataDir: path.join(runDir, "pg"), port: pgPort, throwaway: true });
  const redisUrl = NODES > 1 ? await startRedis({ dataDir: path.join(runDir, "redis"), port: await freePort(), throwaway: true }) : "";
  const env = { ...process.env, DATABASE_URL: databaseUrl, NEXTAUTH_SECRET: secret, APP_URL: "http://127.0.0.1:1", ...(redisUrl ? { REDIS_URL: redisUrl } : {}) };
  Object.assign(process.env, env);
  await run("node_modules/.bin/tsx", ["--conditions=react-server", "scripts/db-migrate.ts"], env);

  // Fixtures through the data layer's tables: one project, CLIENTS members who may comment, one pin.
  const { getDb, closeDb } = await import("../../db/client");
  const { memberships, organizations, projects, users } = await import("../../db/schema");
  const { hashPassword } = await import("../../lib/auth/password");
  const { createPin } = await import("../../lib/commands/create-pin");
  const { listCommentsByPin } = await import("../../db/queries/comments");
  const db = getDb();
  const [org] = await db.insert(organizations).values({ name: "Northfield bench" }).returning();
  const [project] = await db.insert(projects).values({ organizationId: org.id, name: "Northfield bench roof" }).returning();
  const passwordHash = await hashPassword(randomUUID());
  const people = await db
    .insert(users)
    .values(Array.from({ length: CLIENTS }, (_, i) => ({ email: `bench-${i}@northfield-bench.test`, name: `Bench member ${i}`, passwordHash })))
    .returning();
  await db.insert(memberships).values(people.map((p, i) => ({ projectId: project.id, userId: p.id, role: i % 2 ? ("architect" as const) : ("mep_engineer" as const) })));
  const pinId = randomUUID();
  await createPin({
    projectId: project.id,
    authorId: people[0].id,
    authorName: people[0].name,
    input: { id: pinId, anchor: { kind: "member", id: "TC-1" }, revisionId: null, title: "Bench thread", discipline: "general" },
  });

  const servers = realtimePorts.map((port) =>
    spawn("node_modules/.bin/tsx", ["--conditions=react-server", "server/index.ts"], { env: { ...env, NODE_ENV: "production", REALTIME_PORT: String(port) }, stdio: ["ignore", "inherit", "inherit"] }),
  );
  await Promise.all(realtimePorts.map((port) => waitForPort(port, "The realtime server", 60_000)));
  const serverPids = servers.map((server) => nodeChildOf(server.pid!));
  const postgresPid = pidFrom(path.join(clusterDir(path.join(runDir, "pg")), "postmaster.pid"));
  const redisPid = redisUrl ? pidFrom(path.join(redisDir(path.join(runDir, "redis")), "redis.pid")) : null;
  const rssStart = serverPids.map(rssMb);

  // The simulated members run in worker threads (realtime-clients.mjs), sharing send times through shared memory.
  const maxSeq = Math.ceil(DURATION_S * CURSOR_HZ) + 20;
  const maxComments = COMMENT_EVERY_S > 0 ? Math.ceil(DURATION_S / (COMMENT_EVERY_S * 0.8)) + 2 : 1;
  const shared = {
    cursorSent: new SharedArrayBuffer(4 * CLIENTS * maxSeq),
    commentSent: new SharedArrayBuffer(4 * CLIENTS * maxComments),
    highest: new SharedArrayBuffer(4 * CLIENTS * CLIENTS),
    received: new SharedArrayBuffer(4 * CLIENTS * CLIENTS),
  };
  const userIndex = Object.fromEntries(people.map((p, i) => [p.id, i]));
  const originMs = performance.timeOrigin + performance.now();
  const everyone = await Promise.all(
    people.map(async (person, index) => ({
      index,
      url: `http://127.0.0.1:${realtimePorts[index % NODES]}`,
      token: await encode({ token: { sub: person.id, userId: person.id, email: person.email, name: person.name }, secret }),
    })),
  );
  const workers = Array.from({ length: THREADS }, (_, t) => {
    const worker = new Worker(new URL("./realtime-clients.mjs", import.meta.url), {
      workerData: {
        clients: everyone.filter((c) => c.index % THREADS === t),
        projectId: project.id,
        pinId,
        cursorHz: CURSOR_HZ,
        commentEveryS: COMMENT_EVERY_S,
        durationS: DURATION_S,
        drainMs: DRAIN_MS,
        drainMaxMs: DRAIN_MAX_MS,
        originMs,
        shared,
        maxSeq,
        maxComments,
        userIndex,
      },
    });
    worker.on("error", (error) => {
      console.error("[bench] a client thread failed", error);
      process.exit(1);
    });
    return worker;
  });
  const next = (worker: Worker, type: string) => new Promise<ClientResults>((resolve) => worker.on("message", (m: ClientResults) => m.type === type && resolve(m)));
  await Promise.all(workers.map((w) => next(w, "connected")));
  console.log(
    `[bench] ${CLIENTS} clients in one room on ${NODES} node(s), run by ${THREADS} client thread(s); ${CURSOR_HZ} cursor moves/s each, a comment every ~${COMMENT_EVERY_S} s, for ${DURATION_S} s…`,
  );

  const peakRss = [...rssStart];
  const loads: number[] = [];
  const watched = { servers: serverPids, redis: redisPid ? [redisPid] : [], postgres: postgresPid ? [postgresPid] : [] };
  const cpuStart = { servers: serverPids.map(cpuSeconds), redis: watched.redis.map(cpuSeconds), postgres: watched.postgres.map(cpuSeconds), clients: process.cpuUsage() };
  const sampler = setInterval(() => {
    serverPids.forEach((pid, i) => (peakRss[i] = Math.max(peakRss[i], rssMb(pid))));
    loads.push(loadavg()[0]);
  }, 1000);
  const runStart = performance.now();
  const results = Promise.all(workers.map((w) => next(w, "results")));
  for (const worker of workers) worker.postMessage("go");
  // CPU is read when the sending stops (the drain that follows is mostly idle).
  await new Promise((r) => setTimeout(r, DURATION_S * 1000));
  const wallS = (performance.now() - runStart) / 1000;
  const cpuEnd = { servers: serverPids.map(cpuSeconds), redis: watched.redis.map(cpuSeconds), postgres: watched.postgres.map(cpuSeconds), clients: process.cpuUsage(cpuStart.clients) };
  const all = await results;
  const drainS = (performance.now() - runStart) / 1000 - wallS;
  // For the CPU per message: everything the run's messages cost, including what was still queued when sending stopped.
  const cpuDrained = { servers: serverPids.map(cpuSeconds), redis: watched.redis.map(cpuSeconds), postgres: watched.postgres.map(cpuSeconds) };
  clearInterval(sampler);
  serverPids.forEach((pid, i) => (peakRss[i] = Math.max(peakRss[i], rssMb(pid))));
  const rssEnd = serverPids.map(rssMb);

  const cursorsSent = new Map<number, number>();
  for (const r of all) for (const [index, count] of Object.entries(r.cursorsSent)) cursorsSent.set(Number(index), count);
  const highest = new Int32Array(shared.highest);
  const received = new Int32Array(shared.received);
  let expected = 0;
  let got = 0;
  let superseded = 0;
  let lost = 0;
  for (let receiver = 0; receiver < CLIENTS; receiver += 1) {
    for (let sender = 0; sender < CLIENTS; sender += 1) {
      if (sender === receiver) continue;
      const pair = receiver * CLIENTS + sender;
      expected += cursorsSent.get(sender) ?? 0;
      got += received[pair];
      superseded += highest[pair] - received[pair];
      lost += (cursorsSent.get(sender) ?? 0) - highest[pair];
    }
  }
  const sum = (key: "commentsSent" | "commentsAcked" | "commentErrors" | "commentEventsReceived") => all.reduce((total, r) => total + r[key], 0);
  const commentsSent = sum("commentsSent");
  const commentsAcked = sum("commentsAcked");
  const commentErrors = sum("commentErrors");
  const commentEventsReceived = sum("commentEventsReceived");
  const cursorLatencies = Float64Array.from(all.flatMap((r) => [...r.cursorLatencies])).sort();
  const commentLatencies = Float64Array.from(all.flatMap((r) => [...r.commentLatencies])).sort();
  const stored = await listCommentsByPin({ projectId: project.id, pinId });
  const ms = (v: number) => `${v.toFixed(1)} ms`;
  const core = (seconds: number) => `${((100 * seconds) / wallS).toFixed(0)} %`;
  console.log("\n[bench] results");
  console.log(`  cursor fan-out     ${cursorLatencies.length} deliveries   p50 ${ms(percentile(cursorLatencies, 50))}   p95 ${ms(percentile(cursorLatencies, 95))}   p99 ${ms(percentile(cursorLatencies, 99))}`);
  console.log(`  comment fan-out    ${commentLatencies.length} deliveries   p50 ${ms(percentile(commentLatencies, 50))}   p95 ${ms(percentile(commentLatencies, 95))}   p99 ${ms(percentile(commentLatencies, 99))}`);
  console.log(`  cursor messages    expected ${expected}, received ${got}, superseded ${superseded}, lost ${lost}`);
  console.log(`  comments           sent ${commentsSent}, acknowledged ${commentsAcked}, refused ${commentErrors}, persisted ${stored.length}, fan-out events ${commentEventsReceived} (expected ${commentsAcked * (CLIENTS - 1)}); drained ${drainS.toFixed(1)} s after sending stopped`);
  serverPids.forEach((_, i) =>
    console.log(
      `  node ${i + 1}             RSS start ${rssStart[i].toFixed(0)} MB, peak ${peakRss[i].toFixed(0)} MB, end ${rssEnd[i].toFixed(0)} MB; CPU ${core(cpuEnd.servers[i] - cpuStart.servers[i])} of a core (${Math.ceil((CLIENTS - i) / NODES)} clients)`,
    ),
  );
  const tree = (key: "redis" | "postgres") => cpuEnd[key].reduce((total, v, i) => total + v - cpuStart[key][i], 0);
  console.log(`  other CPU          PostgreSQL ${core(tree("postgres"))}, ${redisPid ? `Redis ${core(tree("redis"))}, ` : ""}bench clients ${core((cpuEnd.clients.user + cpuEnd.clients.system) / 1e6)} of a core`);
  const drained = (key: "servers" | "redis" | "postgres") => cpuDrained[key].reduce((total, v, i) => total + v - cpuStart[key][i], 0);
  const sentMessages = [...cursorsSent.values()].reduce((a, b) => a + b, 0) + commentsSent;
  const deliveries = got + commentEventsReceived;
  const us = (seconds: number, count: number) => (count > 0 ? `${((seconds * 1e6) / count).toFixed(1)} µs` : "n/a");
  console.log(
    `  CPU per message    servers ${us(drained("servers"), deliveries)} per delivery (${deliveries} deliveries); servers, PostgreSQL and Redis ${us(drained("servers") + drained("postgres") + drained("redis"), sentMessages)} per message sent (${sentMessages} sent: cursor moves and comments)`,
  );
  console.log(`  load average       1-min ${Math.min(...loads).toFixed(1)} … ${Math.max(...loads).toFixed(1)} during the run (${cpus().length} cores)`);
  const p95 = percentile(cursorLatencies, 95);
  const commentP95 = percentile(commentLatencies, 95);
  const ok = lost === 0 && stored.length === commentsSent && commentsAcked === commentsSent;
  console.log(
    `  verdict            ${ok ? "no message lost, every comment persisted" : "LOSS: see above"}; cursor p95 ${p95 < 100 ? "within" : "OVER"} the 100 ms target, comment p95 ${commentP95 < 150 ? "within" : "OVER"} the 150 ms target`,
  );

  await Promise.all(workers.map((worker) => new Promise((resolve) => worker.once("exit", resolve).postMessage("close"))));
  await Promise.all(
    servers.map(
      (server) =>
        new Promise<void>((resolve) => {
          server.once("exit", () => resolve());
          server.kill("SIGTERM");
        }),
    ),
  );
  await closeDb();
  if (redisUrl) {
    await stopRedis(path.join(runDir, "redis"));
    removeRedisData(path.join(runDir, "redis"));
  }
  stopPostgres(path.join(runDir, "pg"));
  removeCluster(path.join(runDir, "pg"));
  rmSync(runDir, { recursive: true, force: true });
  process.exitCode = ok ? 0 : 1;
}

main().catch((error) => {
  console.error(`[bench] ${error instanceof Error ? error.stack : error}`);
  try {
    stopPostgres(path.join(runDir, "pg"));
  } catch {
    /* the cluster may not have started */
  }
  void stopRedis(path.join(runDir, "redis")).catch(() => undefined);
  process.exitCode = 1;
});
