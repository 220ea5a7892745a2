import { readFileSync, statSync } from "node:fs";
import path from "node:path";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appUrl, launchBrowser, screenshot } from "../support/browser";
import { closeDb } from "../support/db";
import { openDemoProjectAs } from "../support/demo";
import { ViewerPage } from "./pages/viewer-page";

// WebGL needs a software rasteriser in headless chromium without a GPU: ANGLE on SwiftShader.
const WEBGL_FLAGS = ["--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"];

type CaseResult = { memberForces: Record<string, number>; zeroForceMembers: string[] };
type Revision = {
  model: { members: { id: string }[]; loadCases: { id: string }[]; combinations: { id: string }[] };
  analysis: { result: { results: Record<string, CaseResult> } };
};

/** The counts the legend must show, computed here from the stored results (tension positive, design notes). */
function expectedCounts(memberIds: string[], result: CaseResult) {
  const zero = new Set(result.zeroForceMembers);
  const counts = { tension: 0, compression: 0, "zero-force": 0 };
  for (const id of memberIds) {
    if (zero.has(id)) counts["zero-force"] += 1;
    else if (result.memberForces[id] > 0) counts.tension += 1;
    else counts.compression += 1;
  }
  return counts;
}

let browser: Browser;
let page: Page;
let projectId: string;

beforeAll(async () => {
  browser = await launchBrowser({ extraArgs: WEBGL_FLAGS });
  ({ page, projectId } = await openDemoProjectAs(browser, "structural_engineer", { viewport: { width: 1440, height: 900 } }));
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("the 3D viewer on the demo roof", () => {
  it("opens the latest revision, draws it with WebGL in a handful of draw calls", async () => {
    const viewer = new ViewerPage(page);
    await viewer.open(projectId);
    const frame = await viewer.measureFrame();
    expect(frame).not.toBeNull();
    expect(frame!.triangles).toBeGreaterThan(0);
    // Every layer is instanced, so the count does not grow with members, runs, clashes or pins: members 2
    // (carrying force, zero-force), nodes + supports + load arrows 3, grid 1, MEP runs and clash markers at most 4,
    // pins at most 3, influence map at most 1. Members alone stay within the 10.
    expect(frame!.calls).toBeLessThanOrEqual(14);
    await screenshot(page, "viewer-demo-roof");
  });

  it("draws every load case and combination from its columns, with legend counts that match the stored JSON results", async () => {
    const viewer = new ViewerPage(page);
    // The viewer draws from the binary result columns (issue 13 item 4): each result chosen is fetched as
    // application/octet-stream from its own endpoint (or was already fetched once, the answer being immutable).
    const columnsFetched = new Set<string>();
    page.on("response", (answer) => {
      const match = /\/models\/1\/results\/([^/?]+)$/.exec(new URL(answer.url()).pathname);
      if (match && answer.status() === 200 && answer.headers()["content-type"] === "application/octet-stream") columnsFetched.add(decodeURIComponent(match[1]));
    });
    const response = await page.request.get(appUrl(`/api/projects/${projectId}/models/1`));
    expect(response.status()).toBe(200);
    const { revision } = (await response.json()) as { revision: Revision };
    const memberIds = revision.model.members.map((m) => m.id);
    const ids = [...revision.model.combinations.map((c) => c.id), ...revision.model.loadCases.map((c) => c.id)];
    expect(ids.length).toBeGreaterThan(1);
    for (const id of ids) {
      await viewer.chooseResult(id);
      await expect.poll(() => viewer.legendResultLabel()).toContain(id);
      const expected = expectedCounts(memberIds, revision.analysis.result.results[id]);
      expect(expected.tension + expected.compression + expected["zero-force"]).toBe(memberIds.length);
      expect(await viewer.legendCounts()).toEqual(expected);
      expect(await viewer.hookCounts()).toEqual(expected);
      // The first result was fetched when the page opened (before the listener); every other one now.
      if (id !== ids[0]) expect(columnsFetched.has(id)).toBe(true);
    }
    await screenshot(page, "viewer-last-result");
  });

  it("opens the member panel with forces in every result, the review and the standing caution", async () => {
    const viewer = new ViewerPage(page);
    const response = await page.request.get(appUrl(`/api/projects/${projectId}/models/1`));
    const { revision } = (await response.json()) as { revision: Revision };
    const member = revision.model.members[0].id;
    await viewer.selectMember(member);
    expect(await page.getByTestId("member-panel-id").textContent()).toBe(`Member ${member}`);
    const rows = page.getByTestId("member-panel-forces").locator("tr");
    // The forces come from the member's own endpoint after the panel opens.
    await expect.poll(() => rows.count(), { timeout: 30_000 }).toBe(revision.model.loadCases.length + revision.model.combinations.length);
    await page.getByTestId("member-panel-verdict").waitFor();
    expect(await page.getByTestId("standing-caution").textContent()).toContain("engineer of record");
    await page.getByTestId("whatif-remove").click();
    await page.getByTestId("removal-result").waitFor({ timeout: 60_000 });
    await screenshot(page, "viewer-member-panel");
  });

  it("shows the overall stability (αcr) of the chosen design combination as stored, and draws its buckling mode", async () => {
    const viewer = new ViewerPage(page);
    const response = await page.request.get(appUrl(`/api/projects/${projectId}/models/1`));
    const { revision } = (await response.json()) as {
      revision: { analysis: { review: { stability: { limit: number; results: { result: string; alphaCr: number | null; shape: number[] | null }[] } } } };
    };
    const stability = revision.analysis.review.stability;
    expect(stability.limit).toBe(10); // EN 1993-1-1 5.2.1(3)
    const first = stability.results.find((r) => r.alphaCr !== null && r.shape !== null)!;
    await viewer.chooseResult(first.result);
    const shown = first.alphaCr! >= 1000 ? first.alphaCr!.toExponential(2) : first.alphaCr!.toPrecision(3);
    await expect.poll(() => page.getByTestId("stability-alpha").textContent()).toBe(`αcr = ${shown}`);
    await page.getByTestId("stability-draw-mode").click();
    await expect.poll(() => page.evaluate(() => window.__strutroom?.shownMode() ?? null)).toBe(`Buckling mode of ${first.result}`);
    await screenshot(page, "viewer-buckling-mode");
    await page.getByTestId("stability-draw-mode").click();
    await expect.poll(() => page.evaluate(() => window.__strutroom?.shownMode() ?? null)).toBeNull();
  });

  it("says in the member panel whether any roof load could make the member work, and which patterns 'idle' rests on", async () => {
    // The demo's west gable chords run along y between nodes held in y and z (lib/analysis/demo-roof.ts): their
    // elongation is always zero, so no load anywhere makes them work (statics; unit test in lib/review/any-load.test.ts).
    const viewer = new ViewerPage(page);
    await viewer.selectMember("TCY-0-5");
    await expect.poll(() => page.getByTestId("any-load-verdict").textContent()).toMatch(/^Idle for any roof load: no load at any of the \d+ top-layer nodes/);
    expect(await page.getByTestId("member-panel-patterns").textContent()).toMatch(/holds for the load patterns analysed: dead \(/);
    await viewer.selectMember("BCX-7-5");
    await expect.poll(() => page.getByTestId("any-load-verdict").textContent()).toMatch(/^Works under roof load; most at T-/);
    await screenshot(page, "viewer-any-load");
  });

  it("opens a support node and reads its reaction in every result as stored, and the reaction at a member's supported end (issue 15 item 8)", async () => {
    type Stored = {
      model: Omit<Revision["model"], "members"> & { supports: { node: string }[]; members: { id: string; i: string; j: string }[] };
      analysis: { result: { results: Record<string, { reactions: Record<string, { fx: number; fy: number; fz: number }>; displacements: Record<string, { ux: number; uy: number; uz: number }> }> } };
    };
    const response = await page.request.get(appUrl(`/api/projects/${projectId}/models/1`));
    const { revision } = (await response.json()) as { revision: Stored };
    const ids = [...revision.model.loadCases, ...revision.model.combinations].map((c) => c.id);
    const node = revision.model.supports[0].node;
    await page.evaluate((id) => window.__strutroom!.selectNode(id), node);
    expect(await page.getByTestId("node-panel-id").textContent()).toBe(`Node ${node}`);
    // The reactions come from the node's own endpoint after the panel opens: one row per load case and combination.
    await expect.poll(() => page.getByTestId("node-panel-reactions").locator("tbody tr").count(), { timeout: 30_000 }).toBe(ids.length);
    const kN = (r: { fx: number; fy: number; fz: number }) => [r.fx, r.fy, r.fz].map((v) => v.toFixed(2));
    for (const id of ids) {
      const cells = await page.getByTestId(`node-panel-reactions-${id}`).locator("td").allTextContents();
      expect(cells.slice(1), id).toEqual(kN(revision.analysis.result.results[id].reactions[node]));
    }
    // a held node: no displacement in any result
    expect(await page.getByTestId("node-panel-displacements").locator("tbody tr").count()).toBe(ids.length);
    await screenshot(page, "viewer-node-panel-support");

    // A member meeting there shows the same reaction at that end, and both ends' displacements in every result.
    const member = revision.model.members.find((m) => m.i === node || m.j === node)!;
    const end = member.i === node ? "i" : "j";
    const other = member.i === node ? member.j : member.i;
    await new ViewerPage(page).selectMember(member.id);
    await expect.poll(() => page.getByTestId(`member-panel-reactions-${end}`).locator("tbody tr").count(), { timeout: 30_000 }).toBe(ids.length);
    const last = ids[ids.length - 1];
    expect((await page.getByTestId(`member-panel-reactions-${end}-${last}`).locator("td").allTextContents()).slice(1)).toEqual(kN(revision.analysis.result.results[last].reactions[node]));
    const d = revision.analysis.result.results[last].displacements[other];
    const column = end === "i" ? 2 : 1; // |u| at the member's other end
    expect((await page.getByTestId(`member-panel-end-displacements-${last}`).locator("td").allTextContents())[column]).toBe((Math.hypot(d.ux, d.uy, d.uz) * 1000).toFixed(1));
  });

  it("shows the checks of the whole roof: each serviceability combination's deflection against span/250 as stored, and what is not checked (issue 15 items 6, Done when)", async () => {
    const response = await page.request.get(appUrl(`/api/projects/${projectId}/models/1`));
    type Check = { combination: string; deflection: number; limit: number; utilisation: number };
    const { revision } = (await response.json()) as { revision: { analysis: { review: { deflections: Check[] } } } };
    const checks = revision.analysis.review.deflections;
    // the demo roof's one serviceability combination (lib/analysis/generator.ts: EN 1990 (6.14b) G + S)
    expect(checks.map((c) => [c.combination, c.limit])).toEqual([["SLS-1", 250]]);
    const cells = await page.getByTestId("roof-checks-deflection-SLS-1").locator("td").allTextContents();
    expect(cells[1]).toMatch(new RegExp(`^${(checks[0].deflection * 1000).toFixed(1)} at `));
    expect(cells[3]).toBe(checks[0].utilisation.toFixed(3));
    expect(await page.getByTestId("roof-checks-not-checked").textContent()).toMatch(/^Not checked: connections and nodes \(joints\).*engineer of record/);
  });

  it("exports the current view as a PNG file", async () => {
    const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("viewer-export-png").click()]);
    expect(download.suggestedFilename()).toMatch(/\.png$/);
    const file = path.join(process.env.ARTIFACTS_DIR ?? ".artifacts", "screenshots", "viewer-export.png");
    await download.saveAs(file);
    // Every PNG file starts with the 8-byte signature 89 50 4E 47 0D 0A 1A 0A (PNG specification, section 5.2).
    expect([...readFileSync(file).subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(statSync(file).size).toBeGreaterThan(10_000);
  });
});

describe("the 3D viewer on an unstable upload", () => {
  it("lists every moving joint of the mechanism with its direction and draws the mode on the roof", async () => {
    // A square panel in the x-z plane without its diagonal: A pinned, B on a roller along x, every joint held out
    // of plane (y). Statics: 4 members + 6 reactions (A x y z, B y z, C y, D y → 7) against 3 × 4 = 12 unknowns,
    // and the panel racks: C and D slide along x together while A and B stay (a mechanism; unit test of the same
    // racking in lib/analysis/stability.test.ts).
    const model = {
      format: "truss-model/1",
      name: "Panel without its diagonal",
      materials: [{ id: "S355", E: 210e6, fy: 355e3, unitWeight: 78.5 }],
      sections: [{ id: "CHS 88.9x4.0", material: "S355", area: 1.067e-3, radiusOfGyration: 0.03, outerDiameter: 0.0889, wallThickness: 0.004 }],
      nodes: [
        { id: "A", x: 0, y: 0, z: 0 },
        { id: "B", x: 4, y: 0, z: 0 },
        { id: "C", x: 4, y: 0, z: 3 },
        { id: "D", x: 0, y: 0, z: 3 },
      ],
      members: ["A-B", "B-C", "C-D", "D-A"].map((id) => ({ id, i: id[0], j: id[2], section: "CHS 88.9x4.0" })),
      supports: [
        { node: "A", ux: true, uy: true, uz: true },
        { node: "B", ux: false, uy: true, uz: true },
        { node: "C", ux: false, uy: true, uz: false },
        { node: "D", ux: false, uy: true, uz: false },
      ],
      loadCases: [{ id: "W", name: "Wind on the panel", category: "wind", selfWeight: false, nodalLoads: [{ node: "D", fx: 5, fy: 0, fz: 0 }] }],
      combinations: [],
    };
    const number = await page.evaluate(async ({ projectId, model }) => {
      const saved = await fetch(`/api/projects/${projectId}/models`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ kind: "uploadJson", name: "Panel without its diagonal", model }) });
      if (saved.status !== 202) throw new Error(`upload answered ${saved.status}: ${await saved.text()}`);
      return ((await saved.json()) as { revision: { number: number } }).revision.number;
    }, { projectId, model });
    // wait for the analysis job to store its (unstable) result
    await expect
      .poll(() => page.evaluate(async (url) => ((await (await fetch(url)).json()) as { revision: { analysis: { status: string } | null } }).revision.analysis?.status ?? null, `/api/projects/${projectId}/models/${number}`), { timeout: 90_000, interval: 1_000 })
      .toBe("unstable");

    await page.goto(appUrl(`/projects/${projectId}/viewer?revision=${number}`));
    await page.getByTestId("viewer-unstable").waitFor({ timeout: 60_000 });
    const rows = await page.getByTestId("mechanism-1-joints").locator("tbody tr").allTextContents();
    expect(rows).toHaveLength(2);
    expect(rows.join(" | ")).toMatch(/^(C|D)[+−]1\.00 x100 % \| (C|D)[+−]1\.00 x100 %$/);
    expect(await page.getByTestId("mechanism-2").count()).toBe(0);
    // opened with the mode drawn; the button clears it and draws it again
    await expect.poll(() => page.evaluate(() => window.__strutroom?.shownMode() ?? null)).toBe("Mechanism 1 of this revision");
    await screenshot(page, "viewer-unstable-mechanism");
    await page.getByTestId("unstable-draw-mechanism-1").click();
    await expect.poll(() => page.evaluate(() => window.__strutroom?.shownMode() ?? null)).toBeNull();
    await page.getByTestId("unstable-draw-mechanism-1").click();
    await expect.poll(() => page.evaluate(() => window.__strutroom?.shownMode() ?? null)).toBe("Mechanism 1 of this revision");
  });
});
