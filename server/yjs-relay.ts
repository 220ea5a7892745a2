// Shared notes across realtime nodes. Each node applies a client's change only once it is stored in PostgreSQL
// (server/yjs.ts), then publishes it on the document's Redis channel; every other node with the document open
// applies what it receives and passes it to its own clients. Awareness (who is here, cursors in the notes) is
// relayed the same way. Redis pub/sub drops what a node misses while disconnected: server/yjs.ts catches up from
// PostgreSQL, which holds every change.
import * as awarenessProtocol from "y-protocols/awareness";
import type { WSSharedDoc } from "@y/websocket-server/utils";
import * as Y from "yjs";
import { closeRedis, NODE_ID, type RedisClient } from "./cluster";

/** The origin of changes applied from another node: they are not published again. */
export const RELAYED = Symbol("relayed from another node");
/** The origin of changes loaded from PostgreSQL (every node can read them there: never relayed). */
export const STORED = Symbol("loaded from PostgreSQL");

const DOC_UPDATE = 0;
const AWARENESS_UPDATE = 1;

function channelOf(projectId: string): string {
  return `strutroom:yjs:${projectId}`;
}

function frame(kind: number, payload: Uint8Array): Buffer {
  return Buffer.concat([Buffer.of(kind), NODE_ID, payload]);
}

export type YjsRelay = {
  /** Starts relaying the document both ways (resolves once subscribed, so nothing published after is missed). */
  open(projectId: string, doc: WSSharedDoc): Promise<void>;
  /** Stops relaying that document (its last client on this node left). */
  close(projectId: string, doc: WSSharedDoc): void;
  /** Calls back after the Redis subscription came back from an outage (messages may have been missed). */
  onReconnect(listener: () => void): void;
  /** Unsubscribes from everything and closes the subscribing connection (shutdown). */
  stop(): Promise<void>;
};

/** A relay over Redis pub/sub: one client publishes, a duplicate subscribes (a subscribed client can do nothing else). */
export async function createYjsRelay(client: RedisClient): Promise<YjsRelay> {
  const subscriber = client.duplicate();
  subscriber.on("error", () => undefined); // reported by the main client's handler
  const reconnectListeners: (() => void)[] = [];
  let lost = false;
  subscriber.on("end", () => (lost = true));
  subscriber.on("reconnecting", () => (lost = true));
  subscriber.on("ready", () => {
    if (!lost) return;
    lost = false;
    for (const listener of reconnectListeners) listener();
  });
  await subscriber.connect();
  const open = new Map<string, { doc: WSSharedDoc; listener: (message: Buffer) => void; detach: () => void }>();

  function publish(projectId: string, message: Buffer) {
    client.publish(channelOf(projectId), message).catch((error: Error) => console.error("[realtime] could not relay a Yjs message:", error.message));
  }

  function close(projectId: string, doc: WSSharedDoc) {
    const entry = open.get(projectId);
    if (!entry || entry.doc !== doc) return;
    open.delete(projectId);
    entry.detach();
    subscriber.unsubscribe(channelOf(projectId), entry.listener, true).catch(() => undefined);
  }

  return {
    close,
    async open(projectId, doc) {
      const onUpdate = (update: Uint8Array, origin: unknown) => {
        // Changes loaded from PostgreSQL or received from another node are already everywhere they need to be.
        if (origin !== RELAYED && origin !== STORED) publish(projectId, frame(DOC_UPDATE, update));
      };
      const onAwareness = ({ added, updated, removed }: { added: number[]; updated: number[]; removed: number[] }, origin: unknown) => {
        // 'timeout' is this node forgetting a silent client (each node does that itself); 'local' is the server's own
        // empty state.
        if (origin === RELAYED || origin === "timeout" || origin === "local") return;
        publish(projectId, frame(AWARENESS_UPDATE, awarenessProtocol.encodeAwarenessUpdate(doc.awareness, [...added, ...updated, ...removed])));
      };
      const listener = (message: Buffer) => {
        if (message.length < 1 + NODE_ID.length || message.subarray(1, 1 + NODE_ID.length).equals(NODE_ID)) return;
        const payload = new Uint8Array(message.buffer, message.byteOffset + 1 + NODE_ID.length, message.length - 1 - NODE_ID.length);
        try {
          if (message[0] === DOC_UPDATE) Y.applyUpdate(doc, payload, RELAYED);
          else if (message[0] === AWARENESS_UPDATE) awarenessProtocol.applyAwarenessUpdate(doc.awareness, payload, RELAYED);
        } catch (error) {
          console.error("[realtime] a relayed Yjs message could not be applied", error);
        }
      };
      doc.on("update", onUpdate);
      doc.awareness.on("update", onAwareness);
      const detach = () => {
        doc.off("update", onUpdate);
        doc.awareness.off("update", onAwareness);
      };
      const previous = open.get(projectId);
      if (previous) close(projectId, previous.doc);
      open.set(projectId, { doc, listener, detach });
      await subscriber.subscribe(channelOf(projectId), listener, true);
    },
    onReconnect(listener) {
      reconnectListeners.push(listener);
    },
    async stop() {
      for (const [projectId, entry] of open) close(projectId, entry.doc);
      await closeRedis(subscriber);
    },
  };
}
