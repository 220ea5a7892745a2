// Issue 16, item 3: the structural engineer marks the current revision; the report (and the pages, through
// getDefaultRevisionNumber and lib/models/revision-stage.ts) open it by default instead of the newest; an unstable
// revision cannot be current; the report honours the revision it is asked for.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { PUT as MARK_CURRENT } from "@/app/api/projects/[projectId]/models/[number]/current/route";
import { GET as LIST_MODELS } from "@/app/api/projects/[projectId]/models/route";
import { POST as MAKE_REPORT } from "@/app/api/projects/[projectId]/report/route";
import { getDefaultRevisionNumber } from "@/db/queries/models";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { analyzeModel } from "@/lib/analysis/analyze";
import { generateRoof } from "@/lib/analysis/generator";
import type { TrussModel } from "@/lib/analysis/model";
import { analyseForStorage } from "@/lib/models/analyse";
import { loadAnalysedRevision } from "@/app/api/projects/[projectId]/_lib/report-data";
import { and, eq } from "drizzle-orm";
import { jobs, liveEvents, modelRevisions } from "@/db/schema";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("current-revision");
  for (const name of ["r1", "r2"]) {
    const model = generateRoof({ name, spanX: 9, spanY: 9, module: 3, depth: 2 });
    const { result, review } = analyseForStorage(model, "EN1993-1-1");
    await createRevisionWithAnalysis({ projectId: fx.projectId, name, model, source: "generated", createdBy: fx.users.structural_engineer.id, result, review });
  }
  // Revision 3: an unstable test upload (no supports in x and y: the roof slides), stored as the newest.
  const loose = generateRoof({ name: "r3 loose", spanX: 9, spanY: 9, module: 3, depth: 2 }) as TrussModel;
  loose.supports = loose.supports.map((s) => ({ ...s, ux: false, uy: false }));
  const result = analyzeModel(loose);
  expect(result.status).toBe("unstable");
  await createRevisionWithAnalysis({ projectId: fx.projectId, name: "r3 loose", model: loose, source: "uploaded", createdBy: fx.users.structural_engineer.id, result, review: null });
});
afterAll(closeDb);

const mark = async (number: number, user = fx.users.structural_engineer) =>
  MARK_CURRENT(await buildRequest(`/api/projects/${fx.projectId}/models/${number}/current`, { method: "PUT", user }), routeContext({ projectId: fx.projectId, number: String(number) }));

describe("the current revision", () => {
  it("is marked by the structural engineer only, never on an unstable revision", async () => {
    expect((await MARK_CURRENT(await buildRequest(`/api/projects/${fx.projectId}/models/1/current`, { method: "PUT" }), routeContext({ projectId: fx.projectId, number: "1" }))).status).toBe(401);
    expect((await mark(1, fx.users.outsider)).status).toBe(404);
    for (const role of ["owner", "architect", "mep_engineer", "viewer"] as const) expect((await mark(1, fx.users[role])).status).toBe(403);
    const unstable = await mark(3);
    expect(unstable.status).toBe(409);
    expect((await unstable.json()).error).toMatch(/unstable/);
    expect((await mark(9)).status).toBe(404);
  });

  it("is what pages and the report open by default, not the newest; the report honours the revision asked for", async () => {
    expect(await getDefaultRevisionNumber({ projectId: fx.projectId }), "none marked: the newest").toBe(3);
    expect((await mark(1)).status).toBe(200);
    expect((await mark(2)).status).toBe(200);
    expect(await getDefaultRevisionNumber({ projectId: fx.projectId })).toBe(2);
    // Each marking is a command: open revision lists hear of it (a live event per marking, none for the refusals).
    const events = await getDb().select().from(liveEvents).where(eq(liveEvents.projectId, fx.projectId));
    expect(events.map((e) => [e.kind, e.revision])).toEqual([["revision", 1], ["revision", 2]]);
    const list = await (await LIST_MODELS(await buildRequest(`/api/projects/${fx.projectId}/models`, { user: fx.users.viewer }), routeContext({ projectId: fx.projectId }))).json();
    expect(list.revisions.map((r: { number: number; isCurrent: boolean }) => [r.number, r.isCurrent])).toEqual([[3, false], [2, true], [1, false]]);
    expect((await loadAnalysedRevision({ projectId: fx.projectId })).number).toBe(2);
    expect((await loadAnalysedRevision({ projectId: fx.projectId, revision: 1 })).number).toBe(1);
  });

  it("makes the report of the revision chosen in the report's picker, and of the current one (not the newest) when none is chosen", async () => {
    expect(await getDefaultRevisionNumber({ projectId: fx.projectId })).toBe(2);
    const ask = async (user: ProjectFixture["users"]["architect"], body: object) => {
      const response = await MAKE_REPORT(await buildRequest(`/api/projects/${fx.projectId}/report`, { method: "POST", body, user }), routeContext({ projectId: fx.projectId }));
      expect(response.status).toBe(202);
      const { job } = (await response.json()) as { job: { id: string } };
      const [row] = await getDb().select({ revisionId: jobs.revisionId, input: jobs.input }).from(jobs).where(eq(jobs.id, job.id));
      const [revision] = await getDb().select({ number: modelRevisions.number }).from(modelRevisions).where(and(eq(modelRevisions.projectId, fx.projectId), eq(modelRevisions.id, row.revisionId)));
      return { number: revision.number, input: row.input as { revision: number } };
    };
    // The picker sends the revision shown in it: revision 1, while 2 is current.
    expect(await ask(fx.users.architect, { revision: 1 })).toMatchObject({ number: 1, input: { revision: 1 } });
    expect(await ask(fx.users.structural_engineer, {})).toMatchObject({ number: 2, input: { revision: 2 } });
  });
});
