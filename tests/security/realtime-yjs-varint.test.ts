// Hole 3: a viewer wrote to the shared notes by spelling the Yjs message type as a non-canonical varint. lib0's
// varints are 7 bits per byte with a continuation bit, so 0x80 0x00 is 0 just as 0x00 is (lib0/decoding.js
// readVarUint); the server decoded the first bytes by comparison and let it through. Every spelling of a change
// (sync step 2 or update) from a viewer must be dropped, while reads and awareness still work.
import * as encoding from "lib0/encoding";
import { Awareness, encodeAwarenessUpdate } from "y-protocols/awareness";
import { afterAll, afterEach, describe, expect, it } from "vitest";
import WebSocket from "ws";
import * as Y from "yjs";
import { YJS_PATH_PREFIX } from "@/lib/realtime/events";
import { loadYjsUpdates } from "@/db/queries/live-documents";
import { realtimeProjectSuite } from "../support/realtime-suite";
import { whenSynced, yjsClient } from "../support/realtime";
import { sessionCookie } from "../support/session";

const suite = realtimeProjectSuite("sec-yjs-varint");
const providers: { destroy: () => void }[] = [];
afterEach(() => providers.splice(0).forEach((provider) => provider.destroy()));
afterAll(() => providers.forEach((provider) => provider.destroy()));

/** A raw websocket to the project's live document, signed in as the viewer; resolves once open. */
async function rawViewerSocket(): Promise<WebSocket> {
  const url = `${suite.server.url.replace(/^http/, "ws")}${YJS_PATH_PREFIX}${suite.project.projectId}`;
  const ws = new WebSocket(url, { headers: { cookie: await sessionCookie(suite.project.users.viewer) } });
  await new Promise((resolve, reject) => {
    ws.once("open", resolve);
    ws.once("error", reject);
  });
  return ws;
}

/** An update that writes `text` into the "minutes" text of a document with its own client id. */
function hostileUpdate(text: string): Uint8Array {
  const doc = new Y.Doc();
  doc.getText("minutes").insert(0, text);
  return Y.encodeStateAsUpdate(doc);
}

/** A message: the given bytes for the message type and the sync type, then the update as a var-length array. */
function message(prefix: number[], update: Uint8Array): Uint8Array {
  const encoder = encoding.createEncoder();
  for (const byte of prefix) encoding.writeUint8(encoder, byte);
  encoding.writeVarUint8Array(encoder, update);
  return encoding.toUint8Array(encoder);
}

/** An awareness message (type 1) from a fresh client carrying `marker`. */
function awarenessMessage(marker: string): Uint8Array {
  const awareness = new Awareness(new Y.Doc());
  awareness.setLocalStateField("marker", marker);
  const encoder = encoding.createEncoder();
  encoding.writeVarUint(encoder, 1);
  encoding.writeVarUint8Array(encoder, encodeAwarenessUpdate(awareness, [awareness.clientID]));
  awareness.destroy();
  return encoding.toUint8Array(encoder);
}

async function until(condition: () => boolean, what: string) {
  for (let attempt = 0; attempt < 100 && !condition(); attempt += 1) await new Promise((r) => setTimeout(r, 100));
  if (!condition()) throw new Error(`Timed out waiting until ${what}.`);
}

// [message type, sync type] spellings: 0 is messageSync; sync type 1 is step 2 and 2 is update (y-protocols/sync.js).
const SPELLINGS: Record<string, number[]> = {
  "canonical update": [0x00, 0x02],
  "non-canonical message type (0x80 0x00), update": [0x80, 0x00, 0x02],
  "non-canonical message type, three bytes": [0x80, 0x80, 0x00, 0x02],
  "non-canonical sync type (0x81 0x00 = step 2)": [0x00, 0x81, 0x00],
  "non-canonical sync type (0x82 0x00 = update)": [0x00, 0x82, 0x00],
  "both non-canonical": [0x80, 0x00, 0x82, 0x80, 0x00],
};

describe("Yjs: a viewer cannot write, however the message is spelled", () => {
  it.each(Object.entries(SPELLINGS))("drops a viewer's %s", async (label, prefix) => {
    const writer = await yjsClient(suite.server.url, suite.project.projectId, suite.project.users.architect);
    providers.push(writer.provider);
    await whenSynced(writer.provider);
    const marker = `VIEWER ${label}`;
    const ws = await rawViewerSocket();
    ws.send(message(prefix, hostileUpdate(marker)));
    // The server handles one connection's messages in order: once the viewer's later awareness message reaches
    // the writer, the server has already dealt with the change before it.
    ws.send(awarenessMessage(label));
    await until(() => [...writer.provider.awareness.getStates().values()].some((state) => state.marker === label), "the viewer's awareness arrives");
    const reader = await yjsClient(suite.server.url, suite.project.projectId, suite.project.users.structural_engineer);
    providers.push(reader.provider);
    await whenSynced(reader.provider);
    expect(reader.doc.getText("minutes").toString()).not.toContain("VIEWER");
    expect(writer.doc.getText("minutes").toString()).not.toContain("VIEWER");
    const stored = new Y.Doc();
    const rows = await loadYjsUpdates({ projectId: suite.project.projectId });
    if (rows.length) Y.applyUpdate(stored, Y.mergeUpdates(rows.map((row) => row.update)));
    expect(stored.getText("minutes").toString()).not.toContain("VIEWER");
    ws.close();
  });

  it("still lets the same update through from a role with the notes-edit right", async () => {
    const reader = await yjsClient(suite.server.url, suite.project.projectId, suite.project.users.structural_engineer);
    providers.push(reader.provider);
    await whenSynced(reader.provider);
    const url = `${suite.server.url.replace(/^http/, "ws")}${YJS_PATH_PREFIX}${suite.project.projectId}`;
    const ws = new WebSocket(url, { headers: { cookie: await sessionCookie(suite.project.users.mep_engineer) } });
    await new Promise((resolve, reject) => {
      ws.once("open", resolve);
      ws.once("error", reject);
    });
    ws.send(message([0x80, 0x00, 0x02], hostileUpdate("MEP note")));
    await until(() => reader.doc.getText("minutes").toString().includes("MEP note"), "the MEP engineer's note arrives");
    ws.close();
  });
});
