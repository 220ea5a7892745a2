// Issue 21: hostile payloads to every socket event (generated from CLIENT_EVENTS), an oversized handshake and an
// oversized Yjs message. Each gets an error reply with a message; nothing is written; another person is answered.
import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import WebSocket from "ws";
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
  });
});
