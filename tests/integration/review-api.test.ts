// GET routes for page loads: pins with filters, one pin's thread, and the signed-in person's notifications.
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listPins } from "@/app/api/projects/[projectId]/pins/route";
import { GET as listComments } from "@/app/api/projects/[projectId]/pins/[pinId]/comments/route";
import { GET as listNotifications } from "@/app/api/notifications/route";
import { PATCH as markRead } from "@/app/api/notifications/[notificationId]/route";
import { postComment } from "@/lib/commands/post-comment";
import { createPin } from "@/lib/commands/create-pin";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let project: ProjectFixture;
let memberPinId: string;

beforeAll(async () => {
  requireIntegrationEnv();
  project = await createProjectFixture("review-api");
  const { architect, mep_engineer: mep } = project.users;
  memberPinId = randomUUID();
  await createPin({
    projectId: project.projectId,
    authorId: architect.id,
    authorName: architect.name,
    input: { id: memberPinId, anchor: { kind: "member", id: "TC-3" }, revisionId: null, title: "Top chord splice", discipline: "structural", body: "Where is the splice?" },
  });
  await createPin({
    projectId: project.projectId,
    authorId: mep.id,
    authorName: mep.name,
    input: { id: randomUUID(), anchor: { kind: "point", point: [1, 2, 3] }, revisionId: null, title: "Riser here", discipline: "mep" },
  });
  await postComment({ id: randomUUID(), projectId: project.projectId, pinId: memberPinId, authorId: mep.id, authorName: mep.name, body: `@${architect.name} at node N-12.`, kind: "comment" });
});
afterAll(closeDb);

const pinsUrl = (query = "") => `/api/projects/${project.projectId}/pins${query}`;

describe("GET /api/projects/[projectId]/pins", () => {
  it("answers 401 signed out and 404 to outsiders", async () => {
    expect((await listPins(await buildRequest(pinsUrl()), routeContext({ projectId: project.projectId }))).status).toBe(401);
    const outsider = await listPins(await buildRequest(pinsUrl(), { user: project.users.outsider }), routeContext({ projectId: project.projectId }));
    expect(outsider.status).toBe(404);
  });

  it("lists pins for any member, filtered by discipline, author and state", async () => {
    const all = await listPins(await buildRequest(pinsUrl(), { user: project.users.viewer }), routeContext({ projectId: project.projectId }));
    expect((await all.json()).pins).toHaveLength(2);
    const mep = await listPins(await buildRequest(pinsUrl("?discipline=mep"), { user: project.users.viewer }), routeContext({ projectId: project.projectId }));
    expect((await mep.json()).pins.map((p: { title: string }) => p.title)).toEqual(["Riser here"]);
    const byAuthor = await listPins(
      await buildRequest(pinsUrl(`?authorId=${project.users.architect.id}&state=open`), { user: project.users.viewer }),
      routeContext({ projectId: project.projectId }),
    );
    expect((await byAuthor.json()).pins).toMatchObject([{ id: memberPinId, anchor: { kind: "member", id: "TC-3" }, commentCount: 2 }]);
  });

  it("answers 400 with issues for an unknown filter value", async () => {
    const response = await listPins(await buildRequest(pinsUrl("?state=pending"), { user: project.users.viewer }), routeContext({ projectId: project.projectId }));
    expect(response.status).toBe(400);
    expect((await response.json()).issues[0].path).toBe("state");
  });
});

describe("GET /api/projects/[projectId]/pins/[pinId]/comments", () => {
  it("returns the thread oldest first, and 404 for a pin of another project", async () => {
    const url = `/api/projects/${project.projectId}/pins/${memberPinId}/comments`;
    const response = await listComments(await buildRequest(url, { user: project.users.owner }), routeContext({ projectId: project.projectId, pinId: memberPinId }));
    const body = await response.json();
    expect(body.comments.map((c: { body: string }) => c.body)).toEqual(["Where is the splice?", `@${project.users.architect.name} at node N-12.`]);
    const other = await createProjectFixture("review-api-other");
    const foreign = await listComments(
      await buildRequest(`/api/projects/${other.projectId}/pins/${memberPinId}/comments`, { user: other.users.owner }),
      routeContext({ projectId: other.projectId, pinId: memberPinId }),
    );
    expect(foreign.status).toBe(404);
  });
});

describe("/api/notifications", () => {
  it("lists the mention for the person named, and marks it read only for them", async () => {
    expect((await listNotifications(await buildRequest("/api/notifications"), undefined)).status).toBe(401);
    const response = await listNotifications(await buildRequest("/api/notifications?unread=1", { user: project.users.architect }), undefined);
    const { notifications } = await response.json();
    expect(notifications).toMatchObject([{ kind: "mention", readAt: null, payload: { pinId: memberPinId, byName: project.users.mep_engineer.name } }]);
    const id = notifications[0].id;
    const byOther = await markRead(await buildRequest(`/api/notifications/${id}`, { method: "PATCH", body: { read: true }, user: project.users.owner }), routeContext({ notificationId: id }));
    expect(byOther.status).toBe(404);
    const mine = await markRead(await buildRequest(`/api/notifications/${id}`, { method: "PATCH", body: { read: true }, user: project.users.architect }), routeContext({ notificationId: id }));
    expect((await mine.json()).notification.readAt).not.toBeNull();
    const unread = await listNotifications(await buildRequest("/api/notifications?unread=1", { user: project.users.architect }), undefined);
    expect((await unread.json()).notifications).toEqual([]);
  });
});
