// Hole 10: an upload could be replaced after its check. The presigned PUT URL stayed valid after confirm and wrote
// the very key the ready attachment pointed at, so checked content could be swapped for anything (an executable
// behind a "photo"). Browsers upload to a staging key; confirming checks the bytes read once and writes those
// bytes to a final key no URL can write.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as requestUpload } from "@/app/api/projects/[projectId]/attachments/route";
import { POST as confirm } from "@/app/api/projects/[projectId]/attachments/[attachmentId]/confirm/route";
import { GET as download } from "@/app/api/projects/[projectId]/attachments/[attachmentId]/route";
import { attachments, comments, pins } from "@/db/schema";
import { objectSize } from "@/lib/storage/s3";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

// A 1x1 PNG (PNG signature per the W3C PNG specification §5.2); "MZ" + "PE\0\0" is a Windows executable's header.
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");
const EXE = Buffer.concat([Buffer.from("MZ"), Buffer.alloc(58), Buffer.from([0x80, 0, 0, 0]), Buffer.alloc(64), Buffer.from("PE\0\0"), Buffer.alloc(200)]);

let fx: ProjectFixture;
let commentId: string;
const base = () => `/api/projects/${fx.projectId}/attachments`;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("sec-upload-swap");
  const pinId = randomUUID();
  commentId = randomUUID();
  await getDb().insert(pins).values({ id: pinId, projectId: fx.projectId, anchorKind: "member", anchorId: "B-12", title: "Opening in the chord?", discipline: "mep", authorId: fx.users.architect.id });
  await getDb().insert(comments).values({ id: commentId, pinId, authorId: fx.users.architect.id, body: "Photo attached." });
});
afterAll(closeDb);

describe("a checked upload cannot be replaced", () => {
  it("keeps serving the checked bytes after the presigned URL is used again", async () => {
    const started = await requestUpload(
      await buildRequest(base(), { method: "POST", user: fx.users.architect, body: { purpose: "comment", commentId, filename: "photo.png", contentType: "image/png", sizeBytes: PNG.length } }),
      routeContext({ projectId: fx.projectId }),
    );
    expect(started.status).toBe(201);
    const { attachmentId, uploadUrl, headers } = await started.json();
    expect((await fetch(uploadUrl, { method: "PUT", headers, body: new Uint8Array(PNG) })).status).toBe(200);
    const confirmed = await confirm(await buildRequest(`${base()}/${attachmentId}/confirm`, { method: "POST", user: fx.users.architect }), routeContext({ projectId: fx.projectId, attachmentId }));
    expect(confirmed.status).toBe(200);

    // The URL has not expired: the attacker writes through it again.
    await fetch(uploadUrl, { method: "PUT", headers, body: new Uint8Array(EXE) });

    const redirect = await download(await buildRequest(`${base()}/${attachmentId}`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId, attachmentId }));
    expect(redirect.status).toBe(302);
    const served = Buffer.from(await (await fetch(redirect.headers.get("location")!)).arrayBuffer());
    expect(served.equals(PNG)).toBe(true);

    // The ready record points at a key the upload URL does not name.
    const [row] = await getDb().select().from(attachments).where(eq(attachments.id, attachmentId));
    expect(row.state).toBe("ready");
    expect(new URL(uploadUrl).pathname).toMatch(/\/staging\//);
    expect(new URL(uploadUrl).pathname).not.toBe(`/${process.env.S3_BUCKET}/${row.objectKey}`);
    expect(row.objectKey).not.toMatch(/^staging\//);
    expect(await objectSize(row.objectKey)).toBe(PNG.length);
  });
});
