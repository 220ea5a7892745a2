// The review report and CSV exports through their route handlers, from data stored in PostgreSQL: a revision with
// its analysis, a decided clash, an open pin. The PDF is read back with poppler's pdfinfo and pdftotext; the CSVs
// with papaparse, compared with the result stored in analysis_runs.
import { execFileSync } from "node:child_process";
import { mkdtempSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as report } from "@/app/api/projects/[projectId]/report/route";
import { GET as memberForces } from "@/app/api/projects/[projectId]/exports/member-forces.csv/route";
import { GET as envelope } from "@/app/api/projects/[projectId]/exports/envelope.csv/route";
import { roundForce } from "@/lib/report/csv";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { analysisRuns, clashes, pins, projects } from "@/db/schema";
import { analyzeModel } from "@/lib/analysis/analyze";
import type { AnalysisResult } from "@/lib/analysis/analyze";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { TRIPOD } from "@/tests/support/fixtures/report";
import { closeDb, getDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type FixtureUser, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

let fx: ProjectFixture;
let projectName: string;
let stored: AnalysisResult;
const work = mkdtempSync(path.join(tmpdir(), "strutroom-report-api-"));
const ctx = () => routeContext({ projectId: fx.projectId });

const req = (url: string, user?: FixtureUser) => buildRequest(url, { user });

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("report-api");
  const revision = await createRevisionWithAnalysis({ projectId: fx.projectId, name: "Lantern added", model: TRIPOD, source: "uploaded", createdBy: fx.users.structural_engineer.id, result: analyzeModel(TRIPOD), review: null });
  const [run] = await getDb().select().from(analysisRuns).where(eq(analysisRuns.revisionId, revision.id));
  stored = run.result;
  const [project] = await getDb().select().from(projects).where(eq(projects.id, fx.projectId));
  projectName = project.name;
  await getDb().insert(clashes).values({
    projectId: fx.projectId, revisionId: revision.id, clashKey: "c-5e1d", memberId: "AB", runId: "SA-01", segmentIndex: 0, kind: "hard",
    gap: -0.02, depth: 0.02, requiredClearance: 0.05, pointX: 0.25, pointY: 0.43, pointZ: 0,
    outcome: "opening_accepted", conditions: "Sleeve 100 mm at mid-length", proposedBy: fx.users.mep_engineer.id, decidedBy: fx.users.structural_engineer.id, decidedAt: new Date("2026-03-03T10:00:00Z"),
  });
  await getDb().insert(pins).values({ id: randomUUID(), projectId: fx.projectId, anchorKind: "member", anchorId: "AD", title: "Can the lantern ring drop 200 mm?", discipline: "architectural", authorId: fx.users.architect.id });
});
afterAll(async () => {
  rmSync(work, { recursive: true, force: true });
  await closeDb();
});

describe("GET /api/projects/[projectId]/report", () => {
  it("answers 401 signed out, 404 to outsiders, 400 for unknown results", async () => {
    expect((await report(await req(`/api/projects/${fx.projectId}/report`), ctx())).status).toBe(401);
    expect((await report(await req(`/api/projects/${fx.projectId}/report`, fx.users.outsider), ctx())).status).toBe(404);
    const bad = await report(await req(`/api/projects/${fx.projectId}/report?combinations=ULS-1,NOPE&compare=ULS-1`, fx.users.viewer), ctx());
    expect(bad.status).toBe(400);
    expect((await bad.json()).issues.map((i: { path: string }) => i.path)).toEqual(["compare"]);
    const unknown = await report(await req(`/api/projects/${fx.projectId}/report?combinations=ULS-1,NOPE`, fx.users.viewer), ctx());
    expect(unknown.status).toBe(400);
    expect((await unknown.json()).error).toContain("NOPE");
    expect((await report(await req(`/api/projects/${fx.projectId}/report?revision=9`, fx.users.viewer), ctx())).status).toBe(404);
  });

  it("gives any member a PDF with the caution on every page, the decided clash and the open question", async () => {
    const response = await report(await req(`/api/projects/${fx.projectId}/report?revision=1&combinations=ULS-1,ULS-3&compare=ULS-1,ULS-3`, fx.users.viewer), ctx());
    expect(response.status).toBe(200);
    expect(response.headers.get("content-type")).toBe("application/pdf");
    const file = path.join(work, "report.pdf");
    writeFileSync(file, Buffer.from(await response.arrayBuffer()));
    const pages = Number(/^Pages:\s+(\d+)/m.exec(execFileSync("pdfinfo", [file]).toString())?.[1]);
    const text = execFileSync("pdftotext", ["-raw", file, "-"]).toString().split("\f").slice(0, pages).map((p) => p.replace(/\s+/g, " "));
    expect(pages).toBe(5);
    text.forEach((page, k) => expect(page, `page ${k + 1}`).toContain(STANDING_CAUTION));
    expect(text[0]).toContain(projectName);
    expect(text[0]).toContain("Revision 1: Lantern added");
    const all = text.join("\n");
    expect(all).toContain("Member forces: Permanent only 1.35G (ULS-1)");
    expect(all).toContain("Member forces: Uplift 1.0G + 1.5W (ULS-3)");
    // Table cells wrap long fixture names, so compare without white space.
    expect(all.replace(/\s/g, "")).toContain(`decidedby${fx.users.structural_engineer.name}on2026-03-03`.replace(/\s/g, ""));
    expect(all).toContain("Can the lantern ring drop 200 mm?");
  });
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
