// Debian packages the product needs on a fresh machine, installed with apt-get when missing.
import { execFileSync, spawnSync } from "node:child_process";
import { existsSync, readdirSync } from "node:fs";

let aptUpdated = false;

function aptInstall(packages) {
  if (process.getuid?.() !== 0) {
    throw new Error(`Missing Debian packages: ${packages.join(", ")}. Install them with: sudo apt-get install -y ${packages.join(" ")}`);
  }
  console.log(`[setup] installing Debian packages: ${packages.join(", ")}`);
  const env = { ...process.env, DEBIAN_FRONTEND: "noninteractive" };
  if (!aptUpdated) {
    execFileSync("apt-get", ["update", "-qq"], { stdio: "inherit", env });
    aptUpdated = true;
  }
  execFileSync("apt-get", ["install", "-y", "-qq", "--no-install-recommends", ...packages], { stdio: "inherit", env });
}

/** The folder holding initdb and pg_ctl (Debian keeps them in the versioned lib folder, not on PATH). */
export function ensurePostgres() {
  const find = () => {
    const base = "/usr/lib/postgresql";
    if (!existsSync(base)) return null;
    const versions = readdirSync(base).filter((v) => existsSync(`${base}/${v}/bin/pg_ctl`)).sort((a, b) => Number(b) - Number(a));
    return versions.length ? `${base}/${versions[0]}/bin` : null;
  };
  let bin = find();
  if (!bin) {
    aptInstall(["postgresql"]);
    bin = find();
  }
  if (!bin) throw new Error("PostgreSQL could not be found after installing it (looked in /usr/lib/postgresql/*/bin).");
  return bin;
}

function onPath(command) {
  return spawnSync("sh", ["-c", `command -v ${command}`]).status === 0;
}

/** Debian's chromium, for browser tests and the viewer benchmark. */
export function ensureChromium() {
  if (!onPath("chromium")) aptInstall(["chromium"]);
  return execFileSync("sh", ["-c", "command -v chromium"]).toString().trim();
}

/** pdftoppm and pdftotext, to read the review report in tests. */
export function ensurePoppler() {
  if (!onPath("pdftoppm") || !onPath("pdftotext")) aptInstall(["poppler-utils"]);
}

/** Debian's redis-server, for `npm run start:cluster` and the cluster test (`npm start` needs no Redis). */
export function ensureRedis() {
  if (!onPath("redis-server")) aptInstall(["redis-server"]);
  return execFileSync("sh", ["-c", "command -v redis-server"]).toString().trim();
}
