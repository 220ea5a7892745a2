// Child processes of the stack: each line of their output is prefixed with the service name, and all of them
// are stopped together when the parent exits or is interrupted.
import { spawn, execFileSync } from "node:child_process";

const children = new Set();

/** Starts a long-running service; its output is prefixed with [name]. */
export function startProcess(name, command, args, { env = process.env, cwd = process.cwd(), quiet = false } = {}) {
  const child = spawn(command, args, { env, cwd, stdio: ["ignore", "pipe", "pipe"], detached: true });
  children.add(child);
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
    if (!child.stopping) console.error(`[${name}] exited (${signal ?? code}).`);
  });
  return child;
}

/** Stops every service started here (the whole process group of each). */
export async function stopAll() {
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
