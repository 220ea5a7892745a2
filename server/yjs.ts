// The Yjs websocket endpoint (/yjs/<projectId>) on the realtime port: authenticated like the sockets, with each
// project's document stored in PostgreSQL (every update appended, merged by compaction) and reloaded on demand.
import type { IncomingMessage } from "node:http";
import type { Duplex } from "node:stream";
import { WebSocketServer, type WebSocket } from "ws";
import * as Y from "yjs";
import { docs, getYDoc, setPersistence, setupWSConnection, type WSSharedDoc } from "@y/websocket-server/utils";
import { appendYjsUpdate, compactYjsUpdates, loadYjsUpdates } from "@/db/queries/live-documents";
import { YJS_PATH_PREFIX } from "@/lib/realtime/events";
import { authorize } from "@/lib/permissions";
import { authenticate, isAllowedOrigin, isRefusal } from "./auth";
import { readClientMessage } from "./yjs-messages";

const LOADED_ORIGIN = Symbol("loaded from PostgreSQL");
const COMPACT_EVERY_MS = 5 * 60_000;

const loading = new Map<string, Promise<void>>();
const pendingWrites = new Set<Promise<void>>();

function track(write: Promise<void>) {
  pendingWrites.add(write);
  void write.finally(() => pendingWrites.delete(write));
}

/** Loads the stored updates into a fresh document, then stores every later update as it happens. */
function bindState(projectId: string, doc: WSSharedDoc) {
  const loaded = loadYjsUpdates({ projectId }).then((rows) => {
    if (rows.length) Y.applyUpdate(doc, Y.mergeUpdates(rows.map((row) => row.update)), LOADED_ORIGIN);
    doc.on("update", (update: Uint8Array, origin: unknown) => {
      if (origin === LOADED_ORIGIN) return;
      track(appendYjsUpdate({ projectId, update }).catch((error) => console.error("[realtime] could not store a Yjs update", error)));
    });
  });
  loading.set(projectId, loaded);
}

/** When the last client leaves: store the whole state once more (covers any failed append), then compact. */
async function writeState(projectId: string, doc: WSSharedDoc) {
  loading.delete(projectId);
  await Promise.allSettled([...pendingWrites]);
  try {
    await appendYjsUpdate({ projectId, update: Y.encodeStateAsUpdate(doc) });
    await compactYjsUpdates({ projectId });
  } catch (error) {
    console.error("[realtime] could not store the Yjs document", error);
  }
}

// Viewers may read the live document but not change it. Messages are decoded the way the Yjs server decodes them
// (readClientMessage), never compared byte by byte: 0x80 0x00 is as much a zero as 0x00.
function isChange(message: ArrayBuffer | Buffer): boolean {
  const bytes = message instanceof ArrayBuffer ? new Uint8Array(message) : new Uint8Array(message.buffer, message.byteOffset, message.byteLength);
  return readClientMessage(bytes).kind !== "read";
}

/** Lets a connection read the document but drops its changes (the library registers its own message listener). */
function makeReadOnly(ws: WebSocket) {
  const on = ws.on.bind(ws);
  ws.on = ((event: string, listener: (...args: unknown[]) => void) =>
    event === "message"
      ? on("message", (data: ArrayBuffer | Buffer, ...rest: unknown[]) => (isChange(data) ? undefined : listener(data, ...rest)))
      : on(event, listener)) as WebSocket["on"];
}

/** The project's document, loaded from PostgreSQL before any client sees it. */
async function openDocument(projectId: string): Promise<void> {
  // Two tries: the last client may leave while this one waits, and the library then drops that document.
  for (let attempt = 0; attempt < 2; attempt += 1) {
    const doc = getYDoc(projectId);
    try {
      await loading.get(projectId);
    } catch (error) {
      // A failed load must not leave an empty document behind for the next client.
      docs.delete(projectId);
      loading.delete(projectId);
      doc.destroy();
      throw error;
    }
    if (docs.get(projectId) === doc) return;
  }
  throw new Error("The live document kept closing while it was opened.");
}

function refuse(socket: Duplex, status: number, message: string) {
  socket.end(`HTTP/1.1 ${status} ${message.replace(/[\r\n]/g, " ")}\r\nConnection: close\r\nContent-Length: 0\r\n\r\n`);
}

/** Handles a websocket upgrade to /yjs/<projectId>: authenticate, load the document, then hand over to Yjs. */
export function createYjsUpgradeHandler({ appUrl }: { appUrl: string }) {
  setPersistence({ provider: null, bindState, writeState });
  const wss = new WebSocketServer({ noServer: true });
  const compaction = setInterval(() => {
    for (const projectId of docs.keys()) void compactYjsUpdates({ projectId }).catch((error) => console.error("[realtime] compaction failed", error));
  }, COMPACT_EVERY_MS);
  compaction.unref();

  async function handleUpgrade(request: IncomingMessage, socket: Duplex, head: Buffer) {
    if (!isAllowedOrigin(request.headers.origin, appUrl)) return refuse(socket, 403, "Forbidden");
    const projectId = new URL(request.url ?? "/", "http://localhost").pathname.slice(YJS_PATH_PREFIX.length);
    const who = await authenticate(request.headers.cookie, projectId);
    if (isRefusal(who)) return refuse(socket, who.status, who.message);
    await openDocument(who.projectId);
    wss.handleUpgrade(request, socket, head, (ws) => {
      if (!authorize({ role: who.role, userId: who.user.id }, "notes.edit")) makeReadOnly(ws);
      setupWSConnection(ws, request, { docName: who.projectId });
    });
  }

  return {
    handleUpgrade(request: IncomingMessage, socket: Duplex, head: Buffer) {
      handleUpgrade(request, socket, head).catch((error) => {
        console.error("[realtime] Yjs upgrade failed", error);
        refuse(socket, 500, "Internal Server Error");
      });
    },
    /** Closes every Yjs connection and stores every open document (shutdown). */
    async close() {
      clearInterval(compaction);
      const open = [...docs.entries()];
      // Store the documents here, once, rather than from the library's close handlers that nobody awaits.
      setPersistence(null);
      for (const client of wss.clients) client.terminate();
      await Promise.all(open.map(([projectId, doc]) => writeState(projectId, doc)));
    },
  };
}
