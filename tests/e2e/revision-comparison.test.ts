// Issue 16 item 3 in the browser: the comparison page of the demo project's revision 1 (current) with a revision 2
// made here with the step the hang-services job stores with, on a changed model (runs carried, clashes detected,
// decisions carried, analysed by the jobs process and re-checked). Revision 2 drops diagonal D-8-4-NW (under the
// cable tray CT-01), resizes top chord TCX-3-3, adds X-1, and puts a plant load of 10 kN east and 20 kN down on top
// node T-8-6 in the dead load case. The opening through D-8-6-SW (also under CT-01) is decided on revision 1.
//
// What the page must show, and why:
// - members added X-1, removed D-8-4-NW, resized TCX-3-3 (the edits above);
// - force states changed per result: across the west wall the roof is held in x only by the struts RS-W1 and RS-W2
//   (lib/analysis/demo-roof.ts), symmetric about mid-length, so by plan equilibrium (ΣFx, ΣMz; statics) the 10 kN at
//   mid-length y = 18 m is shared equally: 5 kN in each strut in the dead case, and 5 kN × the dead factor in each
//   combination, where revision 1 had them zero-force whenever there is no wind;
// - clashes: D-8-4-NW × CT-01 resolved (its member is gone), D-8-6-SW × CT-01 needing another look (the point load
//   sits on its top node).
// With revision 2 the newest but not current, the viewer, clashes, report and comparison pages still open revision 1.
// Revision 2 is deleted afterwards so the other browser tests see the demo as seeded.
import { and, eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { listClashesByRevision } from "@/db/queries/clashes";
import { getRevisionAnalysisStatus, getRevisionWithResults } from "@/db/queries/models";
import { modelRevisions, users } from "@/db/schema";
import { decideClash } from "@/lib/commands/decide-clash";
import { proposeClashOutcome } from "@/lib/commands/propose-clash-outcome";
import { appUrl, launchBrowser, screenshot } from "../support/browser";
import { closeDb, getDb } from "../support/db";
import { deriveRevision } from "../support/derived-revision";
import { demoAccount, openDemoProjectAs } from "../support/demo";

let browser: Browser;
let page: Page;
let projectId: string;
let second: { id: string; number: number } | null = null;
/** Revision 1's results in which RS-W1 is zero-force, with the dead load's factor in each (1 for the dead case). */
let strutResults: { id: string; deadFactor: number }[] = [];
/** Another tube section of the model than TCX-3-3's own (over 150 mm), which revision 2 gives it. */
let resizedTo = "";

async function userId(role: string): Promise<string> {
  const [user] = await getDb().select({ id: users.id }).from(users).where(eq(users.email, demoAccount(role).email));
  return user.id;
}

// The viewer page draws with WebGL: a software rasteriser in headless chromium without a GPU (as tests/e2e/viewer.test.ts).
const WEBGL_FLAGS = ["--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"];

beforeAll(async () => {
  browser = await launchBrowser({ extraArgs: WEBGL_FLAGS });
  ({ page, projectId } = await openDemoProjectAs(browser, "structural_engineer"));
  const first = (await getRevisionWithResults({ projectId, number: 1 }))!;
  const [mep, structural] = await Promise.all([userId("mep_engineer"), userId("structural_engineer")]);

  const clash = (await listClashesByRevision({ revisionId: first.id })).find((c) => c.memberId === "D-8-6-SW" && c.runId === "CT-01")!;
  if (!clash.decidedAt) {
    await proposeClashOutcome({ projectId, clashId: clash.id, actor: { userId: mep, role: "mep_engineer" }, input: { outcome: "opening_proposed", note: "The tray cannot drop below the diagonal." } });
    await decideClash({ projectId, clashId: clash.id, actor: { userId: structural, role: "structural_engineer" }, input: { outcome: "opening_accepted", conditions: "Sleeve of 120 mm at mid-length only." } });
  }

  const model = structuredClone(first.model);
  const chord = model.members.find((m) => m.id === "TCX-3-3")!;
  resizedTo = model.sections.find((s) => s.id !== chord.section && (s.outerDiameter ?? 0) > 0.15)!.id;
  model.members = model.members.filter((m) => m.id !== "D-8-4-NW").map((m) => (m.id === "TCX-3-3" ? { ...m, section: resizedTo } : m));
  model.members.push({ id: "X-1", i: "B-0-0", j: "B-1-1", section: "CHS 88.9x4.0" });
  model.loadCases = model.loadCases.map((c) => (c.id === "dead" ? { ...c, nodalLoads: [...c.nodalLoads, { node: "T-8-6", fx: 10, fy: 0, fz: -20 }] } : c));
  const { revision } = await deriveRevision({ projectId, createdBy: structural, fromRevisionId: first.id, name: "Plant on T-8-6, D-8-4-NW out (comparison test)", model });
  second = revision;
  // The jobs process analyses it and re-checks the carried decisions (expect.poll is for tests, not hooks).
  const analysed = async () => (await getRevisionAnalysisStatus(getDb(), { projectId, number: revision.number }))?.status ?? null;
  for (let waited = 0; (await analysed()) === null; waited += 2_000) {
    if (waited > 240_000) throw new Error(`Revision ${revision.number} was not analysed within 4 minutes: is the jobs process running?`);
    await new Promise((resolve) => setTimeout(resolve, 2_000));
  }
  expect(await analysed()).toBe("ok");

  const results = first.analysis!.result.results;
  const factors = Object.fromEntries(first.model.combinations.map((c) => [c.id, c.factors.dead ?? 0]));
  strutResults = Object.keys(results)
    .filter((id) => results[id].zeroForceMembers.includes("RS-W1"))
    .map((id) => ({ id, deadFactor: id === "dead" ? 1 : (factors[id] ?? 0) }))
    .filter((r) => r.deadFactor > 0);
}, 300_000);

afterAll(async () => {
  await browser?.close();
  if (second) await getDb().delete(modelRevisions).where(and(eq(modelRevisions.projectId, projectId), eq(modelRevisions.id, second.id)));
  await closeDb();
});

describe("comparing two revisions of the demo roof", () => {
  it("shows members added, removed and resized, force states changed per result, and clashes resolved or needing another look", async () => {
    await page.goto(appUrl(`/projects/${projectId}/models/compare?from=1&to=${second!.number}`));
    await page.getByTestId("comparison").waitFor();

    const members = await page.getByTestId("comparison-members").textContent();
    expect(members).toContain("Added X-1");
    expect(members).toContain("Removed D-8-4-NW");
    expect(members).toContain("Resized TCX-3-3");
    expect(members).toContain(`→ ${resizedTo}`);

    // The dead case and every combination with dead load but no wind (statics, see above).
    expect(strutResults.map((r) => r.id)).toContain("dead");
    for (const { id, deadFactor } of strutResults) {
      const section = page.getByTestId(`comparison-result-${id}`);
      const row = section.locator("tr").filter({ hasText: "RS-W1" });
      expect(await row.count(), id).toBe(1);
      const cells = await row.locator("td").allTextContents();
      expect(cells[1], id).toBe("zero-force (0.0 kN)");
      // Printed to 0.1 kN (components/models/revision-comparison.tsx).
      const [, force] = /^tension \((\d+\.\d) kN\)$/.exec(cells[2]) ?? [];
      expect(Math.abs(Number(force) - 5 * deadFactor), `${id}: ${cells[2]}`).toBeLessThanOrEqual(0.051);
    }

    const clashes = page.getByTestId("comparison-clashes");
    expect(await clashes.locator("li").filter({ hasText: "Resolved: D-8-4-NW × CT-01" }).count()).toBe(1);
    const recheck = clashes.locator("li").filter({ hasText: "Needs another look" }).filter({ hasText: "D-8-6-SW × CT-01" });
    expect(await recheck.count()).toBe(1);
    expect(await recheck.textContent()).toMatch(/D-8-6-SW × CT-01: D-8-6-SW .*kN/);
    // Revision 2 is not current: labelled a draft beside revision 1, which is.
    expect(await page.getByTestId("compare-to").locator("option:checked").textContent()).toContain("draft");
    await screenshot(page, "revision-comparison");
  }, 120_000);

  it("opens every page on the current revision (1), not the newest draft", async () => {
    for (const [path, picker] of [
      ["viewer", "viewer-revision"],
      ["clashes", "clash-revision"],
      ["report", "report-revision"],
      ["models/compare", "compare-to"],
    ] as const) {
      await page.goto(appUrl(`/projects/${projectId}/${path}`));
      const select = page.getByTestId(picker);
      await select.waitFor();
      expect(await select.inputValue(), path).toBe("1");
    }
    expect(second!.number).toBeGreaterThan(1);
  }, 120_000);
});
