// Issue 11 hole 11: a write may only link to ids of its own project. The helper is checked directly, and through
// the upload route (a revision of another project, a run that does not exist).
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as requestUpload } from "@/app/api/projects/[projectId]/attachments/route";
import { attachments, modelRevisions } from "@/db/schema";
import { triangleModel } from "@/tests/support/fixtures/analysis-models";
import { requireSameProject } from "@/lib/commands/require-same-project";
import { HttpError } from "@/lib/http/errors";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let a: ProjectFixture;
let b: ProjectFixture;
let revisionOfA: string;

beforeAll(async () => {
  requireIntegrationEnv();
  [a, b] = await Promise.all([createProjectFixture("links-a"), createProjectFixture("links-b")]);
  const [row] = await getDb()
    .insert(modelRevisions)
    .values({ projectId: a.projectId, number: 1, name: "A roof", model: triangleModel(), source: "uploaded", createdBy: a.users.structural_engineer.id })
    .returning({ id: modelRevisions.id });
  revisionOfA = row.id;
});
afterAll(closeDb);

async function refusal(promise: Promise<unknown>): Promise<HttpError> {
  const error = await promise.then(() => null, (e: unknown) => e);
  expect(error).toBeInstanceOf(HttpError);
  return error as HttpError;
}

describe("links stay inside their project", () => {
  it("requireSameProject accepts the project's own revision and refuses another project's or an unknown one, naming the field", async () => {
    await expect(requireSameProject(a.projectId, { revisionId: revisionOfA })).resolves.toBeUndefined();
    const foreign = await refusal(requireSameProject(b.projectId, { revisionId: revisionOfA }));
    expect(foreign.status).toBe(400);
    expect(foreign.issues).toEqual([{ path: "revisionId", message: "No revision of this project has that id." }]);
    const unknown = await refusal(requireSameProject(a.projectId, { runId: randomUUID(), pinId: randomUUID(), commentId: randomUUID() }));
    expect(unknown.issues?.map((i) => i.path)).toEqual(["runId", "commentId", "pinId"]);
  });

  it("an upload linked to another project's revision or to a run that does not exist is refused and nothing is recorded", async () => {
    for (const links of [{ revisionId: revisionOfA }, { runId: randomUUID() }]) {
      const body = { purpose: "model", filename: "roof.json", contentType: "application/json", sizeBytes: 100, ...links };
      const request = await buildRequest(`/api/projects/${b.projectId}/attachments`, { method: "POST", body, user: b.users.structural_engineer });
      const response = await requestUpload(request, routeContext({ projectId: b.projectId }));
      expect(response.status).toBe(400);
      expect((await response.json()).error).toBe("A linked item is not part of this project.");
    }
    expect(await getDb().select().from(attachments).where(eq(attachments.projectId, b.projectId))).toEqual([]);
  });
});
