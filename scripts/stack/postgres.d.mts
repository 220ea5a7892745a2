// Types of postgres.mjs for the TypeScript scripts that start their own cluster (scripts/bench/realtime.ts).
export function startPostgres(options: { dataDir: string; port: number; database?: string; throwaway?: boolean }): Promise<string>;
export function stopPostgres(dataDir: string): void;
export function clusterDir(dataDir: string): string;
export function removeCluster(dataDir: string): void;
