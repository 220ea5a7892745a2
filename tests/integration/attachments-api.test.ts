// Comment attachments end to end through @aws-sdk/client-s3 against the S3 fake: presigned upload, confirmation by
// content, listing, presigned download, refusals (wrong type whatever the name, over-size) and the sweep of
// uploads nobody confirmed. Needs DATABASE_URL and the backing fakes (scripts/test.mjs starts both).
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listAttachments, POST as requestUpload } from "@/app/api/projects/[projectId]/attachments/route";
import { POST as confirm } from "@/app/api/projects/[projectId]/attachments/[attachmentId]/confirm/route";
import { GET as download } from "@/app/api/projects/[projectId]/attachments/[attachmentId]/route";
import { attachments, comments, pins } from "@/db/schema";
import { sweepStaleUploads, storeFile } from "@/lib/commands/stored-files";
import { FILE_RULES } from "@/lib/storage/content-check";
import { getObject, objectSize } from "@/lib/storage/s3";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

// A 1x1 PNG (common-practice test image; PNG signature per the W3C PNG specification §5.2).
const PNG = Buffer.from("iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mP8z8BQDwAEhQGAhKmMIQAAAABJRU5ErkJggg==", "base64");
// "%PDF-" header per ISO 32000; "MZ" DOS header of Windows executables.
const PDF = Buffer.from("%PDF-1.7\n1 0 obj\n<< /Type /Catalog >>\nendobj\ntrailer\n<< /Root 1 0 R >>\n%%EOF\n", "latin1");
const EXE = Buffer.concat([Buffer.from("MZ"), Buffer.alloc(58), Buffer.from([0x80, 0, 0, 0]), Buffer.alloc(64), Buffer.from("PE\0\0"), Buffer.alloc(200)]);

let fx: ProjectFixture;
let commentId: string;
const base = () => `/api/projects/${fx.projectId}/attachments`;
const ctx = () => routeContext({ projectId: fx.projectId });
const itemCtx = (attachmentId: string) => routeContext({ projectId: fx.projectId, attachmentId });

async function ask(user: FixtureUser | undefined, body: Record<string, unknown>) {
  return requestUpload(await buildRequest(base(), { method: "POST", user, body }), ctx());
}

/** Request, PUT through the presigned URL (as a browser would), then confirm; returns the confirm response. */
async function upload(filename: string, bytes: Buffer, contentType: string, declaredSize = bytes.length) {
  const started = await ask(fx.users.architect, { purpose: "comment", commentId, filename, contentType, sizeBytes: declaredSize });
  expect(started.status).toBe(201);
  const { attachmentId, uploadUrl, headers } = await started.json();
  const put = await fetch(uploadUrl, { method: "PUT", headers, body: new Uint8Array(bytes) });
  expect(put.status).toBe(200);
  const confirmed = await confirm(await buildRequest(`${base()}/${attachmentId}/confirm`, { method: "POST", user: fx.users.architect }), itemCtx(attachmentId));
  return { attachmentId, confirmed };
}

async function row(attachmentId: string) {
  const [found] = await getDb().select().from(attachments).where(eq(attachments.id, attachmentId));
  return found;
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("attachments-api");
  const pinId = randomUUID();
  commentId = randomUUID();
  await getDb().insert(pins).values({ id: pinId, projectId: fx.projectId, anchorKind: "member", anchorId: "B-12", title: "Duct through bottom chord?", discipline: "mep", authorId: fx.users.architect.id });
  await getDb().insert(comments).values({ id: commentId, pinId, authorId: fx.users.architect.id, body: "Photo of the site mock-up attached." });
});
afterAll(closeDb);

describe("comment attachments", () => {
  it("round-trips a PNG: presigned upload, confirm by content, list, presigned download of the same bytes", async () => {
    const { attachmentId, confirmed } = await upload("site-photo.png", PNG, "image/png");
    expect(confirmed.status).toBe(200);
    expect((await confirmed.json()).attachment).toMatchObject({ id: attachmentId, filename: "site-photo.png", contentType: "image/png", sizeBytes: PNG.length, commentId });

    const listed = await listAttachments(await buildRequest(`${base()}?commentId=${commentId}`, { user: fx.users.viewer }), ctx());
    expect(listed.status).toBe(200);
    expect((await listed.json()).attachments.map((a: { id: string }) => a.id)).toContain(attachmentId);

    const redirect = await download(await buildRequest(`${base()}/${attachmentId}`, { user: fx.users.viewer }), itemCtx(attachmentId));
    expect(redirect.status).toBe(302);
    const fetched = await fetch(redirect.headers.get("location")!);
    expect(fetched.status).toBe(200);
    expect(Buffer.from(await fetched.arrayBuffer()).equals(PNG)).toBe(true);
    expect(Buffer.from((await getObject((await row(attachmentId)).objectKey))!).equals(PNG)).toBe(true);
  });

  it("records PDF bytes named .png as a PDF: the type comes from the bytes, never the name", async () => {
    const { confirmed } = await upload("drawing.png", PDF, "image/png");
    expect(confirmed.status).toBe(200);
    expect((await confirmed.json()).attachment.contentType).toBe("application/pdf");
  });

  it("refuses an executable named .png, deletes the object and leaves no record", async () => {
    const { attachmentId, confirmed } = await upload("holiday.png", EXE, "image/png");
    expect(confirmed.status).toBe(400);
    const body = await confirmed.json();
    expect(body.error).toMatch(/EXE/);
    expect(body.issues).toEqual([{ path: "file", message: body.error }]);
    expect(await row(attachmentId)).toBeUndefined();
    expect(await objectSize(`projects/${fx.projectId}/comment/${attachmentId}`)).toBeNull();
  });

  it("refuses an over-size file when declared, and when the stored bytes exceed the limit", async () => {
    const limit = FILE_RULES.comment.maxBytes;
    const declared = await ask(fx.users.architect, { purpose: "comment", commentId, filename: "big.png", contentType: "image/png", sizeBytes: limit + 1 });
    expect(declared.status).toBe(413);
    expect((await declared.json()).error).toContain("the limit is 10 MB");

    const big = Buffer.concat([PNG, Buffer.alloc(limit + 1 - PNG.length)]);
    const { attachmentId, confirmed } = await upload("big.png", big, "image/png", 1000);
    expect(confirmed.status).toBe(413);
    expect(await row(attachmentId)).toBeUndefined();
    expect(await objectSize(`projects/${fx.projectId}/comment/${attachmentId}`)).toBeNull();
  });

  it("answers 401 signed out, 404 to outsiders, 403 to viewers and to members who did not write the comment, 400 on bad input", async () => {
    const body = { purpose: "comment", commentId, filename: "x.png", contentType: "image/png", sizeBytes: 10 };
    expect((await ask(undefined, body)).status).toBe(401);
    expect((await ask(fx.users.outsider, body)).status).toBe(404);
    expect((await ask(fx.users.viewer, body)).status).toBe(403);
    expect((await ask(fx.users.mep_engineer, body)).status).toBe(403);
    expect((await ask(fx.users.architect, { ...body, commentId: randomUUID() })).status).toBe(404);
    const bad = await ask(fx.users.architect, { purpose: "comment", filename: "a/b.png", contentType: "image/png", sizeBytes: 0 });
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues.map((i: { path: string }) => i.path).sort()).toEqual(["commentId", "filename", "sizeBytes"]);
    expect((await listAttachments(await buildRequest(`${base()}?commentId=${commentId}`, { user: fx.users.outsider }), ctx())).status).toBe(404);
  });

  it("lets only the uploader confirm, and serves nothing before the bytes are confirmed", async () => {
    const started = await ask(fx.users.architect, { purpose: "comment", commentId, filename: "plan.png", contentType: "image/png", sizeBytes: PNG.length });
    const { attachmentId, uploadUrl } = await started.json();
    await fetch(uploadUrl, { method: "PUT", body: new Uint8Array(PNG) });
    const confirmAs = async (user: FixtureUser) => confirm(await buildRequest(`${base()}/${attachmentId}/confirm`, { method: "POST", user }), itemCtx(attachmentId));
    expect((await download(await buildRequest(`${base()}/${attachmentId}`, { user: fx.users.architect }), itemCtx(attachmentId))).status).toBe(404);
    expect((await confirmAs(fx.users.owner)).status).toBe(404);
    expect((await confirmAs(fx.users.outsider)).status).toBe(404);
    expect((await confirmAs(fx.users.architect)).status).toBe(200);
    expect((await confirmAs(fx.users.architect)).status).toBe(200);
    expect((await download(await buildRequest(`${base()}/${attachmentId}`, { user: fx.users.outsider }), itemCtx(attachmentId))).status).toBe(404);
  });

  it("answers a confirmation before any upload with a 400 and keeps the upload open", async () => {
    const started = await ask(fx.users.architect, { purpose: "comment", commentId, filename: "later.png", contentType: "image/png", sizeBytes: PNG.length });
    const { attachmentId } = await started.json();
    const early = await confirm(await buildRequest(`${base()}/${attachmentId}/confirm`, { method: "POST", user: fx.users.architect }), itemCtx(attachmentId));
    expect(early.status).toBe(400);
    expect((await early.json()).error).toBe("Nothing has been uploaded for this file yet.");
    expect((await row(attachmentId)).state).toBe("pending");
  });

  it("sweeps uploads that were never confirmed, with any bytes they left", async () => {
    const started = await ask(fx.users.architect, { purpose: "comment", commentId, filename: "abandoned.png", contentType: "image/png", sizeBytes: PNG.length });
    const { attachmentId, uploadUrl } = await started.json();
    await fetch(uploadUrl, { method: "PUT", body: new Uint8Array(PNG) });
    const later = new Date(Date.now() + 2 * 60 * 60_000);
    expect(await sweepStaleUploads({ now: later })).toBeGreaterThanOrEqual(1);
    expect(await row(attachmentId)).toBeUndefined();
    expect(await objectSize(`projects/${fx.projectId}/comment/${attachmentId}`)).toBeNull();
  });

  it("stores a server-received model file only after its bytes pass, and refuses broken JSON without storing", async () => {
    const model = Buffer.from(JSON.stringify({ format: "truss-model/1", name: "Northfield hall", nodes: [] }));
    const stored = await storeFile({ projectId: fx.projectId, userId: fx.users.structural_engineer.id, purpose: "model", filename: "hall.json", bytes: model, links: {} });
    expect(stored).toMatchObject({ state: "ready", contentType: "application/json", sizeBytes: model.length });
    expect(Buffer.from((await getObject(stored.objectKey))!).equals(model)).toBe(true);
    await expect(
      storeFile({ projectId: fx.projectId, userId: fx.users.structural_engineer.id, purpose: "model", filename: "hall.json", bytes: Buffer.from('{"format":'), links: {} }),
    ).rejects.toMatchObject({ status: 400 });
  });
});
