// Types of processes.mjs for the TypeScript tests.
import type { ChildProcess } from "node:child_process";

export function startProcess(
  name: string,
  command: string,
  args: string[],
  options?: { env?: NodeJS.ProcessEnv; cwd?: string; quiet?: boolean; restart?: boolean; pidFile?: string },
): ChildProcess;
export function stopAll(): Promise<void>;
export function run(command: string, args: string[], options?: { env?: NodeJS.ProcessEnv; cwd?: string }): Promise<number>;
export function ensureDependencies(root: string): void;
