// Saved views on pins (issue 18 item 2): the viewer's view and its snapshot PNG are saved on a pin by the people the
// rule book allows, restored from GET, written into the exported BCF viewpoint, and survive export → import into a
// fresh project → export (same topics, comments and viewpoints, snapshot included).
import { randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as exportBcf } from "@/app/api/projects/[projectId]/exports/pins.bcf/route";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { POST as importBcf } from "@/app/api/projects/[projectId]/pins/bcf/route";
import { GET as getView, PUT as putView } from "@/app/api/projects/[projectId]/pins/[pinId]/viewpoint/route";
import { listPinsForBcf } from "@/db/queries/bcf";
import { attachments, pins } from "@/db/schema";
import { createPin } from "@/lib/commands/create-pin";
import { postComment } from "@/lib/commands/post-comment";
import { readBcf, type BcfFile } from "@/lib/bcf";
import { memberGlobalId } from "@/lib/ifc/guid";
import { readSnapshot } from "@/lib/commands/stored-files";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext, sessionCookie } from "../support/session";

// A 1x1 PNG (common-practice test image; PNG signature per the W3C PNG specification §5.2).
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");
const dataUrl = (bytes: Buffer) => `data:image/png;base64,${bytes.toString("base64")}`;

let source: ProjectFixture;
let target: ProjectFixture;
let pinId: string;
// The generated grid's members are named alike in both projects, so the selected member survives the round trip.
const view = {
  camera: { position: [14, -9, 11] as [number, number, number], target: [3, 3, 0] as [number, number, number], up: [0, 0, 1] as [number, number, number], fieldOfView: 50 },
  result: "ULS",
  colouring: "forceState",
  sectionBox: { min: [0, 0, -1] as [number, number, number], max: [6, 3, 2] as [number, number, number] },
};
let member: string;

async function generate(p: ProjectFixture) {
  const body = { kind: "generate", params: { name: "Test grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
  const response = await createRevision(await buildRequest(`/api/projects/${p.projectId}/models`, { method: "POST", body, user: p.users.structural_engineer }), routeContext({ projectId: p.projectId }));
  expect(response.status).toBe(202);
}
const viewUrl = (p: ProjectFixture, id: string) => `/api/projects/${p.projectId}/pins/${id}/viewpoint`;
const put = async (p: ProjectFixture, user: FixtureUser, id: string, body: unknown) => putView(await buildRequest(viewUrl(p, id), { method: "PUT", user, body }), routeContext({ projectId: p.projectId, pinId: id }));
const get = async (p: ProjectFixture, user: FixtureUser, id: string) => getView(await buildRequest(viewUrl(p, id), { user }), routeContext({ projectId: p.projectId, pinId: id }));
async function exported(p: ProjectFixture): Promise<Uint8Array> {
  const response = await exportBcf(await buildRequest(`/api/projects/${p.projectId}/exports/pins.bcf`, { user: p.users.viewer }), routeContext({ projectId: p.projectId }));
  expect(response.status).toBe(200);
  return new Uint8Array(await response.arrayBuffer());
}
async function upload(p: ProjectFixture, user: FixtureUser, bytes: Uint8Array) {
  const headers = new Headers({ "content-type": "application/octet-stream", cookie: await sessionCookie(user) });
  return importBcf(new Request(new URL(`/api/projects/${p.projectId}/pins/bcf`, "http://127.0.0.1"), { method: "POST", headers, body: Buffer.from(bytes) }), routeContext({ projectId: p.projectId }));
}
const snapshots = (p: ProjectFixture) => getDb().select().from(attachments).where(and(eq(attachments.projectId, p.projectId), eq(attachments.purpose, "snapshot")));
// Camera vectors are compared to 1e-9 (the target is rebuilt from position and direction on import).
const round = (value: unknown): unknown => (typeof value === "number" ? Number(value.toFixed(9)) : Array.isArray(value) ? value.map(round) : value && typeof value === "object" ? Object.fromEntries(Object.entries(value).map(([k, v]) => [k, round(v)])) : value);
/** What must survive a round trip: topics, comments and viewpoints (camera, selection, planes, snapshot bytes). */
const content = (file: BcfFile) =>
  file.topics.map((t) => ({
    guid: t.guid,
    title: t.title,
    status: t.status,
    comments: t.comments.map((c) => ({ guid: c.guid, text: c.text })),
    viewpoints: t.viewpoints.map((v) => ({ guid: v.guid, camera: round(v.camera), selection: v.selection, clippingPlanes: v.clippingPlanes, snapshot: v.snapshot ? Buffer.from(v.snapshot).toString("base64") : null })),
  }));

beforeAll(async () => {
  requireIntegrationEnv();
  source = await createProjectFixture("view-source");
  target = await createProjectFixture("view-target");
  await generate(source);
  await generate(target);
  const { architect, structural_engineer: structural } = source.users;
  pinId = randomUUID();
  member = "TCX-0-0";
  await createPin({ projectId: source.projectId, authorId: architect.id, authorName: architect.name, input: { id: pinId, anchor: { kind: "member", id: member }, revisionId: null, title: "Rooflight kerb on this chord?", discipline: "architectural", body: "Kerb at grid B." } });
  await postComment({ id: randomUUID(), projectId: source.projectId, pinId, authorId: structural.id, authorName: structural.name, body: "Possible with a collar; advisory, the engineer of record decides.", kind: "comment" });
});
afterAll(closeDb);

describe("saved views on pins", () => {
  it("refuses outsiders (404), viewers (403) and a member who neither raised the pin nor may close threads (403)", async () => {
    const body = { viewpoint: view, snapshot: dataUrl(PNG) };
    expect((await put(source, source.users.outsider, pinId, body)).status).toBe(404);
    expect((await put(source, source.users.viewer, pinId, body)).status).toBe(403);
    const mep = await put(source, source.users.mep_engineer, pinId, body);
    expect(mep.status).toBe(403);
    expect((await mep.json()).error).toContain("pin's author");
    expect((await put(source, source.users.architect, randomUUID(), body)).status).toBe(404);
    expect((await (await get(source, source.users.mep_engineer, pinId)).json())).toEqual({ viewpoint: null, snapshotUrl: null, canSave: false });
    expect(await snapshots(source)).toEqual([]);
  });

  it("a snapshot that is not a PNG is a 400 and nothing is stored; a snapshot id sent by the client is ignored", async () => {
    const exe = Buffer.concat([Buffer.from("MZ"), Buffer.alloc(200)]);
    const refused = await put(source, source.users.architect, pinId, { viewpoint: view, snapshot: dataUrl(exe) });
    expect(refused.status).toBe(400);
    expect(await snapshots(source)).toEqual([]);
    const [row] = await getDb().select({ viewpoint: pins.viewpoint }).from(pins).where(eq(pins.id, pinId));
    expect(row.viewpoint).toBeNull();
    const foreign = await put(source, source.users.architect, pinId, { viewpoint: { ...view, snapshotId: randomUUID() } });
    expect(foreign.status).toBe(200);
    const [after] = await getDb().select({ viewpoint: pins.viewpoint }).from(pins).where(eq(pins.id, pinId));
    expect(after.viewpoint).not.toHaveProperty("snapshotId");
  });

  it("the pin's author saves the view with its snapshot; GET restores it with a link to the snapshot", async () => {
    const saved = await put(source, source.users.architect, pinId, { viewpoint: { ...view, selectedMember: member }, snapshot: dataUrl(PNG) });
    expect(saved.status).toBe(200);
    expect(await saved.json()).toEqual({ viewpoint: { ...view, selectedMember: member }, snapshot: true });
    const answer = await (await get(source, source.users.viewer, pinId)).json();
    expect(answer.viewpoint).toEqual({ ...view, selectedMember: member });
    expect(answer.snapshotUrl).toMatch(/^https?:\/\//);
    expect(answer.canSave).toBe(false);
    expect((await (await get(source, source.users.structural_engineer, pinId)).json()).canSave).toBe(true);
    const [stored] = await snapshots(source);
    expect(Buffer.from((await readSnapshot({ projectId: source.projectId, attachmentId: stored.id }))!)).toEqual(PNG);
  });

  it("round trip: the export carries the viewpoint with its snapshot; import into a fresh project and export again give the same topics, comments and viewpoints", async () => {
    const first = readBcf(await exported(source)).file!;
    const [topic] = first.topics;
    expect(topic.viewpoints).toHaveLength(1);
    expect(topic.viewpoints[0].selection).toEqual([memberGlobalId(member)]);
    expect(topic.viewpoints[0].clippingPlanes).toHaveLength(6);
    expect(Buffer.from(topic.viewpoints[0].snapshot!)).toEqual(PNG);

    const response = await upload(target, target.users.architect, await exported(source));
    expect(response.status).toBe(201);
    // The pin's opening text and the reply: two comments.
    expect(await response.json()).toEqual({ pinsCreated: 1, commentsAdded: 2, topicsKnown: 0 });
    const [imported] = await listPinsForBcf({ projectId: target.projectId });
    expect(imported.pin.viewpoint?.selectedMember).toBe(member);
    expect(Buffer.from((await readSnapshot({ projectId: target.projectId, attachmentId: imported.pin.viewpoint!.snapshotId! }))!)).toEqual(PNG);

    const again = readBcf(await exported(target)).file!;
    expect(content(again)).toEqual(content(first));
    // A second import stores no second snapshot.
    await upload(target, target.users.architect, await exported(source));
    expect(await snapshots(target)).toHaveLength(1);
  });

  it("saving the view again replaces its snapshot: the old file and its record are removed", async () => {
    const [before] = await snapshots(source);
    const again = await put(source, source.users.structural_engineer, pinId, { viewpoint: view, snapshot: dataUrl(PNG) });
    expect(again.status).toBe(200);
    const after = await snapshots(source);
    expect(after).toHaveLength(1);
    expect(after[0].id).not.toBe(before.id);
    expect(await readSnapshot({ projectId: source.projectId, attachmentId: before.id })).toBeUndefined();
  });
});
