// Runs the command line analysis as `npm run analyze` does: the built plain JS file (scripts/build-cli.mjs builds it
// when a source changed), on Node alone.
import { spawnSync } from "node:child_process";
import { join } from "node:path";

let built = false;

export function runAnalyzeCli(...args: string[]): { code: number | null; stdout: string; stderr: string } {
  if (!built) {
    const build = spawnSync(process.execPath, ["scripts/build-cli.mjs"], { encoding: "utf8", timeout: 120_000 });
    if (build.status !== 0) throw new Error(`building the CLI failed: ${build.stderr}`);
    built = true;
  }
  const out = spawnSync(process.execPath, [join(process.cwd(), ".build/cli/analyze.mjs"), ...args], { encoding: "utf8", timeout: 60_000, maxBuffer: 256 * 1024 * 1024 });
  return { code: out.status, stdout: out.stdout, stderr: out.stderr };
}
