// The original file of a model upload and of a run import is kept in object storage (through @aws-sdk/client-s3,
// against the S3 fake) with an attachments row committed together with the revision / the imported runs; an
// invalid upload stores neither object nor row, and a failed database write removes the stored object again.
// Needs DATABASE_URL and the backing fakes (scripts/test.mjs starts both; see tests/support/db.ts).
import { GetObjectCommand, ListObjectsV2Command } from "@aws-sdk/client-s3";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as listRevisions, POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { POST as importRuns } from "@/app/api/projects/[projectId]/runs/route";
import { attachments, modelRevisions } from "@/db/schema";
import { generateRoof } from "@/lib/analysis/generator";
import { withStoredFiles } from "@/lib/commands/stored-files";
import { bucket, s3 } from "@/lib/storage/s3";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
const ctx = () => routeContext({ projectId: fx.projectId });
const modelsPath = () => `/api/projects/${fx.projectId}/models`;
const runsPath = () => `/api/projects/${fx.projectId}/runs`;

// Our own small roof: a 6 m x 6 m grid on 3 m modules, 1.5 m deep (keeps the solve small).
const roof = generateRoof({ name: "Northfield hall test grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 });

// A model with a member naming a missing node: refused by validation.
const brokenModel = { ...roof, members: [...roof.members, { ...roof.members[0], id: "M-extra", j: "missing-node" }] };

// A duct along x across the top chords (z = 1.5); one run, two points.
const runsCsv = [
  "run,system,shape,diameter,width,height,rotation,insulation,clearance,weight_per_metre,x,y,z",
  "SA-01,supply air,round,0.4,,,,0.05,0.1,0.3,-1,1.5,1.5",
  "SA-01,,,,,,,,,,7,1.5,1.5",
].join("\n");

async function objectKeys(purpose: "model" | "run"): Promise<string[]> {
  const listed = await s3().send(new ListObjectsV2Command({ Bucket: bucket(), Prefix: `projects/${fx.projectId}/${purpose}/` }));
  return (listed.Contents ?? []).map((object) => object.Key ?? "");
}

async function readBack(key: string): Promise<Buffer> {
  const result = await s3().send(new GetObjectCommand({ Bucket: bucket(), Key: key }));
  return Buffer.from(await result.Body!.transformToByteArray());
}

async function rows(purpose: "model" | "run") {
  return getDb()
    .select()
    .from(attachments)
    .where(and(eq(attachments.projectId, fx.projectId), eq(attachments.purpose, purpose)));
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("uploaded-originals");
});
afterAll(closeDb);

describe("model upload originals", () => {
  it("stores no object and no row for an invalid model", async () => {
    const body = { kind: "uploadJson", fileName: "broken.json", model: brokenModel };
    const response = await createRevision(await buildRequest(modelsPath(), { method: "POST", body, user: fx.users.structural_engineer }), ctx());
    expect(response.status).toBe(400);
    expect(await rows("model")).toEqual([]);
    expect(await objectKeys("model")).toEqual([]);
  });

  it("stores the uploaded JSON model with the new revision, readable byte for byte, and lists it for download", async () => {
    const body = { kind: "uploadJson", fileName: "northfield-hall.json", model: roof };
    const response = await createRevision(await buildRequest(modelsPath(), { method: "POST", body, user: fx.users.structural_engineer }), ctx());
    expect(response.status).toBe(202);
    const { revision } = await response.json();
    const [saved] = await getDb().select().from(modelRevisions).where(eq(modelRevisions.id, revision.id));
    expect(saved.number).toBe(1);

    const [file] = await rows("model");
    expect(file).toMatchObject({ revisionId: revision.id, filename: "northfield-hall.json", contentType: "application/json", state: "ready" });
    expect(await objectKeys("model")).toEqual([file.objectKey]);
    // The route receives the model as parsed JSON; the original kept is that JSON as received.
    const expected = Buffer.from(JSON.stringify(roof));
    expect((await readBack(file.objectKey)).equals(expected)).toBe(true);
    expect(file.sizeBytes).toBe(expected.length);

    const listed = await (await listRevisions(await buildRequest(modelsPath(), { user: fx.users.viewer }), ctx())).json();
    expect(listed.revisions[0].originals).toEqual([{ id: file.id, filename: "northfield-hall.json" }]);
  });

  it("stores every CSV table of a CSV upload with the new revision", async () => {
    // The Example 1 triangle (check-values §5.3) as CSV tables, as in lib/analysis/csv.test.ts.
    const tables = {
      "nodes.csv": "id,x,y,z\nA,0,0,0\nB,4,0,0\nC,2,0,1.5\n",
      "members.csv": "id,i,j,section\nAB,A,B,T\nAC,A,C,T\nBC,B,C,T\n",
      "sections.csv": "id,material,area,radiusOfGyration,outerDiameter,wallThickness\nT,S355,0.001,0.03,0.0889,0.004\n",
      "supports.csv": "node,ux,uy,uz\nA,true,true,true\nB,false,yes,1\nC,no,true,false\n",
      "loads.csv": "loadCase,node,fx,fy,fz\ngravity,C,0,0,-10\n",
    };
    const body = { kind: "uploadCsv", name: "Triangle", tables };
    const response = await createRevision(await buildRequest(modelsPath(), { method: "POST", body, user: fx.users.structural_engineer }), ctx());
    expect(response.status).toBe(202);
    const { revision } = await response.json();
    const files = (await rows("model")).filter((row) => row.revisionId === revision.id);
    expect(files.map((row) => row.filename).sort()).toEqual(Object.keys(tables).sort());
    for (const file of files) {
      expect(file.contentType).toBe("text/csv");
      expect((await readBack(file.objectKey)).toString("utf8")).toBe(tables[file.filename as keyof typeof tables]);
    }
  });

  it("stores nothing for a generated roof (no uploaded file)", async () => {
    const body = { kind: "generate", params: { name: "Generated", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
    const response = await createRevision(await buildRequest(modelsPath(), { method: "POST", body, user: fx.users.structural_engineer }), ctx());
    expect(response.status).toBe(202);
    expect(await rows("model")).toHaveLength(6);
  });
});

describe("run import originals", () => {
  it("stores no object and no row for an invalid run file", async () => {
    const bad = runsCsv.replace("0.4,,,,0.05", "wide,,,,0.05");
    const body = { revision: 1, fileName: "ducts.csv", text: bad, mode: "replace" };
    const response = await importRuns(await buildRequest(runsPath(), { method: "POST", body, user: fx.users.mep_engineer }), ctx());
    expect(response.status).toBe(400);
    expect(await rows("run")).toEqual([]);
    expect(await objectKeys("run")).toEqual([]);
  });

  it("stores the imported file as uploaded, linked to the revision", async () => {
    const body = { revision: 1, fileName: "ducts.csv", text: runsCsv, mode: "replace" };
    const response = await importRuns(await buildRequest(runsPath(), { method: "POST", body, user: fx.users.mep_engineer }), ctx());
    expect(response.status).toBe(201);
    const [revision] = await getDb()
      .select()
      .from(modelRevisions)
      .where(and(eq(modelRevisions.projectId, fx.projectId), eq(modelRevisions.number, 1)));
    const [file] = await rows("run");
    expect(file).toMatchObject({ revisionId: revision.id, filename: "ducts.csv", contentType: "text/csv", state: "ready" });
    expect((await readBack(file.objectKey)).equals(Buffer.from(runsCsv))).toBe(true);
  });
});

describe("a database write failing after the object is stored", () => {
  it("removes the stored object again, and the rolled-back transaction leaves no row", async () => {
    const before = await rows("run");
    const attempt = withStoredFiles(
      { projectId: fx.projectId, userId: fx.users.mep_engineer.id, purpose: "run", files: [{ filename: "late.csv", bytes: Buffer.from(runsCsv) }] },
      (record) =>
        getDb().transaction(async (tx) => {
          await record(tx, {});
          throw new Error("write failed after recording");
        }),
    );
    await expect(attempt).rejects.toThrow("write failed after recording");
    expect(await rows("run")).toEqual(before);
    expect(await objectKeys("run")).toEqual(before.map((row) => row.objectKey));
  });
});
