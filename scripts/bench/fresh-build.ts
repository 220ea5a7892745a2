// The browser benchmarks time the production build (`next start`). A build older than the code would time code that
// no longer exists, so a missing or stale build is rebuilt first: stale when any file the app is built from changed
// after the build was made.
import { execFileSync } from "node:child_process";
import { existsSync, readdirSync, statSync } from "node:fs";
import path from "node:path";

const SOURCES = ["app", "components", "lib", "db", "server", "public", "proxy.ts", "next.config.ts", "postcss.config.mjs", "tailwind.config.ts", "package.json", "package-lock.json"];

/** Newest modification time (ms) of a file or of any file below a folder. */
function newestChange(target: string): number {
  if (!existsSync(target)) return 0;
  const stat = statSync(target);
  if (!stat.isDirectory()) return stat.mtimeMs;
  return readdirSync(target).reduce((newest, name) => Math.max(newest, newestChange(path.join(target, name))), stat.mtimeMs);
}

/** Runs `next build` in `root` when there is no build or the code changed since it was made. */
export function ensureFreshBuild(root: string): void {
  const marker = path.join(root, ".next", "BUILD_ID");
  const built = existsSync(marker) ? statSync(marker).mtimeMs : 0;
  const changed = Math.max(...SOURCES.map((source) => newestChange(path.join(root, source))));
  if (built >= changed) return;
  console.log(built ? "[bench] the code changed since the last production build: running `next build` (a minute or more)" : "[bench] no production build: running `next build` (a minute or more)");
  execFileSync("node_modules/.bin/next", ["build"], { cwd: root, stdio: "inherit", env: { ...process.env, NODE_ENV: "production" } });
}
