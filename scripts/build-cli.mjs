// Builds the command line analysis (scripts/analyze.ts) to one plain JS file, .build/cli/analyze.mjs, so
// `npm run analyze` starts on Node alone, without a TypeScript loader. esbuild is the bundler tsx itself runs on
// (in node_modules through tsx). The build is skipped while the output is newer than every file that went into it
// (esbuild's metafile lists them), so a run pays only a few file stats; `--force` rebuilds.
import { existsSync, readFileSync, renameSync, statSync, writeFileSync } from "node:fs";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { build } from "esbuild";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");
const outDir = path.join(root, ".build", "cli");
export const ANALYZE_CLI = path.join(outDir, "analyze.mjs");
const metaFile = path.join(outDir, "analyze.meta.json");

// What shapes the output without being one of its inputs: this script's options, the path aliases, the installed
// packages (an `npm ci` that changes a package's files may keep their paths, so the lock file is what tells).
const BUILD_SETTINGS = ["scripts/build-cli.mjs", "tsconfig.json", "package-lock.json"];

/** True when the built file exists and neither an input listed by its last build nor a build setting changed since. */
function fresh() {
  if (!existsSync(ANALYZE_CLI) || !existsSync(metaFile)) return false;
  const built = statSync(ANALYZE_CLI).mtimeMs;
  const inputs = [...Object.keys(JSON.parse(readFileSync(metaFile, "utf8")).inputs), ...BUILD_SETTINGS];
  return inputs.every((input) => {
    const file = path.join(root, input);
    return existsSync(file) && statSync(file).mtimeMs <= built;
  });
}

/** Builds the CLI unless it is up to date (or always, with force). */
export async function buildCli({ force = false } = {}) {
  if (!force && fresh()) return false;
  const result = await build({
    absWorkingDir: root,
    entryPoints: ["scripts/analyze.ts"],
    outfile: `${ANALYZE_CLI}.${process.pid}.tmp`,
    bundle: true,
    platform: "node",
    format: "esm",
    target: "node20",
    tsconfig: "tsconfig.json",
    metafile: true,
    logLevel: "warning",
    // Bundled CommonJS packages call require(); an ES module has none of its own.
    banner: { js: 'import { createRequire as __strutroomRequire } from "node:module"; const require = __strutroomRequire(import.meta.url);' },
  });
  // Renamed into place, so two builds at once (parallel test files) never leave a half-written file to run.
  writeFileSync(`${metaFile}.${process.pid}.tmp`, JSON.stringify({ inputs: result.metafile.inputs }));
  renameSync(`${ANALYZE_CLI}.${process.pid}.tmp`, ANALYZE_CLI);
  renameSync(`${metaFile}.${process.pid}.tmp`, metaFile);
  return true;
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  await buildCli({ force: process.argv.includes("--force") });
}
