// Entry of the realtime process (`tsx server/index.ts`, started by scripts/stack/services.mjs).
import { closeDb } from "@/db/client";
import { createRealtimeServer } from "./app";

function required(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`${name} is not set.`);
  return value;
}

const port = Number(required("REALTIME_PORT"));
// REDIS_URL makes this one of several nodes (npm run start:cluster); without it the server runs alone.
const server = await createRealtimeServer({ appUrl: required("APP_URL"), databaseUrl: required("DATABASE_URL"), redisUrl: process.env.REDIS_URL || undefined });
server.httpServer.listen(port, "127.0.0.1", () => console.log(`[realtime] listening on 127.0.0.1:${port}`));

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`[realtime] ${signal}: storing live documents and stopping…`);
  try {
    await server.close();
    await closeDb();
    process.exit(0);
  } catch (error) {
    console.error("[realtime] shutdown failed", error);
    process.exit(1);
  }
}
process.on("SIGTERM", () => void stop("SIGTERM"));
process.on("SIGINT", () => void stop("SIGINT"));
