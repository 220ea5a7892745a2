// Several realtime nodes behind one site (`npm run start:cluster`, README "Running on several machines") share
// rooms and live documents through Redis when REDIS_URL is set; without it the server runs alone (`npm start`).
// Redis only carries messages between nodes: everything that must last is in PostgreSQL first.
import { randomBytes } from "node:crypto";
import { createAdapter } from "@socket.io/redis-streams-adapter";
import { createClient } from "redis";
import { Adapter, MessageType, type BroadcastOptions } from "socket.io-adapter";
import type { NodeToNodeEvents, RealtimeServer } from "./context";

// While Redis is down node-redis queues commands and sends them once it is back (so other nodes get what was
// broadcast meanwhile, late but in order); the cap bounds the memory a long outage can take (beyond it, commands
// are refused and the other nodes' clients catch up from PostgreSQL when they reconnect).
const OFFLINE_QUEUE_MAX = 10_000;

function newClient(url: string) {
  return createClient({ url, commandsQueueMaxLength: OFFLINE_QUEUE_MAX });
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

type Broadcaster = Adapter & { publish(message: { type: MessageType.BROADCAST; data: unknown }): void };

/**
 * The library's broadcast waits until Redis has taken the message before it delivers to this node's own sockets:
 * a round trip on every room event, and during a Redis outage every local client would hear nothing until Redis
 * is back. Here this node's sockets get the packet at once and the message to the others is published beside it
 * (queued by node-redis while Redis is down). The library offers no option for this, hence the override; the
 * encoding of the options is the library's own (rooms and exceptions as arrays).
 */
function deliverLocallyFirst(adapter: Broadcaster): void {
  adapter.broadcast = (packet: unknown, opts: BroadcastOptions) => {
    if (!opts.flags?.local) {
      adapter.publish({ type: MessageType.BROADCAST, data: { packet, opts: { rooms: [...opts.rooms], except: [...(opts.except ?? [])], flags: opts.flags } } });
    }
    Adapter.prototype.broadcast.call(adapter, packet, opts);
  };
}

/**
 * The streams adapter sends its one-off messages (presence's fetchSockets, serverSideEmit) with PUBLISH and drops the
 * promise: a PUBLISH that times out (node-redis's 5 s command timeout, met on a loaded machine or while Redis is
 * down) or is refused by the full offline queue rejects with nobody listening, and Node ends the process (seen under
 * bench:realtime at load average 27). The adapter is given the client through this view, whose publish has its
 * failure logged; that message is lost as during any Redis outage (presence is asked again on the next join or leave).
 */
export function withPublishFailuresLogged<C extends { publish(...args: never[]): Promise<unknown> }>(client: C): C {
  return new Proxy(client, {
    get(target, property) {
      const value: unknown = Reflect.get(target, property, target);
      if (typeof value !== "function") return value;
      if (property !== "publish") return value.bind(target);
      return (...args: unknown[]) => {
        const sent = (value as (...a: unknown[]) => Promise<unknown>).apply(target, args);
        sent.catch((error: Error) => console.error("[realtime] a message to the other nodes was not sent:", error.message));
        return sent;
      };
    },
  });
}

/** The socket.io adapter: rooms across nodes on a Redis stream (which, unlike pub/sub, survives a short disconnect). */
export function clusterAdapter(client: RedisClient) {
  clustered = true;
  const create = createAdapter(withPublishFailuresLogged(client), {
    streamName: "strutroom:socket.io",
    channelPrefix: "strutroom:socket.io",
    heartbeatInterval: HEARTBEAT_MS,
    heartbeatTimeout: HEARTBEAT_TIMEOUT_MS,
  });
  // socket.io calls this with `new`: a plain function (not an arrow) that returns the adapter it made.
  return function localFirstAdapter(nsp: Parameters<typeof create>[0]) {
    const adapter = create(nsp);
    deliverLocallyFirst(adapter as unknown as Broadcaster);
    return adapter;
  };
}

/** Closes a Redis connection: waits for pending commands when Redis answers, drops them when it is down (shutdown must not hang on an outage). */
export async function closeRedis(client: RedisClient): Promise<void> {
  if (client.isReady) await client.close().catch(() => client.destroy());
  else client.destroy();
}

/** Sends an event to the other nodes (in stream order with room broadcasts); a node running alone has none. */
export function tellOtherNodes<E extends keyof NodeToNodeEvents>(io: RealtimeServer, event: E, ...args: Parameters<NodeToNodeEvents[E]>): void {
  if (clustered) io.serverSideEmit(event, ...args);
}
