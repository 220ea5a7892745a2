// Issue 14: a short Redis outage under two realtime nodes. Redis only carries messages between nodes; while it is
// down each node keeps serving its own clients (acknowledged writes, the room's events on that node, shared notes),
// and once it is back the nodes reconnect on their own, cross-node messages resume, and what one node's clients did
// meanwhile reaches the other's: comments through the room (and PostgreSQL, for a client that asks), note edits
// from PostgreSQL. This file starts its own Redis so stopping it disturbs no other test.
import { randomUUID } from "node:crypto";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { freePort } from "@/scripts/stack/ports.mjs";
import { removeRedisData, startRedis, stopRedis } from "@/scripts/stack/redis.mjs";
import type { PresentedComment, PresentedPin } from "@/lib/realtime/events";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { nextEvent, projectClients, request, startRealtimeServer, until, type ClientSocket, type RealtimeProcess } from "../support/realtime";

const redisData = path.join(process.cwd(), ".data", `redis-outage-${process.pid}`);
let redisPort: number;
let nodeA: RealtimeProcess;
let nodeB: RealtimeProcess;
let project: ProjectFixture;
const { on, notesOn, closeAll } = projectClients(() => project);

beforeAll(async () => {
  requireIntegrationEnv();
  redisPort = await freePort();
  const redisUrl = await startRedis({ dataDir: redisData, port: redisPort, throwaway: true });
  project = await createProjectFixture("redis-outage");
  [nodeA, nodeB] = await Promise.all([startRealtimeServer({ env: { REDIS_URL: redisUrl } }), startRealtimeServer({ env: { REDIS_URL: redisUrl } })]);
});

afterAll(async () => {
  closeAll();
  await Promise.all([nodeA?.stop(), nodeB?.stop()]);
  await stopRedis(redisData).catch(() => undefined);
  removeRedisData(redisData);
  await closeDb();
});

async function comment(socket: ClientSocket, pinId: string, body: string): Promise<string> {
  const id = randomUUID();
  expect(await request<PresentedComment>(socket, "comment:create", { id, pinId, body })).toMatchObject({ ok: true });
  return id;
}

describe("a short Redis outage under two realtime nodes", () => {
  it("keeps each node serving its own clients, then resumes cross-node messages with nothing acknowledged lost", { timeout: 90_000 }, async () => {
    const architect = await on(nodeA, "architect");
    const viewerOnA = await on(nodeA, "viewer");
    const mep = await on(nodeB, "mep_engineer");
    const notesA = await notesOn(nodeA, "architect");
    const notesB = await notesOn(nodeB, "mep_engineer");

    const pinId = randomUUID();
    const pinSeenOnB = nextEvent(mep, "pin:created", (pin) => pin.id === pinId);
    expect(
      await request<PresentedPin>(architect, "pin:create", { id: pinId, anchor: { kind: "member", id: "BC-44" }, revisionId: null, title: "Cable tray through bay D2?", discipline: "mep" }),
    ).toMatchObject({ ok: true });
    await pinSeenOnB;
    notesA.doc.getText("notes").insert(0, "Before the outage. ");
    await until(() => notesB.doc.getText("notes").toString().includes("Before the outage."), "B has the edit made before the outage");

    await stopRedis(redisData);

    // Node A without Redis: a write is acknowledged (it is in PostgreSQL) and A's other client hears of it at once.
    const heardOnA = nextEvent(viewerOnA, "comment:created", (c) => c.body === "Written on A while Redis is down.", 5_000);
    const duringOutage = await comment(architect, pinId, "Written on A while Redis is down.");
    await heardOnA;
    // Node B keeps answering its own clients too, and a newcomer can still connect to A.
    const duringOutageOnB = await comment(mep, pinId, "Written on B while Redis is down.");
    const late = await on(nodeA, "structural_engineer");
    expect(late.connected).toBe(true);
    // A note edit on A is stored and reaches A's own clients.
    const notesA2 = await notesOn(nodeA, "structural_engineer");
    notesA.doc.getText("notes").insert(0, "Edited during the outage. ");
    await until(() => notesA2.doc.getText("notes").toString().includes("Edited during the outage."), "A's other notes client has the outage edit");
    await new Promise((r) => setTimeout(r, 2_000));

    await startRedis({ dataDir: redisData, port: redisPort, throwaway: true });

    // The nodes reconnect by themselves: a comment made after Redis is back reaches the other node live.
    const afterSeenOnB = nextEvent(mep, "comment:created", (c) => c.body === "After Redis came back.", 5_000);
    const deadline = Date.now() + 30_000;
    let after = "";
    for (;;) {
      after = await comment(architect, pinId, "After Redis came back.");
      try {
        await afterSeenOnB;
        break;
      } catch (error) {
        if (Date.now() > deadline) throw error;
      }
    }
    expect(after).not.toBe("");
    const moves: number[] = [];
    mep.on("cursors", (batch) => batch.forEach((move) => move.socketId === architect.id && moves.push(move.seq)));
    architect.emit("cursor:move", { point: [4, 8, 9], seq: 1 });
    await until(() => moves.includes(1), "B receives A's cursor after the outage");

    // Nothing acknowledged during the outage is lost: a client on B that catches up gets both comments, and the
    // note edit made on A reaches B (read back from PostgreSQL) as well as a newcomer on B.
    const caughtUp = await request<{ comments: PresentedComment[] }>(mep, "sync:since", { since: new Date(0).toISOString() });
    expect(caughtUp.ok ? caughtUp.data.comments.map((c) => c.id) : []).toEqual(expect.arrayContaining([duringOutage, duringOutageOnB, after]));
    await until(() => notesB.doc.getText("notes").toString().includes("Edited during the outage."), "B has the edit made on A during the outage", 20_000);
    const fresh = await notesOn(nodeB, "viewer");
    expect(fresh.doc.getText("notes").toString()).toContain("Edited during the outage.");
    notesB.doc.getText("notes").insert(0, "After the outage, on B. ");
    await until(() => notesA.doc.getText("notes").toString().includes("After the outage, on B."), "A has B's edit after the outage");
  });
});
