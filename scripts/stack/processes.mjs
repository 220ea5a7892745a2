// Child processes of the stack: each line of their output is prefixed with the service name, a service that dies is
// restarted with back-off, and all of them are stopped together when the parent exits or is interrupted.
import { spawn, execFileSync } from "node:child_process";
import { writeFileSync } from "node:fs";

const children = new Set();
/** Set once the stack is shutting down: nothing is restarted after that. */
let stopping = false;

const FIRST_RESTART_MS = 500;
const LONGEST_RESTART_MS = 10_000;
/** A process that stayed up this long is healthy again: its next crash restarts at once. */
const STABLE_AFTER_MS = 30_000;

/**
 * Starts a long-running service; its output is prefixed with [name]. With `restart`, a process that exits without
 * being stopped is started again after a back-off (0.5 s doubling to 10 s, reset once it has run 30 s), and the
 * reason (exit code or signal) is logged either way. With `pidFile`, the current process id is written there.
 */
export function startProcess(name, command, args, { env = process.env, cwd = process.cwd(), quiet = false, restart = false, pidFile } = {}) {
  let delay = FIRST_RESTART_MS;
  const launch = () => {
    const started = Date.now();
    const child = spawn(command, args, { env, cwd, stdio: ["ignore", "pipe", "pipe"], detached: true });
    children.add(child);
    if (pidFile) writeFileSync(pidFile, String(child.pid));
    const relay = (stream, out) => {
      let buffer = "";
      stream.on("data", (chunk) => {
        buffer += chunk.toString();
        const lines = buffer.split("\n");
        buffer = lines.pop() ?? "";
        if (!quiet) for (const line of lines) out.write(`[${name}] ${line}\n`);
      });
    };
    relay(child.stdout, process.stdout);
    relay(child.stderr, process.stderr);
    child.on("exit", (code, signal) => {
      children.delete(child);
      if (child.stopping || stopping) return;
      const why = signal ? `killed by ${signal}` : `exit code ${code}`;
      if (!restart) return console.error(`[${name}] exited (${why}).`);
      if (Date.now() - started >= STABLE_AFTER_MS) delay = FIRST_RESTART_MS;
      // Always logged, also for quiet services: a restart is something the operator must see.
      console.error(`[${name}] exited (${why}); restarting in ${(delay / 1000).toFixed(1)} s.`);
      setTimeout(() => {
        if (!stopping) launch();
      }, delay).unref();
      delay = Math.min(delay * 2, LONGEST_RESTART_MS);
    });
    return child;
  };
  return launch();
}

/** Stops every service started here (the whole process group of each). */
export async function stopAll() {
  stopping = true;
  const exits = [...children].map(
    (child) =>
      new Promise((resolve) => {
        child.stopping = true;
        child.once("exit", resolve);
        try { process.kill(-child.pid, "SIGTERM"); } catch { resolve(); }
        setTimeout(() => { try { process.kill(-child.pid, "SIGKILL"); } catch { /* already gone */ } resolve(); }, 5000).unref();
      }),
  );
  await Promise.all(exits);
}

/** Runs a command to completion with inherited output; returns its exit code. */
export function run(command, args, { env = process.env, cwd = process.cwd() } = {}) {
  return new Promise((resolve) => {
    const child = spawn(command, args, { env, cwd, stdio: "inherit" });
    child.on("exit", (code, signal) => resolve(code ?? (signal ? 1 : 0)));
  });
}

/** Installs npm dependencies when node_modules is missing or older than package-lock.json. */
export function ensureDependencies(root) {
  const marker = `${root}/node_modules/.package-lock.json`;
  try {
    execFileSync("sh", ["-c", `test -f "${marker}" && test ! "${root}/package-lock.json" -nt "${marker}"`]);
  } catch {
    console.log("[setup] installing npm dependencies (npm ci)…");
    execFileSync("npm", ["ci", "--no-audit", "--no-fund"], { cwd: root, stdio: "inherit" });
  }
}
