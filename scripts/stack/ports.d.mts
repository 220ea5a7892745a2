// Types of ports.mjs for the TypeScript scripts.
export function isPortTaken(port: number): Promise<boolean>;
export function freePort(): Promise<number>;
export function waitForPort(port: number, name: string, timeoutMs?: number): Promise<void>;
