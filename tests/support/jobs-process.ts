// A jobs process (server/jobs/main.ts, the same command as scripts/stack/services.mjs) as a child of the test.
import { spawn, type ChildProcess } from "node:child_process";
import { freePort } from "@/scripts/stack/ports.mjs";

export type JobsProcess = { stop: () => Promise<void>; output: () => string; running: () => boolean };

/**
 * Starts a jobs worker with the test's environment plus `env`, its health endpoint on a port of its own (several
 * run side by side); stop() sends SIGTERM and waits for it to exit.
 */
export async function startJobsProcess(env: Record<string, string> = {}): Promise<JobsProcess> {
  let output = "";
  const child: ChildProcess = spawn("node_modules/.bin/tsx", ["--conditions=react-server", "server/jobs/main.ts"], {
    env: { ...process.env, NODE_ENV: "production", JOBS_PORT: String(await freePort()), ...env },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout?.on("data", (chunk) => (output += chunk));
  child.stderr?.on("data", (chunk) => (output += chunk));
  return {
    output: () => output,
    /** Still running, and said it serves its queues. */
    running: () => child.exitCode === null && child.signalCode === null && output.includes("[jobs] running:"),
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once("exit", () => resolve());
        child.kill("SIGTERM");
      }),
  };
}
