// Issue 14 item 6 for Redis: `npm run start:cluster` and the cluster test work from any folder. As root, Redis runs
// as the `redis` system user, who cannot enter a private folder (a clone in /root, say); its data then lives under
// /var/lib/strutroom in a folder named after the project path. Here the "project" is a folder closed to others.
import { existsSync, mkdirSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { createClient } from "redis";
import { freePort } from "@/scripts/stack/ports.mjs";
import { redisDir, removeRedisData, startRedis, stopRedis } from "@/scripts/stack/redis.mjs";

const privateProject = mkdtempSync(path.join(tmpdir(), "strutroom-private-"));
const dataDir = path.join(privateProject, ".data", "redis");
afterAll(async () => {
  await stopRedis(dataDir).catch(() => undefined);
  removeRedisData(dataDir);
  rmSync(privateProject, { recursive: true, force: true });
});

describe.runIf(process.getuid?.() === 0)("Redis data folder (as root)", () => {
  it("runs from a folder the redis user cannot enter, keeping its data under /var/lib/strutroom, and stops cleanly", async () => {
    mkdirSync(path.dirname(dataDir), { recursive: true, mode: 0o700 });
    // mkdtemp makes the folder 0700: the redis system user cannot pass through it.
    const where = redisDir(dataDir);
    expect(where.startsWith("/var/lib/strutroom/")).toBe(true);
    expect(where).toContain("strutroom-private-");

    const url = await startRedis({ dataDir, port: await freePort(), throwaway: true });
    const client = createClient({ url });
    await client.connect();
    expect(await client.ping()).toBe("PONG");
    await client.quit();
    expect(existsSync(path.join(where, "redis.pid"))).toBe(true);

    await stopRedis(dataDir);
    // Redis removes its pid file on a clean exit (SIGTERM), not when killed.
    expect(existsSync(path.join(where, "redis.pid"))).toBe(false);
  });
});
