// The Yjs websocket endpoint (/yjs/<projectId>) on the realtime port: authenticated like the sockets, with each
// project's document stored in PostgreSQL (every change appended before it is applied, merged by compaction) and
// reloaded on demand.
import type { IncomingMessage } from "node:http";
import type { Duplex } from "node:stream";
import { WebSocketServer, type WebSocket } from "ws";
import * as Y from "yjs";
import * as encoding from "lib0/encoding";
import { writePermissionDenied } from "y-protocols/auth";
import { docs, getYDoc, setPersistence, setupWSConnection, type WSSharedDoc } from "@y/websocket-server/utils";
import { appendYjsUpdate, compactYjsUpdates, loadYjsUpdates, loadYjsUpdatesAfter } from "@/db/queries/live-documents";
import { formatBytes, realtime } from "@/lib/limits";
import { DOCUMENT_FULL_CODE, YJS_PATH_PREFIX } from "@/lib/realtime/events";
import { authorize } from "@/lib/permissions";
import { authenticate, isAllowedOrigin, isRefusal } from "./auth";
import { readClientMessage } from "./yjs-messages";
import { STORED, type YjsRelay } from "./yjs-relay";

const COMPACT_EVERY_MS = 5 * 60_000;
// With several nodes, each open document is also read back from PostgreSQL this often, so a change whose Redis
// message this node missed still arrives.
const CATCH_UP_EVERY_MS = 2_000;
// A change is written with up to five tries (0.1, 0.2, 0.4, 0.8 s apart) before its connection is closed.
const STORE_TRIES = 5;
const FIRST_RETRY_MS = 100;

const loading = new Map<string, Promise<void>>();
/** Projects with a failed write since their last stored row: the whole document state is stored next. */
const needsWholeState = new Set<string>();

/** Set when several nodes share documents (REDIS_URL): relays changes and awareness between them. */
let relay: YjsRelay | null = null;
/** Per open document, the id of the last stored row it has surely seen (catch-up reads the rows after it). */
const seenUpTo = new Map<string, number>();

/**
 * Loads the stored updates into a fresh document (later changes are stored by the message gate below). With
 * several nodes the relay subscribes first, so a change another node stores meanwhile arrives one way or the other.
 */
function bindState(projectId: string, doc: WSSharedDoc) {
  const loaded = (relay ? relay.open(projectId, doc) : Promise.resolve())
    .then(() => loadYjsUpdates({ projectId }))
    .then((rows) => {
      if (rows.length) Y.applyUpdate(doc, Y.mergeUpdates(rows.map((row) => row.update)), STORED);
      seenUpTo.set(projectId, rows.at(-1)?.id ?? 0);
    });
  loading.set(projectId, loaded);
}

/** Applies the rows stored since each open document was last read (changes relayed messages may have missed). */
async function catchUp() {
  for (const [projectId, doc] of docs) {
    const after = seenUpTo.get(projectId);
    if (after === undefined) continue;
    const rows = await loadYjsUpdatesAfter({ projectId, afterId: after });
    if (docs.get(projectId) !== doc || rows.length === 0) continue;
    Y.applyUpdate(doc, Y.mergeUpdates(rows.map((row) => row.update)), STORED);
    // Move the mark only past settled rows: a row with a lower id may still commit after a newer one.
    let mark = after;
    for (const row of rows) {
      if (!row.settled) break;
      mark = row.id;
    }
    seenUpTo.set(projectId, mark);
  }
}

/** Whole-state writes under way (started when a last client left), awaited on shutdown. */
const writingState = new Set<Promise<void>>();

/** When the last client leaves: store the whole state once more, then compact. */
function writeState(projectId: string, doc: WSSharedDoc): Promise<void> {
  relay?.close(projectId, doc);
  seenUpTo.delete(projectId);
  const write = storeWholeState(projectId, doc);
  writingState.add(write);
  void write.finally(() => writingState.delete(write));
  return write;
}

async function storeWholeState(projectId: string, doc: WSSharedDoc) {
  loading.delete(projectId);
  try {
    await appendYjsUpdate({ projectId, update: Y.encodeStateAsUpdate(doc) });
    await compactYjsUpdates({ projectId });
  } catch (error) {
    console.error("[realtime] could not store the Yjs document", error);
  }
}

/**
 * Stores one change, retrying with back-off. After any failed write the whole document state is stored before
 * anything else, so replaying the stored rows never depends on which single writes got through.
 */
async function storeChange(projectId: string, update: Uint8Array): Promise<void> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      const doc = docs.get(projectId);
      if (needsWholeState.has(projectId) && doc) await appendYjsUpdate({ projectId, update: Y.encodeStateAsUpdate(doc) });
      needsWholeState.delete(projectId);
      await appendYjsUpdate({ projectId, update });
      return;
    } catch (error) {
      needsWholeState.add(projectId);
      if (attempt >= STORE_TRIES) throw error;
      await new Promise((resolve) => setTimeout(resolve, FIRST_RETRY_MS * 2 ** (attempt - 1)));
    }
  }
}

/** y-websocket's top-level message type for auth messages (y-websocket's protocol: 0 sync, 1 awareness, 2 auth). */
const MESSAGE_AUTH = 2;
export const DOCUMENT_FULL_REASON = `The shared notes are full (${formatBytes(realtime.yjsDocumentBytes)}): your last change was not stored.`;

/**
 * The document's size in bytes once `update` is applied: its encoded state plus the part of the update it does not
 * hold yet (a reconnecting client re-sends what the server already has; only what is new counts). The whole state is
 * encoded for each change, which stays cheap up to the cap.
 */
function sizeAfter(doc: Y.Doc, update: Uint8Array): number {
  return Y.encodeStateAsUpdate(doc).byteLength + Y.diffUpdate(update, Y.encodeStateVector(doc)).byteLength;
}

/** Tells the client why (a y-protocols permission-denied message, which y-websocket logs) and closes for good. */
function refuseAsFull(ws: WebSocket) {
  const encoder = encoding.createEncoder();
  encoding.writeVarUint(encoder, MESSAGE_AUTH);
  writePermissionDenied(encoder, `${DOCUMENT_FULL_REASON} Copy it elsewhere, then remove older notes to make room.`);
  ws.send(encoding.toUint8Array(encoder), () => ws.close(DOCUMENT_FULL_CODE, DOCUMENT_FULL_REASON));
}

function bytesOf(data: ArrayBuffer | Buffer): Uint8Array {
  return data instanceof ArrayBuffer ? new Uint8Array(data) : new Uint8Array(data.buffer, data.byteOffset, data.byteLength);
}

/**
 * Hands a connection's messages to the Yjs server one at a time, in order (the library registers its own message
 * listener, which this wraps). Messages are decoded the way the Yjs server decodes them (readClientMessage), never
 * compared byte by byte: 0x80 0x00 is as much a zero as 0x00. A change passes only from a role with the right to
 * edit the notes, and only once it is stored in PostgreSQL, so no client is sent, and nothing is built on, a change
 * the database does not hold. When it cannot be stored the connection is closed: the client keeps the change and
 * sends it again when it reconnects.
 */
function gateMessages(ws: WebSocket, { projectId, mayEdit }: { projectId: string; mayEdit: boolean }) {
  const on = ws.on.bind(ws);
  let queue = Promise.resolve();
  async function admit(data: ArrayBuffer | Buffer): Promise<boolean> {
    const message = readClientMessage(bytesOf(data));
    if (message.kind === "read") return true;
    if (message.kind === "malformed" || !mayEdit) return false;
    const doc = docs.get(projectId);
    let size: number;
    try {
      size = doc ? sizeAfter(doc, message.update) : message.update.byteLength;
    } catch {
      return false; // an update Yjs cannot read: the library would fail on it too
    }
    if (size > realtime.yjsDocumentBytes) {
      refuseAsFull(ws);
      return false;
    }
    try {
      await storeChange(projectId, message.update);
      return true;
    } catch (error) {
      console.error("[realtime] could not store a Yjs change; closing the connection so the client sends it again", error);
      ws.close(1011, "Your change could not be stored yet.");
      return false;
    }
  }
  ws.on = ((event: string, listener: (...args: unknown[]) => void) => {
    if (event !== "message") return on(event, listener);
    return on("message", (data: ArrayBuffer | Buffer, ...rest: unknown[]) => {
      queue = queue
        .then(async () => {
          if ((await admit(data)) && ws.readyState === ws.OPEN) listener(data, ...rest);
        })
        .catch((error) => console.error("[realtime] Yjs message failed", error));
    });
  }) as WebSocket["on"];
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

// Who holds each open connection, so a team change can close that person's connections on that project.
const holders = new Map<WebSocket, { projectId: string; userId: string }>();
function holdConnection(ws: WebSocket, projectId: string, userId: string) {
  holders.set(ws, { projectId, userId });
  ws.once("close", () => holders.delete(ws));
}

/** Handles a websocket upgrade to /yjs/<projectId>: authenticate, load the document, then hand over to Yjs. */
export function createYjsUpgradeHandler({ appUrl, relay: nodes = null }: { appUrl: string; relay?: YjsRelay | null }) {
  relay = nodes;
  setPersistence({ provider: null, bindState, writeState });
  let catchingUp: Promise<void> | null = null;
  const runCatchUp = () => {
    catchingUp ??= catchUp()
      .catch((error) => console.error("[realtime] Yjs catch-up failed", error))
      .finally(() => (catchingUp = null));
  };
  const catchUpTimer = relay ? setInterval(runCatchUp, CATCH_UP_EVERY_MS) : null;
  catchUpTimer?.unref();
  relay?.onReconnect(runCatchUp);
  // A larger message closes the connection with 1009 "Message Too Big" (the reason the client sees).
  const wss = new WebSocketServer({ noServer: true, maxPayload: realtime.yjsUpdateBytes });
  const compaction = setInterval(() => {
    for (const projectId of docs.keys()) void compactYjsUpdates({ projectId }).catch((error) => console.error("[realtime] compaction failed", error));
  }, COMPACT_EVERY_MS);
  compaction.unref();

  async function handleUpgrade(request: IncomingMessage, socket: Duplex, head: Buffer) {
    if (!isAllowedOrigin(request.headers, appUrl)) return refuse(socket, 403, "Forbidden");
    const projectId = new URL(request.url ?? "/", "http://localhost").pathname.slice(YJS_PATH_PREFIX.length);
    const who = await authenticate(request.headers.cookie, projectId);
    if (isRefusal(who)) return refuse(socket, who.status, who.message);
    await openDocument(who.projectId);
    wss.handleUpgrade(request, socket, head, (ws) => {
      // ws reports a message over maxPayload (and other protocol faults) as an 'error' on the socket before closing
      // it with 1009; unheard, that error would end the whole realtime process.
      ws.on("error", (error) => console.warn(`[realtime] Yjs connection closed: ${error.message}`));
      holdConnection(ws, who.projectId, who.user.id);
      gateMessages(ws, { projectId: who.projectId, mayEdit: authorize({ role: who.role, userId: who.user.id }, "notes.edit") });
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
    /**
     * Closes the person's connections to the project's document. y-websocket clients treat 4400–4499 as final
     * (removed from the team) and reconnect after any other code (a changed role: read or write is decided anew).
     */
    closeConnectionsOf(projectId: string, userId: string, { removed }: { removed: boolean }) {
      const [code, reason] = removed ? [4403, "You are no longer on this project's team."] : [4000, "Your role on this project changed."];
      for (const [ws, holder] of holders) if (holder.projectId === projectId && holder.userId === userId) ws.close(code, reason);
    },
    /** Closes every Yjs connection and stores every open document (shutdown). */
    async close() {
      clearInterval(compaction);
      if (catchUpTimer) clearInterval(catchUpTimer);
      await catchingUp;
      const open = [...docs.entries()];
      // Store the documents here, once, rather than from the library's close handlers that nobody awaits.
      setPersistence(null);
      for (const client of wss.clients) client.terminate();
      await Promise.all([...open.map(([projectId, doc]) => writeState(projectId, doc)), ...writingState]);
    },
  };
}
