// Several realtime nodes behind one site (`npm run start:cluster`, README "Running on several machines") share
// rooms and live documents through Redis when REDIS_URL is set; without it the server runs alone (`npm start`).
// Redis only carries messages between nodes: everything that must last is in PostgreSQL first.
import { randomBytes } from "node:crypto";
import { createAdapter } from "@socket.io/redis-streams-adapter";
import { createClient } from "redis";
import type { NodeToNodeEvents, RealtimeServer } from "./context";

function newClient(url: string) {
  return createClient({ url });
}
export type RedisClient = ReturnType<typeof newClient>;

/** This process's id among the nodes (relayed Yjs messages carry it so a node skips its own). */
export const NODE_ID = randomBytes(8);

// Nodes learn of each other through heartbeats on the stream; a node killed outright is dropped after
// HEARTBEAT_TIMEOUT_MS (cross-node questions such as presence's fetchSockets wait for every known node till then).
const HEARTBEAT_MS = 1000;
export const HEARTBEAT_TIMEOUT_MS = 3000;

/** Connects to Redis; errors are logged once per outage, and node-redis reconnects on its own. */
export async function connectRedis(url: string): Promise<RedisClient> {
  const client = newClient(url);
  let down = false;
  client.on("error", (error: Error) => {
    if (!down) console.error("[realtime] Redis connection lost; reconnecting:", error.message);
    down = true;
  });
  client.on("ready", () => {
    if (down) console.log("[realtime] Redis connection back");
    down = false;
  });
  await client.connect();
  return client;
}

/** Set once this process runs as one node of several. */
let clustered = false;

/** The socket.io adapter: rooms across nodes on a Redis stream (which, unlike pub/sub, survives a short disconnect). */
export function clusterAdapter(client: RedisClient) {
  clustered = true;
  return createAdapter(client, {
    streamName: "strutroom:socket.io",
    channelPrefix: "strutroom:socket.io",
    heartbeatInterval: HEARTBEAT_MS,
    heartbeatTimeout: HEARTBEAT_TIMEOUT_MS,
  });
}

/** Sends an event to the other nodes (in stream order with room broadcasts); a node running alone has none. */
export function tellOtherNodes<E extends keyof NodeToNodeEvents>(io: RealtimeServer, event: E, ...args: Parameters<NodeToNodeEvents[E]>): void {
  if (clustered) io.serverSideEmit(event, ...args);
}
