// Model files through the presigned upload path (issue 13): the browser puts the file into object storage, the
// server checks the stored bytes, validates the model from them and links the file to the revision byte for byte.
// Too large is refused from the declared size before any byte moves. Needs DATABASE_URL and the backing fakes.
import { GetObjectCommand } from "@aws-sdk/client-s3";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as requestUpload } from "@/app/api/projects/[projectId]/attachments/route";
import { POST as confirm } from "@/app/api/projects/[projectId]/attachments/[attachmentId]/confirm/route";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { attachments, modelRevisions } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { bucket, s3 } from "@/lib/storage/s3";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
const ctx = () => routeContext({ projectId: fx.projectId });
const base = () => `/api/projects/${fx.projectId}/attachments`;
// Our own small roof, pretty-printed: a re-serialised copy would lose the indentation, so equal bytes prove the
// original is kept as uploaded.
const roofText = `${JSON.stringify(generateRoof({ name: "Presigned grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 }), null, 2)}\n`;

async function uploadModelFile(user: FixtureUser, filename: string, text: string, contentType = "application/json") {
  const bytes = new TextEncoder().encode(text);
  const started = await requestUpload(await buildRequest(base(), { method: "POST", user, body: { purpose: "model", filename, contentType, sizeBytes: bytes.length } }), ctx());
  expect(started.status).toBe(201);
  const { attachmentId, uploadUrl, headers } = await started.json();
  expect((await fetch(uploadUrl, { method: "PUT", headers, body: bytes })).status).toBe(200);
  const confirmed = await confirm(await buildRequest(`${base()}/${attachmentId}/confirm`, { method: "POST", user }), routeContext({ projectId: fx.projectId, attachmentId }));
  expect(confirmed.status).toBe(200);
  return attachmentId as string;
}

const save = async (user: FixtureUser, attachmentIds: string[]) =>
  createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", user, body: { kind: "uploadFiles", attachmentIds } }), ctx());

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("model-file-upload");
});
afterAll(closeDb);

describe("model files through presigned uploads", () => {
  it("refuses a file over the model file limit from its declared size, before any byte is sent", async () => {
    // About a million nodes in our JSON format is some 60 MB (60 bytes a node, common-practice estimate).
    const response = await requestUpload(
      await buildRequest(base(), { method: "POST", user: fx.users.structural_engineer, body: { purpose: "model", filename: "stadium.json", contentType: "application/json", sizeBytes: 60_000_000 } }),
      ctx(),
    );
    expect(response.status).toBe(413);
    expect((await response.json()).error).toMatch(/limit is 20 MB/);
    expect(await getDb().select().from(attachments).where(eq(attachments.projectId, fx.projectId))).toEqual([]);
  });

  it("refuses a file with more nodes than a model may have with 413 naming the limit, counted before parsing; nothing is stored", async () => {
    // 40,000 nodes in a 1.3 MB file: within the byte limit, over the 30,000-node cap (lib/limits.ts modelCounts).
    const nodes = Array.from({ length: 40_000 }, (_, k) => `{"id":"N${k}","x":${k},"y":0,"z":0}`).join(",");
    const text = `{"format":"truss-model/1","name":"Too many nodes","materials":[],"sections":[],"nodes":[${nodes}],"members":[],"supports":[],"loadCases":[],"combinations":[]}`;
    const attachmentId = await uploadModelFile(fx.users.structural_engineer, "too-many-nodes.json", text);
    const revisionsBefore = await getDb().select().from(modelRevisions).where(eq(modelRevisions.projectId, fx.projectId));
    const response = await save(fx.users.structural_engineer, [attachmentId]);
    expect(response.status).toBe(413);
    expect((await response.json()).error).toBe('too-many-nodes.json has more than 30,000 nodes, the most one model may have (README, "Model size limits"). Split the roof or simplify it.');
    expect(await getDb().select().from(modelRevisions).where(eq(modelRevisions.projectId, fx.projectId))).toEqual(revisionsBefore);
    const [file] = await getDb().select().from(attachments).where(eq(attachments.id, attachmentId));
    expect(file.revisionId).toBeNull();
  });

  it("stores the revision from the uploaded file and keeps that file byte for byte as its original", async () => {
    const attachmentId = await uploadModelFile(fx.users.structural_engineer, "presigned-grid.json", roofText);
    const response = await save(fx.users.structural_engineer, [attachmentId]);
    expect(response.status).toBe(202);
    const { revision } = await response.json();
    const [saved] = await getDb().select().from(modelRevisions).where(eq(modelRevisions.id, revision.id));
    expect(saved).toMatchObject({ name: "Presigned grid", source: "uploaded" });
    const [file] = await getDb().select().from(attachments).where(and(eq(attachments.projectId, fx.projectId), eq(attachments.id, attachmentId)));
    expect(file.revisionId).toBe(revision.id);
    const stored = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: file.objectKey }));
    expect(Buffer.from(await stored.Body!.transformToByteArray()).toString("utf8")).toBe(roofText);
  });

  it("refuses a file already used by a revision (409) and another person's upload (404), storing nothing", async () => {
    const attachmentId = await uploadModelFile(fx.users.structural_engineer, "again.json", roofText);
    expect((await save(fx.users.structural_engineer, [attachmentId])).status).toBe(202);
    const count = async () => (await getDb().select().from(modelRevisions).where(eq(modelRevisions.projectId, fx.projectId))).length;
    const before = await count();
    expect((await save(fx.users.structural_engineer, [attachmentId])).status).toBe(409);
    // An upload of this project named in another project's request: as if it did not exist.
    const fresh = await uploadModelFile(fx.users.structural_engineer, "fresh.json", roofText);
    const other = await createProjectFixture("model-file-upload-other");
    const foreign = await createRevision(
      await buildRequest(`/api/projects/${other.projectId}/models`, { method: "POST", user: other.users.structural_engineer, body: { kind: "uploadFiles", attachmentIds: [fresh] } }),
      routeContext({ projectId: other.projectId }),
    );
    expect(foreign.status).toBe(404);
    expect(await count()).toBe(before);
  });

  it("lists every problem of an invalid uploaded model and stores no revision", async () => {
    const broken = JSON.parse(roofText);
    broken.members.push({ ...broken.members[0], id: "M-extra", j: "missing-node" });
    const attachmentId = await uploadModelFile(fx.users.structural_engineer, "broken.json", JSON.stringify(broken));
    const response = await save(fx.users.structural_engineer, [attachmentId]);
    expect(response.status).toBe(400);
    expect(JSON.stringify((await response.json()).issues)).toMatch(/missing-node/);
    const [file] = await getDb().select().from(attachments).where(eq(attachments.id, attachmentId));
    expect(file.revisionId).toBeNull();
  });
});
