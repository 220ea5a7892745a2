// The realtime process: one HTTP server on loopback carrying socket.io (presence, session, pins and threads) and
// the Yjs websocket endpoint, told apart by path on the `upgrade` event.
import { createServer } from "node:http";
import { Server } from "socket.io";
import { pingDatabase } from "@/db/queries/health";
import { checkHealth } from "@/lib/health";
import { realtime } from "@/lib/limits";
import { abilitiesOf } from "@/lib/permissions";
import { SOCKET_PATH, YJS_PATH_PREFIX } from "@/lib/realtime/events";
import { getLiveSession } from "@/db/queries/review-sessions";
import { authenticate, isAllowedOrigin, isRefusal } from "./auth";
import { closeRedis, clusterAdapter, connectRedis } from "./cluster";
import { createCursorBatcher } from "./cursor-batcher";
import { projectRoom, userRoom, type RealtimeServer } from "./context";
import { startLiveEventPublisher } from "./live-events";
import { flushViews } from "./live-session-state";
import { registerPinEvents } from "./pin-events";
import { broadcastPresence, followSessionChanges, registerSessionEvents } from "./session-events";
import { createYjsUpgradeHandler } from "./yjs";
import { createYjsRelay } from "./yjs-relay";

/**
 * Builds the realtime server (not yet listening); close() stores everything pending and stops it. With redisUrl
 * it is one of several nodes sharing rooms and live documents (server/cluster.ts); without, it runs alone.
 */
export async function createRealtimeServer({ appUrl, databaseUrl, redisUrl }: { appUrl: string; databaseUrl: string; redisUrl?: string }) {
  const redis = redisUrl ? await connectRedis(redisUrl) : null;
  const relay = redis ? await createYjsRelay(redis) : null;
  const httpServer = createServer((request, response) => {
    const json = (status: number, body: unknown) => response.writeHead(status, { "content-type": "application/json", "cache-control": "no-store" }).end(JSON.stringify(body));
    if (request.method === "GET" && request.url === "/health") {
      void checkHealth("realtime", pingDatabase).then(({ status, body }) => json(status, body));
      return;
    }
    json(404, { error: "Not found." });
  });
  const io: RealtimeServer = new Server(httpServer, {
    path: SOCKET_PATH,
    // Room above the per-event cap (server/handle-event.ts answers oversized events with an error); beyond this
    // socket.io closes the connection.
    maxHttpBufferSize: 16 * realtime.socketPayloadBytes,
    cors: { origin: new URL(appUrl).origin, credentials: true },
    // CORS does not cover websockets: browsers from other sites are turned away here.
    allowRequest: (request, callback) => callback(null, isAllowedOrigin(request.headers, appUrl)),
    // socket.io attaches its own upgrade listener; the Yjs paths are routed below instead.
    destroyUpgrade: false,
    // Websockets only: a connection stays on the node that accepted it, so nodes behind a load balancer need no
    // sticky sessions (long-polling would spread one session's requests over several nodes).
    transports: ["websocket"],
    ...(redis ? { adapter: clusterAdapter(redis) } : {}),
  });
  const yjs = createYjsUpgradeHandler({ appUrl, relay });
  const cursors = createCursorBatcher(io);
  followSessionChanges(io);
  const liveEvents = startLiveEventPublisher({ io, yjs, connectionString: databaseUrl });
  httpServer.on("upgrade", (request, socket, head) => {
    const url = request.url ?? "";
    if (url.startsWith(YJS_PATH_PREFIX)) yjs.handleUpgrade(request, socket, head);
    // socket.io answers its own path; any other upgrade is closed rather than left hanging.
    else if (!url.startsWith(`${SOCKET_PATH}/`)) socket.end("HTTP/1.1 404 Not Found\r\nConnection: close\r\nContent-Length: 0\r\n\r\n");
  });

  io.use((socket, next) => {
    authenticate(socket.request.headers.cookie, socket.handshake.auth?.projectId).then(
      (who) => {
        if (isRefusal(who)) return next(Object.assign(new Error(who.message), { data: { status: who.status } }));
        socket.data = { user: who.user, role: who.role, projectId: who.projectId, following: true };
        next();
      },
      (error: unknown) => {
        console.error("[realtime] handshake failed", error);
        next(Object.assign(new Error("Something went wrong on our side. Please try again."), { data: { status: 500 } }));
      },
    );
  });

  io.on("connection", (socket) => {
    const { user, role, projectId } = socket.data;
    void socket.join([projectRoom(projectId), userRoom(user.id)]);
    registerSessionEvents(io, socket, cursors);
    registerPinEvents(io, socket);
    socket.on("disconnect", () => {
      void broadcastPresence(io, projectId).catch((error) => console.error("[realtime] presence failed", error));
    });
    void (async () => {
      const session = await getLiveSession({ projectId });
      socket.emit("welcome", {
        user: { id: user.id, name: user.name, role },
        abilities: abilitiesOf(role),
        session,
        serverTime: new Date().toISOString(),
      });
      await broadcastPresence(io, projectId);
    })().catch((error) => console.error("[realtime] welcome failed", error));
  });

  return {
    httpServer,
    io,
    /** Stops accepting, closes every connection and writes what is pending (views, Yjs documents). */
    async close() {
      cursors.close();
      await liveEvents.stop();
      await yjs.close();
      await new Promise<void>((resolve) => io.close(() => resolve()));
      await flushViews();
      await relay?.stop();
      if (redis) await closeRedis(redis);
    },
  };
}
