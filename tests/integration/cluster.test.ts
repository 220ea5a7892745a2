// Several realtime nodes (issue 14): two live servers on one Redis (scripts/test.mjs starts it and passes
// STRUTROOM_TEST_REDIS_URL) and the project's PostgreSQL. Clients on node A and node B of the same project see each
// other's presence, cursors, pins, comments and shared notes; one presenter whatever the node, followed across
// nodes; a team change reaches a connection on either node; and after `kill -9` of node A its clients, pointed at
// node B, catch up with nothing acknowledged lost. Two job workers send the digest and each mail exactly once.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import * as Y from "yjs";
import { POST as INVITE } from "@/app/api/projects/[projectId]/invitations/route";
import { DELETE as REMOVE_MEMBER } from "@/app/api/projects/[projectId]/members/[userId]/route";
import { createPin } from "@/lib/commands/create-pin";
import { listCapturedMail } from "@/lib/mail/captured";
import { loadYjsUpdates } from "@/db/queries/live-documents";
import type { PresentedComment, PresentedPin, PresentedReviewSession, PresenceEntry } from "@/lib/realtime/events";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { startJobsProcess, type JobsProcess } from "../support/jobs-process";
import { nextEvent, projectClients, request, startRealtimeServer, until, type RealtimeProcess } from "../support/realtime";
import { buildRequest, routeContext } from "../support/session";

const view = (x: number) => ({ camera: { position: [x, -30, 25], target: [18, 12, 0] }, selectedMemberId: "TC-12", resultId: "ULS-2" });

let nodeA: RealtimeProcess;
let nodeB: RealtimeProcess;
let project: ProjectFixture;
const { on, notesOn, closeAll } = projectClients(() => project);

beforeAll(async () => {
  requireIntegrationEnv();
  const redisUrl = process.env.STRUTROOM_TEST_REDIS_URL;
  if (!redisUrl) throw new Error("STRUTROOM_TEST_REDIS_URL must be set (npm test -- --only=integration starts Redis).");
  project = await createProjectFixture("cluster");
  [nodeA, nodeB] = await Promise.all([startRealtimeServer({ env: { REDIS_URL: redisUrl } }), startRealtimeServer({ env: { REDIS_URL: redisUrl } })]);
});

afterAll(async () => {
  closeAll();
  await Promise.all([nodeA?.stop(), nodeB?.stop()]);
  await closeDb();
});

const lists = (...ids: string[]) => (entries: PresenceEntry[]) => ids.every((id) => entries.some((entry) => entry.id === id));

describe("two realtime nodes on one Redis", () => {
  it("lists everyone in the presence on both nodes and passes cursor moves across", async () => {
    const architect = await on(nodeA, "architect");
    const seenOnA = nextEvent(architect, "presence", lists(project.users.architect.id, project.users.mep_engineer.id));
    const mep = await on(nodeB, "mep_engineer");
    await seenOnA;
    // B's own list is sent after its welcome; ask again by stepping out of following and back in.
    const seenOnB = nextEvent(mep, "presence", lists(project.users.architect.id, project.users.mep_engineer.id));
    await request(mep, "presence:follow", { following: true });
    await seenOnB;

    const moves: number[] = [];
    const last = new Promise<void>((resolve) => {
      mep.on("cursors", (batch) => {
        for (const move of batch) if (move.socketId === architect.id) moves.push(move.seq);
        if (moves.includes(5)) resolve();
      });
    });
    // Moves of one frame are superseded by the newest (server/cursor-batcher.ts); the last one reaches B.
    for (let seq = 1; seq <= 5; seq += 1) architect.emit("cursor:move", { point: [seq, 3, 9], seq });
    await last;
    const distinct = [...new Set(moves)];
    expect(distinct).toEqual([...distinct].sort((a, b) => a - b));
    expect(distinct.at(-1)).toBe(5);
  });

  it("shows a pin made on A and a comment made on B to the other node", async () => {
    const architect = await on(nodeA, "architect");
    const mep = await on(nodeB, "mep_engineer");
    const pinSeenOnB = nextEvent(mep, "pin:created");
    const pinId = randomUUID();
    const pin = await request<PresentedPin>(architect, "pin:create", {
      id: pinId,
      anchor: { kind: "member", id: "BC-31" },
      revisionId: null,
      title: "May the 400 mm extract duct pass through bay C4?",
      discipline: "mep",
    });
    expect(pin.ok).toBe(true);
    expect(await pinSeenOnB).toMatchObject({ id: pinId });

    const commentSeenOnA = nextEvent(architect, "comment:created", (comment) => comment.pinId === pinId);
    const reply = await request<PresentedComment>(mep, "comment:create", { id: randomUUID(), pinId, body: "It clears the bottom chord by 120 mm." });
    expect(reply.ok).toBe(true);
    expect(await commentSeenOnA).toMatchObject({ pinId, body: "It clears the bottom chord by 120 mm." });
  });

  it("relays shared-note edits and awareness between the nodes", async () => {
    const onA = await notesOn(nodeA, "architect");
    const onB = await notesOn(nodeB, "structural_engineer");
    onA.doc.getText("notes").insert(0, "Bay C4: duct route agreed. ");
    await until(() => onB.doc.getText("notes").toString().includes("duct route agreed"), "B sees A's edit");
    onB.doc.getText("notes").insert(0, "Check TC-12 for the hanger load. ");
    await until(() => onA.doc.getText("notes").toString().includes("hanger load"), "A sees B's edit");

    onB.provider.awareness.setLocalStateField("marker", "editing-on-b");
    await until(() => [...onA.provider.awareness.getStates().values()].some((state) => state.marker === "editing-on-b"), "A sees B's awareness");
    onA.provider.awareness.setLocalStateField("marker", "editing-on-a");
    await until(() => [...onB.provider.awareness.getStates().values()].some((state) => state.marker === "editing-on-a"), "B sees A's awareness");
    onA.provider.destroy();
    onB.provider.destroy();
  });

  it("keeps one presenter whatever the node, followed on the other node and handed over across nodes", async () => {
    const presenter = await on(nodeA, "structural_engineer");
    const follower = await on(nodeB, "viewer");
    const owner = await on(nodeB, "owner");
    const stateOnB = nextEvent(follower, "session:state", (session) => session?.presenterId === project.users.structural_engineer.id);
    expect(await request<PresentedReviewSession>(presenter, "session:start", {})).toMatchObject({ ok: true });
    await stateOnB;

    const followed = nextEvent(follower, "session:view");
    expect(await request(presenter, "session:view", view(40))).toEqual({ ok: true, data: null });
    expect(await followed).toEqual({ ...view(40), presenterId: project.users.structural_engineer.id });

    // A second presenter on the other node is refused: the session lives in PostgreSQL, not in a node.
    const second = await request(owner, "session:start", {});
    expect(second).toMatchObject({ ok: false });
    expect(second.ok ? "" : second.error).toContain("is presenting");

    const handedOver = nextEvent(presenter, "session:state", (session) => session?.presenterId === project.users.owner.id);
    expect(await request(presenter, "session:handover", { toUserId: project.users.owner.id })).toMatchObject({ ok: true });
    await handedOver;
    const followedOnA = nextEvent(presenter, "session:view");
    expect(await request(owner, "session:view", view(12))).toEqual({ ok: true, data: null });
    expect(await followedOnA).toEqual({ ...view(12), presenterId: project.users.owner.id });
    expect(await request(owner, "session:end", {})).toMatchObject({ ok: true });
  });

  it("closes a removed member's connections on both nodes", async () => {
    const team = await createProjectFixture("cluster-team");
    const onA = await on(nodeA, "architect", team);
    const onB = await on(nodeB, "architect", team);
    const revokedA = nextEvent(onA, "access:revoked");
    const revokedB = nextEvent(onB, "access:revoked");
    const response = await REMOVE_MEMBER(
      await buildRequest(`/api/projects/${team.projectId}/members/${team.users.architect.id}`, { method: "DELETE", user: team.users.owner }),
      routeContext({ projectId: team.projectId, userId: team.users.architect.id }),
    );
    expect(response.status).toBe(204);
    await Promise.all([revokedA, revokedB]);
    await until(() => !onA.connected && !onB.connected, "both connections are closed");
  });

  it("after kill -9 of node A, its clients reconnect to B and catch up; nothing acknowledged is lost", async () => {
    const architect = await on(nodeA, "architect");
    const mep = await on(nodeB, "mep_engineer");
    const notesA = await notesOn(nodeA, "architect");
    const notesB = await notesOn(nodeB, "mep_engineer");

    const pinId = randomUUID();
    expect(await request(architect, "pin:create", { id: pinId, anchor: { kind: "node", id: "N-88" }, revisionId: null, title: "Sprinkler main under N-88", discipline: "mep" })).toMatchObject({ ok: true });
    const commentIds: string[] = [];
    for (let i = 0; i < 5; i += 1) {
      const id = randomUUID();
      // Acknowledged by node A: stored in PostgreSQL before the answer.
      expect(await request(architect, "comment:create", { id, pinId, body: `Drop ${i * 50} mm?` })).toMatchObject({ ok: true });
      commentIds.push(id);
    }
    const before = new Date().toISOString();
    // A note edit counts as acknowledged once the other node has it (node A relays only what it stored).
    notesA.doc.getText("notes").insert(0, "Agreed on A before the crash. ");
    await until(() => notesB.doc.getText("notes").toString().includes("Agreed on A before the crash."), "B has A's edit");
    const commentAfter = randomUUID();
    expect(await request(mep, "comment:create", { id: commentAfter, pinId, body: "Seen on B." })).toMatchObject({ ok: true });

    await nodeA.crash();
    // Made while node A is gone: the client keeps it and sends it when it reconnects.
    notesA.doc.getText("notes").insert(0, "Written offline. ");
    notesA.provider.destroy();

    // The test points A's clients at B, as a load balancer would after A stopped answering.
    const presenceOnB = nextEvent(mep, "presence", lists(project.users.architect.id, project.users.mep_engineer.id), 20_000);
    const moved = await on(nodeB, "architect");
    await presenceOnB;
    const caughtUp = await request<{ comments: PresentedComment[]; pins: PresentedPin[] }>(moved, "sync:since", { since: before });
    const seen = caughtUp.ok ? caughtUp.data.comments.map((c) => c.id) : [];
    expect(seen).toContain(commentAfter);
    const all = await request<{ comments: PresentedComment[] }>(moved, "sync:since", { since: new Date(0).toISOString() });
    expect(all.ok ? all.data.comments.map((c) => c.id) : []).toEqual(expect.arrayContaining(commentIds));

    await notesOn(nodeB, "architect", notesA.doc);
    await until(() => notesB.doc.getText("notes").toString().includes("Written offline."), "the offline edit reaches B's clients");
    const fresh = await notesOn(nodeB, "viewer");
    const text = fresh.doc.getText("notes").toString();
    expect(text).toContain("Agreed on A before the crash.");
    expect(text).toContain("Written offline.");
    expect(text).toContain("hanger load");
    // And PostgreSQL holds it all, whichever node stored each part.
    const stored = new Y.Doc();
    Y.applyUpdate(stored, Y.mergeUpdates((await loadYjsUpdates({ projectId: project.projectId })).map((row) => row.update)));
    expect(stored.getText("notes").toString()).toBe(text);
  });
});

describe("two job workers", () => {
  const workers: JobsProcess[] = [];
  afterAll(async () => {
    await Promise.all(workers.map((worker) => worker.stop()));
  });

  // The digest schedule runs every minute here (pg-boss checks schedules every 30 s), so this waits up to ~2 min.
  it("send the digest and each mail exactly once", { timeout: 240_000 }, async () => {
    const fx = await createProjectFixture("cluster-jobs");
    await createPin({
      projectId: fx.projectId,
      authorId: fx.users.architect.id,
      authorName: fx.users.architect.name,
      input: { id: randomUUID(), anchor: { kind: "member", id: "D-14" }, revisionId: null, title: "May D-14 be cut for the riser?", discipline: "mep" },
    });
    const invitee = `cluster-invitee-${randomUUID().slice(0, 8)}@fixture.test`;
    const invited = await INVITE(
      await buildRequest(`/api/projects/${fx.projectId}/invitations`, { method: "POST", user: fx.users.owner, body: { email: invitee, role: "viewer" } }),
      routeContext({ projectId: fx.projectId }),
    );
    expect(invited.status).toBe(201);

    for (let i = 0; i < 2; i += 1) workers.push(await startJobsProcess({ MAIL_DIGEST_CRON: "* * * * *", MAIL_DIGEST_TIMEZONE: "UTC" }));
    const members = Object.entries(fx.users).filter(([role]) => role !== "outsider").map(([, user]) => user.email);
    const digestsTo = async (to: string) => (await listCapturedMail({ to, limit: 500 })).filter((mail) => /open thread/.test(mail.subject));
    const end = Date.now() + 200_000;
    while ((await Promise.all(members.map(digestsTo))).some((mails) => mails.length === 0)) {
      if (Date.now() > end) throw new Error(`No digest for every member within 200 s. Workers said:\n${workers.map((w) => w.output()).join("\n")}`);
      await new Promise((r) => setTimeout(r, 2000));
    }
    // Both workers keep polling the outbox (every 5 s) and the schedule: give them time to double anything.
    await new Promise((r) => setTimeout(r, 12_000));
    // Two workers really ran side by side the whole time (neither failed to start nor died).
    expect(workers.map((worker) => worker.running())).toEqual([true, true]);
    for (const member of members) expect(await digestsTo(member), member).toHaveLength(1);
    const invitations = (await listCapturedMail({ to: invitee, limit: 500 })).filter((mail) => /invited you to/.test(mail.subject));
    expect(invitations).toHaveLength(1);
  });
});
