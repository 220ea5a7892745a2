// IFC in the app: runs imported with a preview first, a roof read from IFC, and a revision exported as IFC4.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as exportRevision } from "@/app/api/projects/[projectId]/exports/revision.ifc/route";
import { POST as readRoof } from "@/app/api/projects/[projectId]/models/ifc/route";
import { POST as createRevision } from "@/app/api/projects/[projectId]/models/route";
import { POST as importIfcRuns } from "@/app/api/projects/[projectId]/runs/ifc/route";
import { listRunsByRevision } from "@/db/queries/mep";
import { getRevisionForMep } from "@/db/queries/mep";
import { readIfcRoof } from "@/lib/ifc";
import { StepText } from "@/tests/support/fixtures/ifc-files";
import { runAnalysisJob } from "@/server/jobs/analysis";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext, sessionCookie } from "../support/session";

let fx: ProjectFixture;
const ctx = () => routeContext({ projectId: fx.projectId });

// Two duct segments meeting end to end (IFC4, mm) in a "Supply air" system: one run of three points.
function ductFile() {
  const s = new StepText("IFC4");
  const c = s.project("MILLI");
  const circle = s.add("IFCCIRCLEPROFILEDEF(.AREA.,$,$,150.)");
  const a = s.add(`IFCDUCTSEGMENT('6DuctDuctDuctDuctDuct1',$,'SA',$,$,${s.localPlacement(undefined, [500, 500, 500], [1, 0, 0], [0, 1, 0])},${s.extrusion(c, circle, 3000)},$,.RIGIDSEGMENT.)`);
  const b = s.add(`IFCDUCTSEGMENT('6DuctDuctDuctDuctDuct2',$,'SA',$,$,${s.localPlacement(undefined, [3500, 500, 500], [0, 1, 0], [1, 0, 0])},${s.extrusion(c, circle, 4000)},$,.RIGIDSEGMENT.)`);
  const system = s.add(`IFCDISTRIBUTIONSYSTEM('6SystemSystemSystemSy1',$,'Supply air',$,$,$,.VENTILATION.)`);
  s.add(`IFCRELASSIGNSTOGROUP('6GroupGroupGroupGroup1',$,$,$,(${a},${b}),$,${system})`);
  return s.text();
}

async function send(path: string, user: FixtureUser, bytes: Uint8Array | string, handler: typeof importIfcRuns) {
  const headers = new Headers({ "content-type": "application/octet-stream", cookie: await sessionCookie(user) });
  return handler(new Request(new URL(path, "http://127.0.0.1"), { method: "POST", headers, body: typeof bytes === "string" ? bytes : Buffer.from(bytes) }), ctx());
}

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("ifc-api");
  const body = { kind: "generate", params: { name: "Test grid", spanX: 6, spanY: 6, module: 3, depth: 1.5 } };
  const response = await createRevision(await buildRequest(`/api/projects/${fx.projectId}/models`, { method: "POST", body, user: fx.users.structural_engineer }), ctx());
  expect(response.status).toBe(202);
  expect(await runAnalysisJob((await response.json()).job.id)).toBe("done");
});
afterAll(closeDb);

describe("IFC runs import", () => {
  const url = (query: string) => `/api/projects/${fx.projectId}/runs/ifc?revision=1&${query}`;
  const storedRuns = async () => listRunsByRevision({ revisionId: (await getRevisionForMep({ projectId: fx.projectId, number: 1 }))!.id });

  it("refuses viewers and architects (403); a file that is not IFC is a 400", async () => {
    expect((await send(url("preview=1"), fx.users.viewer, ductFile(), importIfcRuns)).status).toBe(403);
    expect((await send(url("preview=1"), fx.users.architect, ductFile(), importIfcRuns)).status).toBe(403);
    const bad = await send(url("preview=1"), fx.users.mep_engineer, "hello", importIfcRuns);
    expect(bad.status).toBe(400);
    expect(await storedRuns()).toEqual([]);
  });

  it("previews runs and counts per system without storing; confirming stores them; a re-import updates the same run", async () => {
    const preview = await send(url("preview=1"), fx.users.mep_engineer, ductFile(), importIfcRuns);
    expect(preview.status).toBe(200);
    const shown = await preview.json();
    expect(shown.systems).toEqual({ "Supply air": 1 });
    expect(shown.runs[0].points).toEqual([
      { x: 0.5, y: 0.5, z: 0.5 },
      { x: 3.5, y: 0.5, z: 0.5 },
      { x: 3.5, y: 4.5, z: 0.5 },
    ]);
    expect(await storedRuns()).toEqual([]);
    const stored = await send(url("preview=0"), fx.users.mep_engineer, ductFile(), importIfcRuns);
    expect(stored.status).toBe(201);
    expect((await stored.json()).imported).toEqual(["6DuctDuctDuctDuctDuct1"]);
    expect((await send(url("preview=0"), fx.users.mep_engineer, ductFile(), importIfcRuns)).status).toBe(201);
    expect((await storedRuns()).map((r) => r.id)).toEqual(["6DuctDuctDuctDuctDuct1"]);
  });
});

describe("IFC export of a revision and roof import", () => {
  it("exports the revision with a result's force state; the roof route reads it back with the same members", async () => {
    const revision = (await getRevisionForMep({ projectId: fx.projectId, number: 1 }))!;
    const result = revision.model.loadCases[0].id;
    const response = await exportRevision(await buildRequest(`/api/projects/${fx.projectId}/exports/revision.ifc?revision=1&result=${result}`, { user: fx.users.viewer }), ctx());
    expect(response.status).toBe(200);
    const text = await response.text();
    expect(text).toContain("FILE_SCHEMA(('IFC4'))");
    expect(text).toContain(`IFCIDENTIFIER('${result}')`);
    const read = await readIfcRoof(new TextEncoder().encode(text));
    if ("message" in read) throw new Error(read.message);
    expect(read.model!.members.map((m) => m.id).sort()).toEqual(revision.model.members.map((m) => m.id).sort());

    expect((await send(`/api/projects/${fx.projectId}/models/ifc`, fx.users.architect, text, readRoof)).status).toBe(403);
    const roof = await send(`/api/projects/${fx.projectId}/models/ifc`, fx.users.structural_engineer, text, readRoof);
    expect(roof.status).toBe(200);
    const body = await roof.json();
    expect(body.source).toBe("physical members");
    expect(body.model.members).toHaveLength(revision.model.members.length);
    const unknown = await exportRevision(await buildRequest(`/api/projects/${fx.projectId}/exports/revision.ifc?result=nope`, { user: fx.users.viewer }), ctx());
    expect(unknown.status).toBe(400);
  });
});
