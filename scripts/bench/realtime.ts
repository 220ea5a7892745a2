// `npm run bench:realtime [-- --clients 50 --duration 60 --cursor-hz 10 --comment-every 3 --nodes 1]`: simulated
// members in one project room on loopback, each moving a cursor and posting comments, against the real realtime
// process and its own throwaway PostgreSQL. With --nodes N, N realtime processes share a throwaway Redis and the
// clients are spread over them evenly. Reports fan-out latency percentiles, messages lost (must be 0), comments
// persisted against comments sent, each server's memory, and the load average (the machine may be shared).
// Targets: cursor p95 under 100 ms, comment p95 under 150 ms on a 2-core machine.
import { spawn } from "node:child_process";
import { randomBytes, randomUUID } from "node:crypto";
import { readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { io } from "socket.io-client";
import { encode } from "next-auth/jwt";
import { cpus, loadavg } from "node:os";
import { removeCluster, startPostgres, stopPostgres } from "../stack/postgres.mjs";
import { removeRedisData, startRedis, stopRedis } from "../stack/redis.mjs";
import { freePort, waitForPort } from "../stack/ports.mjs";
import type { Ack, ClientToServerEvents, ServerToClientEvents } from "../../lib/realtime/events";
import type { Socket } from "socket.io-client";

const { values: flags } = parseArgs({
  options: {
    clients: { type: "string", default: "50" },
    duration: { type: "string", default: "60" },
    "cursor-hz": { type: "string", default: "10" },
    "comment-every": { type: "string", default: "3" },
    nodes: { type: "string", default: "1" },
  },
});
const CLIENTS = Number(flags.clients);
const DURATION_S = Number(flags.duration);
const CURSOR_HZ = Number(flags["cursor-hz"]);
const COMMENT_EVERY_S = Number(flags["comment-every"]);
const NODES = Math.max(1, Number(flags.nodes));
const DRAIN_MS = 3000;

type Client = Socket<ServerToClientEvents, ClientToServerEvents>;
const root = path.resolve(import.meta.dirname, "../..");
const runDir = path.join(root, ".data", `bench-realtime-${process.pid}`);

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return NaN;
  return sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))];
}

/** The node process under tsx's launcher (tsx runs the script in a child), found through /proc. */
function nodeChildOf(pid: number): number {
  const children = readFileSync(`/proc/${pid}/task/${pid}/children`, "utf8").trim().split(/\s+/).filter(Boolean).map(Number);
  return children[0] ?? pid;
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
  await run("node_modules/.bin/tsx", ["scripts/db-migrate.ts"], env);

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
  const rssStart = serverPids.map(rssMb);

  // Latency is measured within this one process: the send time of each (sender, seq) is kept until received.
  const sentAt = new Map<string, number>();
  const cursorLatencies: number[] = [];
  const commentLatencies: number[] = [];
  const commentSentAt = new Map<string, number>();
  const received = new Map<string, number>(); // receiver|sender -> count
  const cursorsSent = new Map<string, number>(); // sender socket id -> count
  let commentsSent = 0;
  let commentsAcked = 0;
  let commentErrors = 0;
  let commentEventsReceived = 0;

  const clients: Client[] = await Promise.all(
    people.map(async (person, index) => {
      const token = await encode({ token: { sub: person.id, userId: person.id, email: person.email, name: person.name }, secret });
      const client: Client = io(`http://127.0.0.1:${realtimePorts[index % NODES]}`, {
        auth: { projectId: project.id },
        transports: ["websocket"],
        extraHeaders: { cookie: `next-auth.session-token=${token}` },
        reconnection: false,
        forceNew: true,
      });
      await new Promise<void>((resolve, reject) => {
        client.once("welcome", () => resolve());
        client.once("connect_error", reject);
      });
      client.on("cursors", (moves) => {
        const now = performance.now();
        for (const { socketId, seq } of moves) {
          if (socketId === client.id) continue;
          const t = sentAt.get(`${socketId}:${seq}`);
          if (t !== undefined) cursorLatencies.push(now - t);
          const key = `${client.id}|${socketId}`;
          received.set(key, (received.get(key) ?? 0) + 1);
        }
      });
      client.on("comment:created", (comment) => {
        commentEventsReceived += 1;
        const t = commentSentAt.get(comment.id);
        if (t !== undefined) commentLatencies.push(performance.now() - t);
      });
      return client;
    }),
  );
  console.log(`[bench] ${clients.length} clients in one room on ${NODES} node(s); ${CURSOR_HZ} cursor moves/s each, a comment every ~${COMMENT_EVERY_S} s, for ${DURATION_S} s…`);

  const timers: NodeJS.Timeout[] = [];
  const peakRss = [...rssStart];
  const loads: number[] = [];
  timers.push(
    setInterval(() => {
      serverPids.forEach((pid, i) => (peakRss[i] = Math.max(peakRss[i], rssMb(pid))));
      loads.push(loadavg()[0]);
    }, 1000),
  );
  for (const client of clients) {
    let seq = 0;
    const id = client.id!;
    // Spread the clients' phases so the load is even, as it would be with real people.
    const start = setTimeout(() => {
      timers.push(
        setInterval(() => {
          seq += 1;
          sentAt.set(`${id}:${seq}`, performance.now());
          cursorsSent.set(id, seq);
          client.emit("cursor:move", { point: [Math.random() * 36, Math.random() * 24, 9], seq });
        }, 1000 / CURSOR_HZ),
      );
      timers.push(
        setInterval(() => {
          const commentId = randomUUID();
          commentsSent += 1;
          commentSentAt.set(commentId, performance.now());
          void (client.emitWithAck("comment:create", { id: commentId, pinId, body: `Bench comment from ${id}` }) as Promise<Ack<unknown>>).then(
            (ack) => (ack.ok ? (commentsAcked += 1) : (commentErrors += 1)),
            () => (commentErrors += 1),
          );
        }, COMMENT_EVERY_S * 1000 * (0.8 + Math.random() * 0.4)),
      );
    }, Math.random() * 1000);
    timers.push(start);
  }

  await new Promise((r) => setTimeout(r, DURATION_S * 1000));
  for (const timer of timers) clearInterval(timer);
  await new Promise((r) => setTimeout(r, DRAIN_MS));
  serverPids.forEach((pid, i) => (peakRss[i] = Math.max(peakRss[i], rssMb(pid))));
  const rssEnd = serverPids.map(rssMb);

  let expected = 0;
  let got = 0;
  for (const receiver of clients) {
    for (const sender of clients) {
      if (sender === receiver) continue;
      expected += cursorsSent.get(sender.id!) ?? 0;
      got += received.get(`${receiver.id}|${sender.id}`) ?? 0;
    }
  }
  const stored = await listCommentsByPin({ projectId: project.id, pinId });
  cursorLatencies.sort((a, b) => a - b);
  commentLatencies.sort((a, b) => a - b);
  const ms = (v: number) => `${v.toFixed(1)} ms`;
  console.log("\n[bench] results");
  console.log(`  cursor fan-out     ${cursorLatencies.length} deliveries   p50 ${ms(percentile(cursorLatencies, 50))}   p95 ${ms(percentile(cursorLatencies, 95))}   p99 ${ms(percentile(cursorLatencies, 99))}`);
  console.log(`  comment fan-out    ${commentLatencies.length} deliveries   p50 ${ms(percentile(commentLatencies, 50))}   p95 ${ms(percentile(commentLatencies, 95))}   p99 ${ms(percentile(commentLatencies, 99))}`);
  console.log(`  cursor messages    expected ${expected}, received ${got}, lost ${expected - got}`);
  console.log(`  comments           sent ${commentsSent}, acknowledged ${commentsAcked}, refused ${commentErrors}, persisted ${stored.length}, fan-out events ${commentEventsReceived} (expected ${commentsAcked * (CLIENTS - 1)})`);
  serverPids.forEach((_, i) =>
    console.log(`  node ${i + 1} memory      RSS start ${rssStart[i].toFixed(0)} MB, peak ${peakRss[i].toFixed(0)} MB, end ${rssEnd[i].toFixed(0)} MB (${Math.ceil((CLIENTS - i) / NODES)} clients)`),
  );
  console.log(`  load average       1-min ${Math.min(...loads).toFixed(1)} … ${Math.max(...loads).toFixed(1)} during the run (${cpus().length} cores)`);
  const p95 = percentile(cursorLatencies, 95);
  const commentP95 = percentile(commentLatencies, 95);
  const ok = expected === got && stored.length === commentsSent && commentsAcked === commentsSent;
  console.log(
    `  verdict            ${ok ? "no message lost, every comment persisted" : "LOSS: see above"}; cursor p95 ${p95 < 100 ? "within" : "OVER"} the 100 ms target, comment p95 ${commentP95 < 150 ? "within" : "OVER"} the 150 ms target`,
  );

  for (const client of clients) client.disconnect();
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
