// The realtime server refuses signed-out, outsider and foreign-origin connections, refuses writes by roles the
// permission table does not allow, and answers malformed payloads with errors without falling over.
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import WebSocket from "ws";
import { comments, memberships } from "@/db/schema";
import { getDb } from "../support/db";
import { createFixtureUser } from "../support/fixtures";
import { sessionCookie } from "../support/session";
import { connectClient, nextEvent, realtimeClient, request } from "../support/realtime";
import { realtimeProjectSuite } from "../support/realtime-suite";
import type { PresentedPin } from "@/lib/realtime/events";

const rt = realtimeProjectSuite("rt-access");
const { sockets: open, signedIn } = rt;

const pinInput = () => ({ id: randomUUID(), anchor: { kind: "member", id: "TC-12" }, revisionId: null, title: "Duct crossing", discipline: "mep" });

describe("realtime handshake", () => {
  it("refuses a socket without a session", async () => {
    const socket = await realtimeClient(rt.server.url, rt.project.projectId);
    await expect(connectClient(socket)).rejects.toThrow("Sign in to continue.");
  });

  it("refuses a signed-in person who is not on the project", async () => {
    const socket = await realtimeClient(rt.server.url, rt.project.projectId, rt.project.users.outsider);
    await expect(connectClient(socket)).rejects.toThrow("not on its team");
  });

  it("refuses a malformed project id", async () => {
    const socket = await realtimeClient(rt.server.url, "not-a-project", rt.project.users.owner);
    await expect(connectClient(socket)).rejects.toThrow("A project id is required.");
  });

  it("refuses a browser from another site", async () => {
    const socket = await realtimeClient(rt.server.url, rt.project.projectId, rt.project.users.owner, { origin: "http://evil.example" });
    await expect(connectClient(socket)).rejects.toThrow();
  });

  it("refuses a Yjs connection from an outsider and closes upgrades to unknown paths", async () => {
    const cookie = await sessionCookie(rt.project.users.outsider);
    const refusedStatus = (path: string) =>
      new Promise<number>((resolve) => {
        const ws = new WebSocket(rt.server.url.replace(/^http/, "ws") + path, { headers: { cookie } });
        ws.on("unexpected-response", (_request, response) => resolve(response.statusCode ?? 0));
        ws.on("open", () => resolve(101));
      });
    expect(await refusedStatus(`/yjs/${rt.project.projectId}`)).toBe(404);
    expect(await refusedStatus("/elsewhere")).toBe(404);
  });

  it("welcomes a member with their role and the abilities the server computed", async () => {
    const socket = await realtimeClient(rt.server.url, rt.project.projectId, rt.project.users.viewer);
    open.push(socket);
    const welcome = await connectClient(socket);
    expect(welcome.user).toMatchObject({ id: rt.project.users.viewer.id, role: "viewer" });
    expect(welcome.abilities["pin.create"]).toBe(false);
    expect(welcome.abilities["project.read"]).toBe(true);
  });
});

describe("writes by role", () => {
  it("refuses a pin and a comment from a viewer, and stores nothing", async () => {
    const viewer = await signedIn("viewer");
    const pin = pinInput();
    const refused = await request<PresentedPin>(viewer, "pin:create", pin);
    expect(refused).toEqual({ ok: false, error: "Your role on this project does not allow this." });

    const architect = await signedIn("architect");
    const stored = await request<PresentedPin>(architect, "pin:create", pinInput());
    expect(stored.ok).toBe(true);
    const pinId = stored.ok ? stored.data.id : "";
    const comment = await request(viewer, "comment:create", { id: randomUUID(), pinId, body: "Looks fine to me" });
    expect(comment.ok).toBe(false);
    const catchUp = await request<{ pins: PresentedPin[] }>(viewer, "sync:since", { since: new Date(0).toISOString() });
    expect(catchUp.ok && catchUp.data.pins.map((p) => p.id)).toEqual([pinId]);
  });

  it("refuses a comment over the open socket of a member removed a second ago, and stores nothing", async () => {
    // The socket handler leaves the role check to the command (the membership read in its transaction): this is
    // the case that would slip through if neither asked.
    const leaver = await createFixtureUser("rt-access-leaver");
    await getDb().insert(memberships).values({ projectId: rt.project.projectId, userId: leaver.id, role: "architect" });
    const socket = await realtimeClient(rt.server.url, rt.project.projectId, leaver);
    open.push(socket);
    await connectClient(socket);
    const architect = await signedIn("architect");
    const pin = await request<PresentedPin>(architect, "pin:create", pinInput());
    const pinId = pin.ok ? pin.data.id : "";
    await getDb().delete(memberships).where(and(eq(memberships.projectId, rt.project.projectId), eq(memberships.userId, leaver.id)));
    const id = randomUUID();
    expect(await request(socket, "comment:create", { id, pinId, body: "Written after I left" })).toEqual({ ok: false, error: "Your role on this project does not allow this." });
    expect(await getDb().select().from(comments).where(eq(comments.id, id))).toEqual([]);
  });

  it("lets only the structural engineer record a decision", async () => {
    const architect = await signedIn("architect");
    const structural = await signedIn("structural_engineer");
    const pin = await request<PresentedPin>(architect, "pin:create", pinInput());
    const pinId = pin.ok ? pin.data.id : "";
    const byArchitect = await request(architect, "comment:create", { id: randomUUID(), pinId, body: "Opening accepted", kind: "decision" });
    expect(byArchitect).toEqual({ ok: false, error: "Only the structural engineer records decisions." });
    // Nothing proposed yet: deciding now would be the engineer accepting their own opening.
    const unproposed = await request(structural, "comment:create", { id: randomUUID(), pinId, body: "Opening accepted", kind: "decision" });
    expect(unproposed).toEqual({ ok: false, error: "Nothing is proposed on this thread: a decision answers someone else's proposal (proposer and decider are two people)." });
    expect(await request(architect, "comment:create", { id: randomUUID(), pinId, body: "A 200 mm opening for the duct", kind: "proposal" })).toMatchObject({ ok: true });
    const byEngineer = await request(structural, "comment:create", { id: randomUUID(), pinId, body: "Opening accepted with conditions", kind: "decision" });
    expect(byEngineer).toMatchObject({ ok: true, data: { kind: "decision", author: { id: rt.project.users.structural_engineer.id } } });
  });

  it("lets the pin's author and the engineer close a thread, but not another architect-level member", async () => {
    const architect = await signedIn("architect");
    const mep = await signedIn("mep_engineer");
    const pin = await request<PresentedPin>(architect, "pin:create", pinInput());
    const pinId = pin.ok ? pin.data.id : "";
    expect(await request(mep, "pin:set-state", { pinId, state: "closed" })).toMatchObject({ ok: false });
    expect(await request(mep, "pin:set-state", { pinId, state: "answered" })).toMatchObject({ ok: true, data: { state: "answered" } });
    expect(await request(architect, "pin:set-state", { pinId, state: "closed" })).toMatchObject({ ok: true, data: { state: "closed" } });
    expect(await request(mep, "pin:set-state", { pinId, state: "open" })).toMatchObject({ ok: false });
  });

  it("refuses session control to an architect", async () => {
    const architect = await signedIn("architect");
    expect(await request(architect, "session:start", {})).toMatchObject({ ok: false, error: "Your role on this project does not allow this." });
  });
});

describe("malformed payloads", () => {
  it("answers with the zod issues and keeps serving", async () => {
    const architect = await signedIn("architect");
    const bad = await request(architect, "pin:create", { id: "nope", anchor: { kind: "beam" }, title: "" });
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.issues?.map((issue) => issue.path)).toEqual(expect.arrayContaining(["id", "anchor.kind", "title", "discipline"]));
    for (const payload of [null, 42, "text", [], { pinId: randomUUID(), body: "x".repeat(20_000), id: randomUUID() }]) {
      expect((await request(architect, "comment:create", payload)).ok).toBe(false);
    }
    const good = await request<PresentedPin>(architect, "pin:create", pinInput());
    expect(good.ok).toBe(true);
    // A thread step's hostile fields: each answered with the field at fault, nothing stored.
    const pinId = good.ok ? good.data.id : "";
    const step = (extra: object) => request(architect, "comment:create", { id: randomUUID(), pinId, body: "A 200 mm opening", ...extra });
    const fieldAtFault = async (extra: object) => {
      const answer = await step(extra);
      return answer.ok ? "stored" : answer.issues?.map((issue) => issue.path);
    };
    expect(await fieldAtFault({ kind: "decision", conditions: "x".repeat(4001) })).toEqual(["conditions"]);
    expect(await fieldAtFault({ kind: "proposal", conditions: "Sleeved." })).toEqual(["conditions"]);
    expect(await fieldAtFault({ kind: "__proto__" })).toEqual(["kind"]);
    expect(await fieldAtFault({ kind: "decision", conditions: "Sleeved\u0000" })).toEqual(["conditions"]);
    expect(await fieldAtFault({ kind: "proposal", body: "\ud800" })).toEqual(["body"]);
    const thread = await getDb().select({ id: comments.id }).from(comments).where(eq(comments.pinId, pinId));
    expect(thread).toEqual([]);
  });

  it("sends a realtime:error event when the sender gave no acknowledgement", async () => {
    const architect = await signedIn("architect");
    const error = nextEvent(architect, "realtime:error");
    architect.emit("cursor:move", { point: [0, "y", 0], seq: -1 });
    expect(await error).toMatchObject({ event: "cursor:move", error: "The message was not understood." });
  });
});
