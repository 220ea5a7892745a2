// Saved views and pins placed in 3D, tried with hostile input: numbers out of reach or not finite, a camera looking
// at itself, a zero up vector, a reversed section box, oversized strings. Each is refused whole with every problem
// listed (one schema, lib/realtime/viewpoint.ts), over the socket and over HTTP, and nothing is written.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { PUT as PUT_VIEW } from "@/app/api/projects/[projectId]/pins/[pinId]/viewpoint/route";
import { comments, pins } from "@/db/schema";
import { createPin } from "@/lib/commands/create-pin";
import { getDb } from "../support/db";
import { request } from "../support/realtime";
import { realtimeProjectSuite } from "../support/realtime-suite";
import { buildRequest, routeContext } from "../support/session";

const suite = realtimeProjectSuite("hostile-views");

// Six problems at once: each must be named by its path.
const hostileView = {
  camera: { position: [2e6, 0, 0], target: [0, 0, 0], up: [0, 0, 0], fieldOfView: 500 },
  result: "",
  colouring: "x".repeat(61),
  sectionBox: { min: [10, 0, 0], max: [0, 5, 5] },
};
const hostilePaths = ["camera.position", "camera.up", "camera.fieldOfView", "result", "colouring", "sectionBox.max"];

async function newPin(): Promise<string> {
  const { projectId, users } = suite.project;
  const id = randomUUID();
  await createPin({ projectId, authorId: users.architect.id, authorName: users.architect.name, input: { id, anchor: { kind: "member", id: "TCX-1-1" }, revisionId: null, title: "Hostile views", discipline: "general" } });
  return id;
}

describe("a hostile view on a comment (socket)", () => {
  it("is refused with every problem listed, and the comment is not written", async () => {
    const pinId = await newPin();
    const architect = await suite.signedIn("architect");
    const id = randomUUID();
    const ack = await request(architect, "comment:create", { id, pinId, body: "Look here.", viewpoint: hostileView });
    expect(ack.ok).toBe(false);
    const paths = !ack.ok ? (ack.issues ?? []).map((i) => i.path) : [];
    expect(paths).toEqual(expect.arrayContaining(hostilePaths.map((p) => `viewpoint.${p}`)));
    expect(await getDb().select().from(comments).where(eq(comments.id, id))).toHaveLength(0);
  });

  it("refuses a camera that looks at itself, and numbers sent as text", async () => {
    const pinId = await newPin();
    const architect = await suite.signedIn("architect");
    const still = await request(architect, "comment:create", { id: randomUUID(), pinId, body: "x", viewpoint: { camera: { position: [1, 2, 3], target: [1, 2, 3] } } });
    expect(!still.ok && still.issues?.map((i) => i.path)).toEqual(["viewpoint.camera.target"]);
    const text = await request(architect, "comment:create", { id: randomUUID(), pinId, body: "x", viewpoint: { camera: { position: ["1", 2, 3], target: [0, 0, 0] } } });
    expect(text.ok).toBe(false);
  });
});

describe("a hostile point for a pin placed in 3D (socket)", () => {
  it("refuses a point that is not three numbers and stores no pin", async () => {
    const architect = await suite.signedIn("architect");
    for (const point of [[1, 2], [1, 2, 3, 4], ["1", 2, 3], [null, 0, 0], "1,2,3"]) {
      const id = randomUUID();
      const ack = await request(architect, "pin:create", { id, anchor: { kind: "member", id: "TCX-1-1", point }, revisionId: null, title: "Here", discipline: "general" });
      expect(ack.ok, JSON.stringify(point)).toBe(false);
      expect(await getDb().select().from(pins).where(eq(pins.id, id))).toHaveLength(0);
    }
  });
});

describe("a hostile view on a pin (HTTP PUT …/pins/<pin>/viewpoint)", () => {
  it("is a 400 listing every problem; a number beyond double range (1e400 parses to Infinity) too; nothing is saved", async () => {
    const pinId = await newPin();
    const { projectId, users } = suite.project;
    const url = `/api/projects/${projectId}/pins/${pinId}/viewpoint`;
    const all = await PUT_VIEW(await buildRequest(url, { method: "PUT", user: users.architect, body: { viewpoint: hostileView } }), routeContext({ projectId, pinId }));
    expect(all.status).toBe(400);
    const body = (await all.json()) as { error: string; issues: { path: string }[] };
    expect(body.issues.map((i) => i.path)).toEqual(expect.arrayContaining(hostilePaths.map((p) => `viewpoint.${p}`)));
    const rawBody = '{"viewpoint":{"camera":{"position":[1e400,0,0],"target":[0,0,0]}}}';
    const infinite = await PUT_VIEW(await buildRequest(url, { method: "PUT", user: users.architect, rawBody }), routeContext({ projectId, pinId }));
    expect(infinite.status).toBe(400);
    const [row] = await getDb().select({ viewpoint: pins.viewpoint }).from(pins).where(eq(pins.id, pinId));
    expect(row.viewpoint).toBeNull();
  });
});
