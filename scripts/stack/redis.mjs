// Redis from Debian's redis-server package on loopback, for the cluster run and the cluster test (the embedded
// `npm start` needs none). Its data folder sits beside PostgreSQL's: inside the project, git-ignored, or under
// /var/lib/strutroom when the redis system user cannot reach the project (data-folder.mjs). As root the server runs
// as the `redis` system user, like Debian's own service. Stopped with SIGTERM, which Redis answers by saving (when
// saving is on) and exiting cleanly.
import { execFileSync, spawnSync } from "node:child_process";
import { chmodSync, chownSync, existsSync, mkdirSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { reachableDir } from "./data-folder.mjs";
import { isPortTaken, waitForPort } from "./ports.mjs";
import { ensureRedis } from "./system.mjs";

/** Where the Redis data for dataDir really lives. */
export function redisDir(dataDir) {
  return reachableDir("redis", dataDir);
}

function ownFolder(dir) {
  mkdirSync(dir, { recursive: true });
  if (process.getuid?.() !== 0) return;
  const uid = Number(execFileSync("id", ["-u", "redis"]).toString().trim());
  const gid = Number(execFileSync("id", ["-g", "redis"]).toString().trim());
  chownSync(dir, uid, gid);
  chmodSync(dir, 0o700);
  if (spawnSync("runuser", ["-u", "redis", "--", "test", "-w", dir]).status !== 0) {
    throw new Error(`The redis system user cannot reach ${dir}: give the folders above it execute permission for others (chmod o+x).`);
  }
}

function runningPid(dir) {
  const pidFile = path.join(dir, "redis.pid");
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, "utf8").trim());
  try {
    process.kill(pid, 0);
    return pid;
  } catch {
    return null;
  }
}

/**
 * Starts redis-server for dataDir on 127.0.0.1:port (daemonised, its log and pid file in the data folder) and
 * resolves with its REDIS_URL once it accepts connections. A throwaway server (tests, benchmarks) saves nothing.
 */
export async function startRedis({ dataDir: projectDataDir, port, throwaway = false }) {
  const bin = ensureRedis();
  const dir = redisDir(projectDataDir);
  const url = `redis://127.0.0.1:${port}`;
  if (runningPid(dir)) return url;
  if (await isPortTaken(port)) {
    throw new Error(`Port ${port} on 127.0.0.1 is already taken by another program, so Strutroom's Redis cannot start. Stop that program or choose another port with STRUTROOM_REDIS_PORT=<port>.`);
  }
  ownFolder(dir);
  const args = [
    "--bind", "127.0.0.1", "--port", String(port), "--protected-mode", "yes",
    "--dir", dir, "--daemonize", "yes", "--pidfile", path.join(dir, "redis.pid"), "--logfile", path.join(dir, "redis.log"),
    // Redis holds only passing traffic (socket.io's stream, Yjs relays): a snapshot a minute is plenty for the
    // cluster run, none for a throwaway server.
    "--save", throwaway ? "" : "60 1", "--appendonly", "no",
  ];
  const [command, fullArgs] = process.getuid?.() === 0 ? ["runuser", ["-u", "redis", "--", bin, ...args]] : [bin, args];
  const result = spawnSync(command, fullArgs, { encoding: "utf8" });
  if (result.status !== 0) throw new Error(`redis-server failed to start: ${result.stderr || result.stdout} (see ${path.join(dir, "redis.log")})`);
  await waitForPort(port, "Redis", 30_000);
  return url;
}

/** Stops the Redis server of dataDir cleanly (SIGTERM, then waits up to 10 s for it to save and exit). */
export async function stopRedis(projectDataDir) {
  const dir = redisDir(projectDataDir);
  const pid = runningPid(dir);
  if (!pid) return;
  process.kill(pid, "SIGTERM");
  for (let waited = 0; waited < 10_000; waited += 100) {
    try {
      process.kill(pid, 0);
    } catch {
      return;
    }
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  throw new Error(`Redis (pid ${pid}) did not stop within 10 s; see ${path.join(dir, "redis.log")}.`);
}

/** Deletes a throwaway Redis data folder wherever redisDir placed it. */
export function removeRedisData(dataDir) {
  rmSync(redisDir(dataDir), { recursive: true, force: true });
}
