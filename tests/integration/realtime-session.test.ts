// A review session: the presenter's view reaches followers, presence lists who is here with their role and who
// follows, stepping out and back in, handing over, and pins and mentions reaching the others at once.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { notifications } from "@/db/schema";
import type { PresentedComment, PresentedPin, PresentedReviewSession } from "@/lib/realtime/events";
import { getDb } from "../support/db";
import { connectClient, nextEvent, realtimeClient, request } from "../support/realtime";
import { realtimeProjectSuite } from "../support/realtime-suite";

const rt = realtimeProjectSuite("rt-session");
const { sockets: open, signedIn } = rt;

const view = (x: number) => ({ camera: { position: [x, -30, 25], target: [18, 12, 0] }, selectedMemberId: "BC-7", resultId: "ULS-1" });

describe("review session", () => {
  it("sends the presenter's camera, selection and result to a follower, and refuses it from anyone else", async () => {
    const presenter = await signedIn("structural_engineer");
    const follower = await signedIn("architect");
    const state = nextEvent(follower, "session:state");
    const started = await request<PresentedReviewSession>(presenter, "session:start", {});
    expect(started).toMatchObject({ ok: true, data: { presenterId: rt.project.users.structural_engineer.id } });
    expect(await state).toMatchObject({ presenterId: rt.project.users.structural_engineer.id });

    const received = nextEvent(follower, "session:view");
    expect(await request(presenter, "session:view", view(40))).toEqual({ ok: true, data: null });
    expect(await received).toEqual({ ...view(40), presenterId: rt.project.users.structural_engineer.id });

    expect(await request(follower, "session:view", view(1))).toMatchObject({ ok: false, error: "Only the presenter drives the view." });
  });

  it("lists who is here with their role, and who stepped out of following", async () => {
    const mep = await signedIn("mep_engineer");
    const watcher = await signedIn("viewer");
    const steppedOut = nextEvent(watcher, "presence", (entries) => entries.some((e) => e.id === rt.project.users.mep_engineer.id && !e.following));
    await request(mep, "presence:follow", { following: false });
    const entries = await steppedOut;
    expect(entries.find((e) => e.id === rt.project.users.mep_engineer.id)).toMatchObject({ role: "mep_engineer", following: false, presenting: false });
    expect(entries.find((e) => e.id === rt.project.users.structural_engineer.id)).toMatchObject({ role: "structural_engineer", presenting: true });
    const backIn = nextEvent(watcher, "presence", (list) => list.some((e) => e.id === rt.project.users.mep_engineer.id && e.following));
    await request(mep, "presence:follow", { following: true });
    await backIn;
  });

  it("gives a late joiner the presenter's last view, and hands over to an owner", async () => {
    const presenter = open[0];
    await request(presenter, "session:view", view(55));
    // The view is written behind (at most once a second): wait until a new joiner sees it.
    let welcome = null;
    for (let attempt = 0; attempt < 30 && welcome?.session?.view?.camera.position[0] !== 55; attempt += 1) {
      if (welcome) await new Promise((r) => setTimeout(r, 200));
      const joiner = await realtimeClient(rt.server.url, rt.project.projectId, rt.project.users.owner);
      open.push(joiner);
      welcome = await connectClient(joiner);
    }
    expect(welcome?.session?.view).toEqual(view(55));

    const architect = open[1];
    expect(await request(architect, "session:handover", { toUserId: rt.project.users.owner.id })).toMatchObject({ ok: false });
    expect(await request(presenter, "session:handover", { toUserId: rt.project.users.architect.id })).toMatchObject({
      ok: false,
      error: "That person's role cannot present.",
    });
    const handed = nextEvent(architect, "session:state", (s) => s?.presenterId === rt.project.users.owner.id);
    expect(await request(presenter, "session:handover", { toUserId: rt.project.users.owner.id })).toMatchObject({ ok: true });
    await handed;
    expect(await request(presenter, "session:view", view(2))).toMatchObject({ ok: false });
  });
});

describe("cursors", () => {
  it("relays the newest cursor place to the others, never an older one after a newer, ending at the last move", async () => {
    const mover = await signedIn("mep_engineer");
    const watcher = await signedIn("architect");
    const seen: number[] = [];
    const last = new Promise<void>((resolve) => {
      watcher.on("cursors", (moves) => {
        for (const move of moves) if (move.socketId === mover.id) seen.push(move.seq);
        if (seen.includes(5)) resolve();
      });
    });
    // Moves of one frame are superseded by the newest (server/cursor-batcher.ts); the last one always arrives.
    for (let seq = 1; seq <= 5; seq += 1) mover.emit("cursor:move", { point: [seq, 2, 9], seq });
    await last;
    const distinct = [...new Set(seen)];
    expect(distinct).toEqual([...distinct].sort((a, b) => a - b));
    expect(distinct.at(-1)).toBe(5);
  });
});

describe("pins and threads in the room", () => {
  it("shows each client the other's pin and comment, and notifies the person mentioned", async () => {
    const architect = await signedIn("architect");
    const mep = await signedIn("mep_engineer");
    const seenByMep = nextEvent(mep, "pin:created");
    const pinId = randomUUID();
    const created = await request<PresentedPin>(architect, "pin:create", {
      id: pinId,
      anchor: { kind: "node", id: "N-204" },
      revisionId: null,
      title: "Can the sprinkler main pass under this node?",
      discipline: "mep",
    });
    expect(created).toMatchObject({ ok: true, data: { id: pinId, state: "open", anchor: { kind: "node", id: "N-204" } } });
    expect(await seenByMep).toMatchObject({ id: pinId, author: { id: rt.project.users.architect.id } });

    const seenByArchitect = nextEvent(architect, "comment:created");
    const mention = nextEvent(architect, "notification:created");
    const name = rt.project.users.architect.name;
    const reply = await request<PresentedComment>(mep, "comment:create", { id: randomUUID(), pinId, body: `@${name} yes, 150 mm below the bottom chord.` });
    expect(reply).toMatchObject({ ok: true, data: { mentions: [rt.project.users.architect.id] } });
    expect(await seenByArchitect).toMatchObject({ pinId, body: `@${name} yes, 150 mm below the bottom chord.` });
    expect(await mention).toMatchObject({ kind: "mention", payload: { pinId, byName: rt.project.users.mep_engineer.name } });
    const stored = await getDb().select().from(notifications).where(eq(notifications.userId, rt.project.users.architect.id));
    expect(stored).toHaveLength(1);
  });

  it("applies a retried pin once (client-made ids)", async () => {
    const architect = await signedIn("architect");
    const input = { id: randomUUID(), anchor: { kind: "point", point: [3, 4.5, 9] }, revisionId: null, title: "Gutter outlet", discipline: "architectural" };
    const first = await request<PresentedPin>(architect, "pin:create", input);
    const second = await request<PresentedPin>(architect, "pin:create", input);
    expect(second).toEqual(first);
    const all = await request<{ pins: PresentedPin[] }>(architect, "sync:since", { since: new Date(0).toISOString() });
    expect(all.ok && all.data.pins.filter((p) => p.id === input.id)).toHaveLength(1);
  });
});
