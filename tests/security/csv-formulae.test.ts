// Hole 9: spreadsheet formula injection. A member, node or section id that starts with =, +, -, @, tab or CR would
// be run as a formula when an exported CSV is opened in a spreadsheet (OWASP "CSV Injection"). Every exported cell
// that starts with one of those characters must be prefixed with a single quote; numbers stay numbers.
import Papa from "papaparse";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as memberForces } from "@/app/api/projects/[projectId]/exports/member-forces.csv/route";
import { GET as envelope } from "@/app/api/projects/[projectId]/exports/envelope.csv/route";
import { GET as nodeResults } from "@/app/api/projects/[projectId]/exports/node-results.csv/route";
import { createRevisionWithAnalysis } from "@/lib/commands/create-analysed-revision";
import { analyzeModel } from "@/lib/analysis/analyze";
import type { TrussModel } from "@/lib/analysis/model";
import { TRIPOD } from "@/tests/support/fixtures/report";
import { closeDb, requireIntegrationEnv } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { buildRequest, routeContext } from "../support/session";

// One hostile id per trigger character; the multi-line one defeats a pattern anchored with `.*$`.
const HOSTILE = { AD: '=HYPERLINK("http://evil.test","x")', BD: "+1+cmd|' /C calc'!A0", CD: "-2+3", AB: "@SUM(1+1)*cmd" };
const HOSTILE_NODE = "\tD";
const HOSTILE_SECTION = "\r=1\n+2";

function hostileModel(): TrussModel {
  const rename = (id: string) => (id === "D" ? HOSTILE_NODE : id);
  return {
    ...TRIPOD,
    sections: TRIPOD.sections.map((section) => ({ ...section, id: HOSTILE_SECTION })),
    nodes: TRIPOD.nodes.map((node) => ({ ...node, id: rename(node.id) })),
    members: TRIPOD.members.map((member) => ({ ...member, id: HOSTILE[member.id as keyof typeof HOSTILE], i: rename(member.i), j: rename(member.j), section: HOSTILE_SECTION })),
    supports: TRIPOD.supports.map((support) => ({ ...support, node: rename(support.node) })),
    loadCases: TRIPOD.loadCases.map((loadCase) => ({ ...loadCase, nodalLoads: loadCase.nodalLoads.map((load) => ({ ...load, node: rename(load.node) })) })),
  };
}

let fx: ProjectFixture;
const ctx = () => routeContext({ projectId: fx.projectId });

beforeAll(async () => {
  requireIntegrationEnv();
  fx = await createProjectFixture("sec-csv");
  const model = hostileModel();
  const result = analyzeModel(model);
  expect(result.status).toBe("ok");
  await createRevisionWithAnalysis({ projectId: fx.projectId, name: "Hostile ids", model, source: "uploaded", createdBy: fx.users.structural_engineer.id, result, review: null });
});
afterAll(closeDb);

const FORMULA_START = /^[=+\-@\t\r]/;

async function cells(response: Response): Promise<string[][]> {
  expect(response.status).toBe(200);
  return Papa.parse<string[]>(await response.text(), { skipEmptyLines: true }).data;
}

/** No text cell (member, node_i, node_j, section) starts a formula; the hostile ids come back quote-prefixed. */
function expectNoFormula(rows: string[][]) {
  for (const row of rows.slice(1)) {
    for (const column of [0, 1, 2, 3]) expect(row[column], `column ${column} of ${JSON.stringify(row)}`).not.toMatch(FORMULA_START);
  }
  expect(rows.map((row) => row[0]).slice(1).sort()).toEqual(Object.values(HOSTILE).map((id) => `'${id}`).sort());
  expect(rows.find((row) => row[0] === `'${HOSTILE.AD}`)?.[2]).toBe(`'${HOSTILE_NODE}`);
  expect(rows.slice(1).every((row) => row[3] === `'${HOSTILE_SECTION}`)).toBe(true);
}

describe("CSV exports escape spreadsheet formulae", () => {
  it("member forces: ids, nodes and sections are prefixed with a quote; forces stay plain numbers", async () => {
    const rows = await cells(await memberForces(await buildRequest(`/api/projects/${fx.projectId}/exports/member-forces.csv?result=ULS-1`, { user: fx.users.viewer }), ctx()));
    expect(rows).toHaveLength(5);
    expectNoFormula(rows);
    // Compression is negative: the force column must still read as a number, not as escaped text.
    for (const row of rows.slice(1)) expect(Number.isFinite(Number(row[5]))).toBe(true);
    expect(rows.slice(1).some((row) => Number(row[5]) < 0)).toBe(true);
  });

  it("node results: the node ids are prefixed with a quote; negative displacements stay plain numbers", async () => {
    const rows = await cells(await nodeResults(await buildRequest(`/api/projects/${fx.projectId}/exports/node-results.csv?result=ULS-1`, { user: fx.users.viewer }), ctx()));
    expect(rows).toHaveLength(1 + TRIPOD.nodes.length);
    for (const row of rows.slice(1)) expect(row[0]).not.toMatch(FORMULA_START);
    expect(rows.map((row) => row[0])).toContain(`'${HOSTILE_NODE}`);
    // The apex goes down under 1.35 G: uz is negative and must read as a number, not as escaped text.
    const apex = rows.find((row) => row[0] === `'${HOSTILE_NODE}`)!;
    expect(Number(apex[7])).toBeLessThan(0);
  });

  it("envelope: the same", async () => {
    const rows = await cells(await envelope(await buildRequest(`/api/projects/${fx.projectId}/exports/envelope.csv`, { user: fx.users.viewer }), ctx()));
    expectNoFormula(rows);
  });
});
