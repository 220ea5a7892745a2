// Nothing said is lost: pins and comments are in PostgreSQL before they are acknowledged, a restarted server
// serves them again, a client that dropped catches up, and the Yjs live document survives a restart, merges
// edits made offline and stays read-only for viewers.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { comments, pins, yjsUpdates } from "@/db/schema";
import type { CatchUp, PresentedPin } from "@/lib/realtime/events";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { projectClients, request, startRealtimeServer, until, yjsClient, type RealtimeProcess } from "../support/realtime";

let server: RealtimeProcess;
let project: ProjectFixture;
const { on, notesOn, keep, closeAll } = projectClients(() => project);
const signedIn = (role: keyof ProjectFixture["users"]) => on(server, role);
const liveDoc = (role: keyof ProjectFixture["users"]) => notesOn(server, role);

beforeAll(async () => {
  requireIntegrationEnv();
  project = await createProjectFixture("rt-persist");
  server = await startRealtimeServer();
});

afterAll(async () => {
  closeAll();
  await server?.stop();
  await closeDb();
});

describe("pins and comments across a restart", () => {
  it("stores before acknowledging, and serves everything again after the server restarts", async () => {
    const since = new Date().toISOString();
    const architect = await signedIn("architect");
    const pinIds: string[] = [];
    const commentIds: string[] = [];
    for (let i = 0; i < 5; i += 1) {
      const pinId = randomUUID();
      const pin = await request<PresentedPin>(architect, "pin:create", {
        id: pinId,
        anchor: { kind: "member", id: `D-${i}` },
        revisionId: null,
        title: `Diagonal ${i}: can it take a 200 mm opening?`,
        discipline: "structural",
        body: "Ducts run through this bay.",
      });
      expect(pin.ok).toBe(true);
      pinIds.push(pinId);
      // Acknowledged means stored: the row is there the moment the ack arrives.
      expect(await getDb().select().from(pins).where(eq(pins.id, pinId))).toHaveLength(1);
      const commentId = randomUUID();
      expect((await request(architect, "comment:create", { id: commentId, pinId, body: `Follow-up ${i}` })).ok).toBe(true);
      expect(await getDb().select().from(comments).where(eq(comments.id, commentId))).toHaveLength(1);
      commentIds.push(commentId);
    }

    architect.disconnect();
    await server.stop();
    await server.start();

    const again = await signedIn("mep_engineer");
    const catchUp = await request<CatchUp>(again, "sync:since", { since });
    expect(catchUp.ok).toBe(true);
    if (!catchUp.ok) return;
    expect(catchUp.data.pins.map((p) => p.id).sort()).toEqual([...pinIds].sort());
    expect(catchUp.data.pins.every((p) => p.commentCount === 2)).toBe(true);
    expect(catchUp.data.comments.map((c) => c.id)).toEqual(expect.arrayContaining(commentIds));
    expect(catchUp.data.comments).toHaveLength(10);
  });

  it("lets a client that dropped catch up on what it missed", async () => {
    const architect = await signedIn("architect");
    const mep = await signedIn("mep_engineer");
    const pin = await request<PresentedPin>(architect, "pin:create", {
      id: randomUUID(),
      anchor: { kind: "clash", id: "CL-0031" },
      revisionId: null,
      title: "Duct vs bottom chord",
      discipline: "mep",
    });
    const pinId = pin.ok ? pin.data.id : "";
    const lastHeard = new Date().toISOString();
    mep.disconnect();
    const missed = randomUUID();
    await request(architect, "comment:create", { id: missed, pinId, body: "Could the duct drop 100 mm?" });
    await request(architect, "pin:set-state", { pinId, state: "answered" });
    mep.connect();
    await new Promise((resolve) => mep.once("welcome", resolve));
    const catchUp = await request<CatchUp>(mep, "sync:since", { since: lastHeard });
    expect(catchUp.ok && catchUp.data.comments.map((c) => c.id)).toContain(missed);
    expect(catchUp.ok && catchUp.data.pins.find((p) => p.id === pinId)?.state).toBe("answered");
  });
});

describe("the Yjs live document", () => {
  it("syncs two clients, stores the document and reloads it after a restart", async () => {
    const a = await liveDoc("structural_engineer");
    const b = await liveDoc("architect");
    a.doc.getText("notes").insert(0, "Agenda: bay 4 openings. ");
    await until(() => b.doc.getText("notes").toString() === "Agenda: bay 4 openings. ", "the second client sees the edit");
    b.doc.getText("notes").insert(b.doc.getText("notes").length, "Architect: skylight trimmer.");
    await until(() => a.doc.getText("notes").toString().endsWith("skylight trimmer."), "the first client sees the reply");
    await until(
      async () => (await getDb().select().from(yjsUpdates).where(eq(yjsUpdates.projectId, project.projectId))).length >= 2,
      "both updates are stored",
    );
    a.provider.destroy();
    b.provider.destroy();

    await server.stop();
    await server.start();
    const rows = await getDb().select().from(yjsUpdates).where(eq(yjsUpdates.projectId, project.projectId));
    expect(rows.filter((row) => row.compacted)).toHaveLength(1);

    const c = await liveDoc("mep_engineer");
    expect(c.doc.getText("notes").toString()).toBe("Agenda: bay 4 openings. Architect: skylight trimmer.");
  });

  it("merges edits made while a client was offline", async () => {
    const online = await liveDoc("owner");
    const offline = await liveDoc("mep_engineer");
    offline.provider.disconnect();
    offline.doc.getMap("agenda").set("mep", "Duct routes in bay 2");
    online.doc.getMap("agenda").set("owner", "Budget for openings");
    offline.provider.connect();
    await until(() => online.doc.getMap("agenda").get("mep") === "Duct routes in bay 2", "the offline edit arrives");
    await until(() => offline.doc.getMap("agenda").get("owner") === "Budget for openings", "the online edit reaches the returning client");
  });

  it("lets a viewer read but not change the document, and refuses outsiders", async () => {
    const viewer = await liveDoc("viewer");
    const writer = await liveDoc("structural_engineer");
    writer.doc.getText("minutes").insert(0, "Minutes of the review.");
    await until(() => viewer.doc.getText("minutes").toString() === "Minutes of the review.", "the viewer reads the minutes");
    viewer.doc.getText("minutes").insert(0, "VIEWER EDIT ");
    // The server handles one connection's messages in order: once the viewer's later awareness message reaches
    // the writer, the server has already dealt with the edit before it.
    viewer.provider.awareness.setLocalStateField("marker", "after-edit");
    await until(
      () => [...writer.provider.awareness.getStates().values()].some((state) => state.marker === "after-edit"),
      "the viewer's awareness arrives",
    );
    expect(writer.doc.getText("minutes").toString()).toBe("Minutes of the review.");
    writer.doc.getMap("agenda").set("engineer", "Check bay 3");
    await until(() => viewer.doc.getMap("agenda").get("engineer") === "Check bay 3", "the viewer still receives edits");

    const outsider = await yjsClient(server.url, project.projectId, project.users.outsider);
    keep(outsider.provider);
    const closed = new Promise<number>((resolve) => outsider.provider.once("connection-error", () => resolve(1)));
    await expect(closed).resolves.toBe(1);
    expect(outsider.provider.synced).toBe(false);
  });
});
