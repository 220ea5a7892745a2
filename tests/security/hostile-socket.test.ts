// Issue 21: hostile payloads to every socket event (generated from CLIENT_EVENTS), an oversized handshake and an
// oversized Yjs message. Each gets an error reply with a message; nothing is written; another person is answered.
import { sql } from "drizzle-orm";
import * as decoding from "lib0/decoding";
import * as encoding from "lib0/encoding";
import { describe, expect, it } from "vitest";
import WebSocket from "ws";
import * as Y from "yjs";
import { loadYjsUpdates } from "@/db/queries/live-documents";
import { realtime } from "@/lib/limits";
import { CLIENT_EVENTS, clientEventsComplete } from "@/lib/realtime/events";
import { getDb } from "../support/db";
import { connectClient, realtimeClient, request } from "../support/realtime";
import { realtimeProjectSuite } from "../support/realtime-suite";
import { sessionCookie } from "../support/session";

const suite = realtimeProjectSuite("hostile-socket");

const hostilePayloads: { name: string; payload: unknown }[] = [
  { name: "a null character", payload: { title: "a\u0000b", body: "x\u0000", since: "2020-01-01T00:00:00Z", pinId: "00000000-0000-4000-8000-000000000000" } },
  { name: "a lone surrogate", payload: { title: "\ud800", body: "roof \udc00" } },
  { name: "a __proto__ key", payload: JSON.parse('{"__proto__": {"admin": true}}') },
  { name: "a string", payload: "hello" },
  { name: "null", payload: null },
  { name: "a huge number", payload: 1e308 },
  { name: "deep nesting", payload: JSON.parse("[".repeat(2_000) + "]".repeat(2_000)) },
  { name: "year 0000", payload: { since: "0000-01-01T00:00:00Z" } },
  { name: "1.2 MB", payload: { body: "x".repeat(1_200_000) } },
];

async function writtenRows(): Promise<number> {
  const { rows } = await getDb().execute<{ n: string }>(
    sql`select ((select count(*) from pins) + (select count(*) from comments) + (select count(*) from audit_events) + (select count(*) from review_sessions))::text as n`,
  );
  return Number(rows[0].n);
}

describe("hostile input on every socket event (generated from CLIENT_EVENTS)", () => {
  it("every event answers every hostile payload with an error message, writes nothing, and others are answered", async () => {
    expect(clientEventsComplete).toBe(true);
    const hostile = await suite.signedIn("structural_engineer");
    const other = await suite.signedIn("viewer");
    const before = await writtenRows();
    for (const event of CLIENT_EVENTS) {
      for (const { name, payload } of hostilePayloads) {
        const [ack, meanwhile] = await Promise.all([
          request(hostile, event, payload),
          request<{ pins: unknown[] }>(other, "sync:since", { since: new Date(0).toISOString() }),
        ]);
        // cursor moves are fire-and-forget batches; a valid one acknowledges, every hostile one must not
        expect(ack.ok, `${event} with ${name}`).toBe(false);
        expect(!ack.ok && typeof ack.error === "string" && ack.error.length > 0, `${event} with ${name}: says why`).toBe(true);
        expect(meanwhile.ok, `another person answered while ${event} got ${name}`).toBe(true);
      }
    }
    expect(await writtenRows()).toBe(before);
    expect(hostile.connected).toBe(true);
  });

  it("a 1 MB project id in the handshake is refused with a message", async () => {
    const socket = await realtimeClient(suite.server.url, "p".repeat(1024 * 1024), suite.project.users.owner);
    suite.sockets.push(socket);
    await expect(connectClient(socket)).rejects.toThrow(/.+/);
  });

  it("a Yjs message over the cap closes the connection with 1009 Message Too Big", async () => {
    const url = `${suite.server.url.replace(/^http/, "ws")}/yjs/${suite.project.projectId}`;
    const ws = new WebSocket(url, { headers: { cookie: await sessionCookie(suite.project.users.structural_engineer), origin: suite.server.appUrl } });
    await new Promise((resolve, reject) => {
      ws.once("open", resolve);
      ws.once("error", reject);
    });
    const closed = new Promise<number>((resolve) => ws.once("close", (code) => resolve(code)));
    ws.send(new Uint8Array(realtime.yjsUpdateBytes + 1));
    expect(await closed).toBe(1009);
    // and the realtime process is still there for everyone else (an unheard 'error' once ended it)
    const other = await suite.signedIn("viewer");
    expect((await request(other, "sync:since", { since: new Date(0).toISOString() })).ok).toBe(true);
  });

  it("a change that would grow the whole Yjs document past its cap is refused with the reason; nothing of it is stored", async () => {
    const url = `${suite.server.url.replace(/^http/, "ws")}/yjs/${suite.project.projectId}`;
    const ws = new WebSocket(url, { headers: { cookie: await sessionCookie(suite.project.users.structural_engineer), origin: suite.server.appUrl } });
    const replies: Uint8Array[] = [];
    ws.on("message", (data: Buffer) => replies.push(new Uint8Array(data)));
    await new Promise((resolve, reject) => {
      ws.once("open", resolve);
      ws.once("error", reject);
    });
    const closed = new Promise<{ code: number; reason: string }>((resolve) => ws.once("close", (code, reason) => resolve({ code, reason: reason.toString() })));
    // Each change is under the per-message cap; together they pass the document cap on the last one.
    const chunk = Math.floor(realtime.yjsUpdateBytes * 0.9);
    const fitting = Math.floor(realtime.yjsDocumentBytes / chunk);
    const doc = new Y.Doc();
    const text = doc.getText("minutes");
    for (let i = 0; i <= fitting; i += 1) {
      const before = Y.encodeStateVector(doc);
      text.insert(text.length, String.fromCharCode(97 + i).repeat(chunk));
      const encoder = encoding.createEncoder();
      encoding.writeVarUint(encoder, 0); // sync message
      encoding.writeVarUint(encoder, 2); // update (y-protocols/sync.js messageYjsUpdate)
      encoding.writeVarUint8Array(encoder, Y.encodeStateAsUpdate(doc, before));
      ws.send(encoding.toUint8Array(encoder));
    }
    const { code, reason } = await closed;
    expect(code).toBe(4413);
    expect(reason).toMatch(/full \(2 MB\).*not stored/);
    // Before closing, the reason went out as a y-protocols permission-denied message (type 2, auth; 0, denied).
    const denied = replies.map((reply) => decoding.createDecoder(reply)).find((d) => decoding.readVarUint(d) === 2 && decoding.readVarUint(d) === 0);
    expect(denied && decoding.readVarString(denied)).toMatch(/full \(2 MB\).*remove older notes/);
    // The stored document holds the changes that fitted and none of the refused one.
    const stored = new Y.Doc();
    const rows = await loadYjsUpdates({ projectId: suite.project.projectId });
    Y.applyUpdate(stored, Y.mergeUpdates(rows.map((row) => row.update)));
    const minutes = stored.getText("minutes").toString();
    expect(minutes.length).toBe(fitting * chunk);
    expect(minutes).not.toContain(String.fromCharCode(97 + fitting));
  });
});
