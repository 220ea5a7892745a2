// Types of redis.mjs for the TypeScript scripts and tests that start their own Redis.
export function startRedis(options: { dataDir: string; port: number; throwaway?: boolean }): Promise<string>;
export function stopRedis(dataDir: string): Promise<void>;
export function redisDir(dataDir: string): string;
export function removeRedisData(dataDir: string): void;
