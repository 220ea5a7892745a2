// BCF 3.0 export and import of pins and threads: export from one project, import into a fresh one, import again.
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as exportBcf } from "@/app/api/projects/[projectId]/exports/pins.bcf/route";
import { POST as importBcf } from "@/app/api/projects/[projectId]/pins/bcf/route";
import { listPinsForBcf } from "@/db/queries/bcf";
import { postComment } from "@/lib/commands/post-comment";
import { createPin } from "@/lib/commands/create-pin";
import { auditEvents, liveEvents, pins } from "@/db/schema";
import { readBcf } from "@/lib/bcf";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture, type FixtureUser } from "../support/fixtures";
import { buildRequest, routeContext, sessionCookie } from "../support/session";

let source: ProjectFixture;
let target: ProjectFixture;
const view = { camera: { position: [30, -20, 25] as [number, number, number], target: [24, 18, 6] as [number, number, number] }, result: "ULS-1", colouring: "force", sectionBox: { min: [0, 0, 0] as [number, number, number], max: [24, 36, 12] as [number, number, number] } };

beforeAll(async () => {
  requireIntegrationEnv();
  source = await createProjectFixture("bcf-source");
  target = await createProjectFixture("bcf-target");
  const { architect, structural_engineer: structural } = source.users;
  const first = randomUUID();
  await createPin({ projectId: source.projectId, authorId: architect.id, authorName: architect.name, input: { id: first, anchor: { kind: "member", id: "B-17" }, revisionId: null, title: "Can SA-01 pass under B-17?", discipline: "mep", body: "Duct below the bottom chord." } });
  await getDb().update(pins).set({ viewpoint: view, labels: ["level 2"], assignedTo: structural.email, dueAt: new Date("2026-12-10T00:00:00Z") }).where(eq(pins.id, first));
  await postComment({ id: randomUUID(), projectId: source.projectId, pinId: first, authorId: structural.id, authorName: structural.name, body: "Idle member; an opening needs the engineer of record.", kind: "comment" });
  const second = randomUUID();
  await createPin({ projectId: source.projectId, authorId: structural.id, authorName: structural.name, input: { id: second, anchor: { kind: "point", point: [1, 2, 3] }, revisionId: null, title: "Splice position", discipline: "structural" } });
  await getDb().update(pins).set({ state: "closed" }).where(eq(pins.id, second));
});
afterAll(closeDb);

const exportUrl = (p: ProjectFixture) => `/api/projects/${p.projectId}/exports/pins.bcf`;
async function upload(p: ProjectFixture, user: FixtureUser | undefined, bytes: Uint8Array) {
  const headers = new Headers({ "content-type": "application/octet-stream" });
  if (user) headers.set("cookie", await sessionCookie(user));
  const request = new Request(new URL(`/api/projects/${p.projectId}/pins/bcf`, "http://127.0.0.1"), { method: "POST", headers, body: Buffer.from(bytes) });
  return importBcf(request, routeContext({ projectId: p.projectId }));
}
async function exported(p: ProjectFixture) {
  const response = await exportBcf(await buildRequest(exportUrl(p), { user: p.users.viewer }), routeContext({ projectId: p.projectId }));
  expect(response.status).toBe(200);
  return new Uint8Array(await response.arrayBuffer());
}
const summary = (p: ProjectFixture) =>
  listPinsForBcf({ projectId: p.projectId }).then((rows) =>
    rows.map(({ pin, comments }) => ({ title: pin.title, state: pin.state, discipline: pin.discipline, labels: pin.labels, assignedTo: pin.assignedTo, dueAt: pin.dueAt?.toISOString(), comments: comments.map((c) => c.comment.body) })),
  );

describe("BCF export and import", () => {
  it("refuses outsiders (404), signed-out people (401) and viewers who may not pin (403)", async () => {
    const bytes = await exported(source);
    expect((await exportBcf(await buildRequest(exportUrl(source)), routeContext({ projectId: source.projectId }))).status).toBe(401);
    expect((await exportBcf(await buildRequest(exportUrl(source), { user: source.users.outsider }), routeContext({ projectId: source.projectId }))).status).toBe(404);
    expect((await upload(target, undefined, bytes)).status).toBe(401);
    expect((await upload(target, target.users.outsider, bytes)).status).toBe(404);
    expect((await upload(target, target.users.viewer, bytes)).status).toBe(403);
    expect(await summary(target)).toEqual([]);
  });

  it("a broken archive is a 400 listing its problems, and nothing is stored", async () => {
    const response = await upload(target, target.users.architect, new TextEncoder().encode("PK not really"));
    expect(response.status).toBe(400);
    expect((await response.json()).issues[0]).toMatchObject({ path: "archive" });
    expect(await summary(target)).toEqual([]);
  });

  it("round trip: export, import into a fresh project gives the same topics, comments and viewpoints", async () => {
    const bytes = await exported(source);
    const response = await upload(target, target.users.architect, bytes);
    expect(response.status).toBe(201);
    expect(await response.json()).toEqual({ pinsCreated: 2, commentsAdded: 2, topicsKnown: 0 });
    expect(await summary(target)).toEqual(await summary(source));
    const [imported] = await listPinsForBcf({ projectId: target.projectId });
    // The camera keeps its position and direction, and the section box its faces; result and colouring are ours only.
    expect(imported.pin.viewpoint?.camera.position).toEqual(view.camera.position);
    expect(imported.pin.viewpoint?.sectionBox).toEqual(view.sectionBox);
    // Authors on the target team are matched by e-mail; the source team's people are kept by address.
    expect(imported.comments.map((c) => c.comment.externalAuthor)).toEqual([source.users.architect.email, source.users.structural_engineer.email]);
    // Open review boards are told to fetch the pins and threads again (a "pins" live event in the same transaction).
    expect(await getDb().select().from(liveEvents).where(eq(liveEvents.projectId, target.projectId))).toMatchObject([{ kind: "pins", subjectId: target.projectId }]);
    const again = readBcf(await exported(target)).file!;
    expect(again.topics.map((t) => t.guid)).toEqual(readBcf(bytes).file!.topics.map((t) => t.guid));
  });

  it("a second import adds nothing; importing back into the source matches its own pins by GUID", async () => {
    const bytes = await exported(source);
    const before = await summary(target);
    const second = await upload(target, target.users.mep_engineer, bytes);
    expect(await second.json()).toEqual({ pinsCreated: 0, commentsAdded: 0, topicsKnown: 2 });
    expect(await summary(target)).toEqual(before);
    const back = await upload(source, source.users.architect, await exported(target));
    expect(await back.json()).toEqual({ pinsCreated: 0, commentsAdded: 0, topicsKnown: 2 });
    const audit = await getDb().select().from(auditEvents).where(eq(auditEvents.projectId, target.projectId));
    expect(audit.filter((e) => e.action === "bcf.import")).toHaveLength(2);
    // Nothing new, nothing to tell: still only the first import's live event.
    expect(await getDb().select().from(liveEvents).where(eq(liveEvents.projectId, target.projectId))).toHaveLength(1);
  });

  it("imports an official BCF 3.0 test case (buildingSMART, tests/fixtures/bcf) with its labels and comment", async () => {
    const bytes = new Uint8Array(readFileSync(join(process.cwd(), "tests/fixtures/bcf/test-cases/User assignment.bcf")));
    const response = await upload(target, target.users.architect, bytes);
    expect(await response.json()).toEqual({ pinsCreated: 1, commentsAdded: 1, topicsKnown: 0 });
    const rows = await summary(target);
    expect(rows.find((r) => r.title === "User assignment")).toMatchObject({ state: "open", assignedTo: "Architect@example.com", comments: [""] });
  });
});
