// Where a Debian service's data folder really lives. As root, PostgreSQL and Redis run as their own system users
// (`postgres`, `redis`), who cannot enter a private folder (a project cloned into /root, say); the data then lives
// under /var/lib/strutroom in a folder named after the project path, so `npm start` and `npm test` work from any
// folder without anyone changing permissions.
import { mkdirSync } from "node:fs";
import { spawnSync } from "node:child_process";
import path from "node:path";

export const FALLBACK_ROOT = "/var/lib/strutroom";

function canReach(user, dir) {
  return spawnSync("runuser", ["-u", user, "--", "test", "-x", dir]).status === 0;
}

const announced = new Set();

/** dataDir itself when `user` can reach its parent folder (or we are not root), else the fallback for it. */
export function reachableDir(user, dataDir) {
  if (process.getuid?.() !== 0) return dataDir;
  const parent = path.dirname(dataDir);
  mkdirSync(parent, { recursive: true });
  if (canReach(user, parent)) return dataDir;
  const fallback = path.join(FALLBACK_ROOT, dataDir.replace(/^\//, "").replace(/[^A-Za-z0-9._]+/g, "-"));
  if (!announced.has(dataDir)) {
    announced.add(dataDir);
    console.log(`[${user}] the ${user} system user cannot reach ${parent}, so this data lives in ${fallback}`);
  }
  return fallback;
}
