// Issue 17 item 7: pins placed where someone clicked in 3D (member or node id and the point clicked, seen by the
// others at that spot) and saved views on comments (stored with the comment, sent to the room, read back by HTTP and
// the reconnect catch-up, exported to BCF as a viewpoint the comment references). Refusals first: a viewer may not
// place a pin nor comment with a view (rule book: pin.create, comment.create), an outsider reads no thread.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { GET as GET_THREAD } from "@/app/api/projects/[projectId]/pins/[pinId]/comments/route";
import { GET as GET_PINS } from "@/app/api/projects/[projectId]/pins/route";
import { GET as EXPORT_BCF } from "@/app/api/projects/[projectId]/exports/pins.bcf/route";
import { POST as IMPORT_BCF } from "@/app/api/projects/[projectId]/pins/bcf/route";
import { comments, pins } from "@/db/schema";
import { readBcf } from "@/lib/bcf";
import { savePinViewpoint } from "@/lib/commands/save-pin-viewpoint";
import type { CatchUp, PresentedComment, PresentedPin } from "@/lib/realtime/events";
import type { Viewpoint } from "@/lib/realtime/viewpoint";
import { getDb } from "../support/db";
import { createProjectFixture, type FixtureUser } from "../support/fixtures";
import { nextEvent, request } from "../support/realtime";
import { realtimeProjectSuite } from "../support/realtime-suite";
import { buildRequest, routeContext, sessionCookie } from "../support/session";

const suite = realtimeProjectSuite("pins-in-3d");

// Invented demo-like values: a point 1.5 m along a top chord of a 3 m module grid, 1.8 m deep.
const onChord: [number, number, number] = [7.5, 6, 1.8];
const view: Viewpoint = {
  camera: { position: [30, -12, 18], target: [7.5, 6, 1.8], up: [0, 0, 1], fieldOfView: 50 },
  selectedMember: "TCX-2-2",
  result: "ULS-1",
  colouring: "deltaForce",
  sectionBox: { min: [3, 3, -0.5], max: [12, 9, 2.5] },
};

const pinView: Viewpoint = { camera: { position: [3, -20, 25], target: [3, 3, 1.8] } };
const pinInput = (anchor: unknown) => ({ id: randomUUID(), anchor, revisionId: null, title: "Sprinkler main under this chord?", discipline: "mep" });
async function thread(pinId: string, user: FixtureUser) {
  const { projectId } = suite.project;
  return GET_THREAD(await buildRequest(`/api/projects/${projectId}/pins/${pinId}/comments`, { user }), routeContext({ projectId, pinId }));
}

describe("pins placed with a click in 3D", () => {
  it("keeps the member id and the point clicked, and the others see the pin appear at that spot", async () => {
    const architect = await suite.signedIn("architect");
    const mep = await suite.signedIn("mep_engineer");
    const input = pinInput({ kind: "member", id: "TCX-2-2", point: onChord });
    const seen = nextEvent(mep, "pin:created", (pin) => pin.id === input.id);
    const ack = await request<PresentedPin>(architect, "pin:create", input);
    expect(ack).toMatchObject({ ok: true, data: { anchor: { kind: "member", id: "TCX-2-2", point: onChord } } });
    expect((await seen).anchor).toEqual({ kind: "member", id: "TCX-2-2", point: onChord });
    const [row] = await getDb().select().from(pins).where(eq(pins.id, input.id));
    expect([row.anchorKind, row.anchorId, row.anchorX, row.anchorY, row.anchorZ]).toEqual(["member", "TCX-2-2", ...onChord]);
    // The page load reads it the same way.
    const { projectId } = suite.project;
    const listed = (await (await GET_PINS(await buildRequest(`/api/projects/${projectId}/pins`, { user: suite.project.users.viewer }), routeContext({ projectId }))).json()) as { pins: PresentedPin[] };
    expect(listed.pins.find((p) => p.id === input.id)?.anchor).toEqual({ kind: "member", id: "TCX-2-2", point: onChord });
  });

  it("keeps a node pin's node and point, and a pin typed by id stays without a point", async () => {
    const architect = await suite.signedIn("architect");
    const onNode = await request<PresentedPin>(architect, "pin:create", pinInput({ kind: "node", id: "T-2-2", point: [6, 6, 1.8] }));
    expect(onNode).toMatchObject({ ok: true, data: { anchor: { kind: "node", id: "T-2-2", point: [6, 6, 1.8] } } });
    const typed = await request<PresentedPin>(architect, "pin:create", pinInput({ kind: "member", id: "BCX-1-1" }));
    expect(typed.ok && typed.data.anchor).toEqual({ kind: "member", id: "BCX-1-1" });
  });

  it("refuses a viewer (the rule book's pin.create) and stores nothing", async () => {
    const viewer = await suite.signedIn("viewer");
    const input = pinInput({ kind: "member", id: "TCX-2-2", point: onChord });
    const ack = await request(viewer, "pin:create", input);
    expect(ack.ok).toBe(false);
    expect(await getDb().select().from(pins).where(eq(pins.id, input.id))).toHaveLength(0);
  });
});

describe("saved views on comments", () => {
  it("stores the view with the comment, sends it to the room, and answers it over HTTP and in the catch-up", async () => {
    const since = new Date(Date.now() - 1000).toISOString();
    const architect = await suite.signedIn("architect");
    const mep = await suite.signedIn("mep_engineer");
    const pin = await request<PresentedPin>(architect, "pin:create", pinInput({ kind: "member", id: "TCX-2-2", point: onChord }));
    if (!pin.ok) throw new Error(pin.error);
    const id = randomUUID();
    const seen = nextEvent(mep, "comment:created", (c) => c.id === id);
    const ack = await request<PresentedComment>(architect, "comment:create", { id, pinId: pin.data.id, body: "Seen from the south-west, cut to the bay.", viewpoint: view });
    expect(ack).toMatchObject({ ok: true, data: { viewpoint: view } });
    expect((await seen).viewpoint).toEqual(view);
    const [row] = await getDb().select().from(comments).where(eq(comments.id, id));
    expect(row.viewpoint).toEqual(view);

    const answer = await thread(pin.data.id, suite.project.users.viewer);
    expect(answer.status).toBe(200);
    const { comments: listed } = (await answer.json()) as { comments: PresentedComment[] };
    expect(listed.find((c) => c.id === id)?.viewpoint).toEqual(view);
    const catchUp = await request<CatchUp>(mep, "sync:since", { since });
    expect(catchUp.ok && catchUp.data.comments.find((c) => c.id === id)?.viewpoint).toEqual(view);
    // A comment written without a view has none.
    const plain = await request<PresentedComment>(architect, "comment:create", { id: randomUUID(), pinId: pin.data.id, body: "No view here." });
    expect(plain.ok && plain.data.viewpoint).toBeNull();
  });

  it("exports the comment's view as a BCF viewpoint that the comment references, and an import keeps it on the comment", async () => {
    const architect = await suite.signedIn("architect");
    const pin = await request<PresentedPin>(architect, "pin:create", pinInput({ kind: "node", id: "T-1-1", point: [3, 3, 1.8] }));
    if (!pin.ok) throw new Error(pin.error);
    const { users } = suite.project;
    await savePinViewpoint({ projectId: suite.project.projectId, pinId: pin.data.id, actorId: users.architect.id, view: pinView });
    const id = randomUUID();
    expect((await request(architect, "comment:create", { id, pinId: pin.data.id, body: "With my view.", viewpoint: view })).ok).toBe(true);
    const { projectId } = suite.project;
    const response = await EXPORT_BCF(await buildRequest(`/api/projects/${projectId}/exports/pins.bcf`, { user: suite.project.users.viewer }), routeContext({ projectId }));
    expect(response.status).toBe(200);
    const { file } = readBcf(new Uint8Array(await response.arrayBuffer()));
    const topic = file!.topics.find((t) => t.guid === pin.data.id)!;
    const comment = topic.comments.find((c) => c.guid === id)!;
    const viewpoint = topic.viewpoints.find((v) => v.guid === comment.viewpointGuid)!;
    expect(viewpoint.camera?.position).toEqual(view.camera.position);
    expect(viewpoint.clippingPlanes).toHaveLength(6);

    // Imported into a fresh project, the comment keeps its view (the camera target is rebuilt 10 m along the view
    // direction, lib/bcf/viewpoint.ts; the section box and the camera's position come back as they were).
    const fresh = await createProjectFixture("pins-in-3d-import");
    const bytes = await EXPORT_BCF(await buildRequest(`/api/projects/${projectId}/exports/pins.bcf`, { user: suite.project.users.viewer }), routeContext({ projectId }));
    const headers = new Headers({ "content-type": "application/octet-stream", cookie: await sessionCookie(fresh.users.structural_engineer) });
    const imported = await IMPORT_BCF(new Request(new URL(`/api/projects/${fresh.projectId}/pins/bcf`, "http://127.0.0.1"), { method: "POST", headers, body: Buffer.from(await bytes.arrayBuffer()) }), routeContext({ projectId: fresh.projectId }));
    expect(imported.status).toBe(201);
    const [row] = await getDb().select().from(comments).where(eq(comments.bcfGuid, id));
    expect(row.viewpoint?.camera.position).toEqual(view.camera.position);
    expect(row.viewpoint?.sectionBox).toEqual(view.sectionBox);
    // The topic's first viewpoint is the pin's own saved view, which stays the pin's.
    const [importedPin] = await getDb().select().from(pins).where(eq(pins.id, row.pinId));
    expect(importedPin.viewpoint?.camera.position).toEqual(pinView.camera.position);
  });

  it("refuses a viewer's comment with a view, and shows no thread to an outsider (404)", async () => {
    const architect = await suite.signedIn("architect");
    const viewer = await suite.signedIn("viewer");
    const pin = await request<PresentedPin>(architect, "pin:create", pinInput({ kind: "member", id: "TCX-2-2" }));
    if (!pin.ok) throw new Error(pin.error);
    const id = randomUUID();
    expect((await request(viewer, "comment:create", { id, pinId: pin.data.id, body: "Me too.", viewpoint: view })).ok).toBe(false);
    expect(await getDb().select().from(comments).where(eq(comments.id, id))).toHaveLength(0);
    expect((await thread(pin.data.id, suite.project.users.outsider)).status).toBe(404);
  });
});
