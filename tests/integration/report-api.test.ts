// The CSV exports through their route handlers, from data stored in PostgreSQL: a revision with its analysis, a
// decided clash, an open pin; read with papaparse and compared with the result stored in analysis_runs. The review
// report PDF is a job: tests/integration/report-jobs.test.ts.
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as memberForces } from "@/app/api/projects/[projectId]/exports/member-forces.csv/route";
import { GET as envelope } from "@/app/api/projects/[projectId]/exports/envelope.csv/route";
import { GET as nodeResults } from "@/app/api/projects/[projectId]/exports/node-results.csv/route";
import { roundForce, roundMillimetres } from "@/lib/report/csv";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { analysisRuns, clashes, pins } from "@/db/schema";
import { analyzeModel } from "@/lib/analysis/analyze";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import { TRIPOD } from "@/tests/support/fixtures/report";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let stored: AnalysisResult;
const ctx = () => routeContext({ projectId: fx.projectId });

const req = (url: string, user?: FixtureUser) => buildRequest(url, { user });

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("report-api");
  const revision = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "Lantern added", model: TRIPOD, source: "uploaded", createdBy: fx.users.structural_engineer.id, result: analyzeModel(TRIPOD), review: null });
  const [run] = await getDb().select().from(analysisRuns).where(eq(analysisRuns.revisionId, revision.id));
  stored = run.result;
  await getDb().insert(clashes).values({
    projectId: fx.projectId, revisionId: revision.id, clashKey: "c-5e1d", memberId: "AB", runId: "SA-01", segmentIndex: 0, kind: "hard",
    gap: -0.02, depth: 0.02, requiredClearance: 0.05, pointX: 0.25, pointY: 0.43, pointZ: 0,
    outcome: "opening_accepted", conditions: "Sleeve 100 mm at mid-length", proposedBy: fx.users.mep_engineer.id, decidedBy: fx.users.structural_engineer.id, decidedAt: new Date("2026-03-03T10:00:00Z"),
  });
  await getDb().insert(pins).values({ id: randomUUID(), projectId: fx.projectId, anchorKind: "member", anchorId: "AD", title: "Can the lantern ring drop 200 mm?", discipline: "architectural", authorId: fx.users.architect.id });
});
afterAll(async () => {
  await closeDb();
});

describe("CSV exports", () => {
  it("member forces of one result: the stored values, one row per member", async () => {
    const response = await memberForces(await req(`/api/projects/${fx.projectId}/exports/member-forces.csv?result=ULS-3`, fx.users.architect), ctx());
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toContain("text/csv");
    const { data, meta } = Papa.parse<Record<string, string>>(await response.text(), { header: true, skipEmptyLines: true });
    expect(meta.fields).toEqual(["member", "node_i", "node_j", "section", "result", "axial_force_kN", "state"]);
    expect(data).toHaveLength(TRIPOD.members.length);
    for (const row of data) expect(Number(row.axial_force_kN)).toBe(roundForce(stored.results["ULS-3"].memberForces[row.member]));
    expect(data.find((row) => row.member === "AD")?.state).toBe("tension");
    expect((await memberForces(await req(`/api/projects/${fx.projectId}/exports/member-forces.csv?result=X`, fx.users.architect), ctx())).status).toBe(400);
    expect((await memberForces(await req(`/api/projects/${fx.projectId}/exports/member-forces.csv?result=ULS-3`), ctx())).status).toBe(401);
  });

  it("node results of one result: the stored displacements and reactions, one row per node; refused to outsiders and the signed-out", async () => {
    const url = (result: string) => `/api/projects/${fx.projectId}/exports/node-results.csv?revision=1&result=${result}`;
    const response = await nodeResults(await req(url("ULS-1"), fx.users.viewer), ctx());
    expect(response.status).toBe(200);
    expect(response.headers.get("content-disposition")).toBe('attachment; filename="node-results-rev1-ULS-1.csv"');
    const { data } = Papa.parse<Record<string, string>>(await response.text(), { header: true, skipEmptyLines: true });
    expect(data.map((row) => row.node)).toEqual(TRIPOD.nodes.map((n) => n.id));
    const uls1 = stored.results["ULS-1"];
    for (const row of data) {
      expect(Number(row.uz_mm), row.node).toBe(roundMillimetres(uls1.displacements[row.node]?.uz ?? 0));
      const reaction = uls1.reactions[row.node];
      expect(row.supported).toBe(String(Boolean(reaction)));
      expect(row.reaction_fz_kN).toBe(reaction ? String(roundForce(reaction.fz)) : "");
    }
    // Hand statics of the symmetric tripod (tests/support/fixtures/report.ts): 1.35 x 30 kN at D shared by three supports.
    expect(data.filter((row) => row.supported === "true").map((row) => Number(row.reaction_fz_kN))).toEqual([13.5, 13.5, 13.5]);
    expect((await nodeResults(await req(url("X"), fx.users.architect), ctx())).status).toBe(400);
    expect((await nodeResults(await req(url("ULS-1"), fx.users.outsider), ctx())).status).toBe(404);
    expect((await nodeResults(await req(url("ULS-1")), ctx())).status).toBe(401);
  });

  it("envelope: the stored extremes per member", async () => {
    const response = await envelope(await req(`/api/projects/${fx.projectId}/exports/envelope.csv`, fx.users.mep_engineer), ctx());
    expect(response.status).toBe(200);
    const { data } = Papa.parse<Record<string, string>>(await response.text(), { header: true, skipEmptyLines: true });
    for (const row of data) {
      expect(Number(row.max_tension_kN)).toBe(roundForce(stored.envelope[row.member].maxTension));
      expect(Number(row.max_compression_kN)).toBe(roundForce(stored.envelope[row.member].maxCompression));
      expect(row.zero_in_all).toBe(String(stored.envelope[row.member].zeroInAll));
    }
    expect((await envelope(await req(`/api/projects/${fx.projectId}/exports/envelope.csv`, fx.users.outsider), ctx())).status).toBe(404);
  });
});
