// Issue 17 item 12, progress on long work: generating a roof, uploading a model and hanging the services each show a
// progress bar with the phase (the browser's own step, then the job's phase and percent, which follows the job over
// the live bus; hanging the services is a job of its own, followed on the same bar by the analysis it queues), and
// when the analysis is done the new revision's row (or the hanging's result) scrolls into view. The report's bar is
// covered by files-mail-report.test.ts.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser } from "../support/browser";
import { STANDING_CAUTION } from "@/lib/review/caution";
import { closeDb } from "../support/db";
import { demoAccount, demoAccounts, demoProjectId } from "../support/demo";
import { ClashesPage } from "./pages/clashes-page";
import { ModelsPage } from "./pages/models-page";
import { progressSeen, scrollToBottom, scrollToTop, watchProgress } from "./pages/progress-watch";
import { signedInPage } from "./pages/sign-in-page";

let browser: Browser;
let page: Page;
let projectId: string;

// Each test waits for an analysis job on the shared two-core machine (up to 180 s), beyond the default 120 s.
const JOB_TEST_TIMEOUT = 240_000;
const JOB_PHASE = /(Waiting for the job runner|Starting|Solving|Reviewing|Storing).* · \d+ %/;
// Hanging the services: its own job's phases, then the analysis job's (labels in components/jobs/job-progress.tsx).
const HANG_PHASE = /^(Waiting for the job runner to hang the services|Hanging the services from the bottom layer|Detecting the clashes on the new revision|Storing the new revision and queueing its analysis) · \d+ %$/;
const ANALYSIS_PHASE = /^(Waiting for the job runner|Solving every load case and combination|Reviewing members \(checks, verdicts\)|Storing the results) · \d+ %$/;

// Invented test data: a 4 m x 3 m wall panel braced by one diagonal, held out of its plane at every joint (stable).
const panel = {
  format: "truss-model/1",
  name: "Progress test panel",
  materials: [{ id: "S355", E: 210e6, fy: 355e3, unitWeight: 78.5 }],
  sections: [{ id: "CHS 88.9x4.0", material: "S355", area: 1.067e-3, radiusOfGyration: 0.03, outerDiameter: 0.0889, wallThickness: 0.004 }],
  nodes: [
    { id: "A", x: 0, y: 0, z: 0 },
    { id: "B", x: 4, y: 0, z: 0 },
    { id: "C", x: 4, y: 0, z: 3 },
    { id: "D", x: 0, y: 0, z: 3 },
  ],
  members: ["A-B", "B-C", "C-D", "D-A", "A-C"].map((id) => ({ id, i: id[0], j: id[2], section: "CHS 88.9x4.0" })),
  supports: [
    { node: "A", ux: true, uy: true, uz: true },
    { node: "B", ux: false, uy: true, uz: true },
    { node: "C", ux: false, uy: true, uz: false },
    { node: "D", ux: false, uy: true, uz: false },
  ],
  loadCases: [{ id: "W", name: "Wind on the panel", category: "wind", selfWeight: false, nodalLoads: [{ node: "D", fx: 5, fy: 0, fz: 0 }] }],
  combinations: [],
};

beforeAll(async () => {
  browser = await launchBrowser();
  projectId = await demoProjectId();
  page = await signedInPage(browser, demoAccount("structural_engineer").email, demoAccounts.password);
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("progress on long work", () => {
  it("generating a roof shows the step, then the analysis job's phase and percent, and brings the analysed revision into view", async () => {
    const models = new ModelsPage(page);
    await models.open(projectId);
    // The click leaves the page at the form's button, below the list: the new row is out of view until done.
    const number = await models.generate("Progress test roof");
    expect(await models.rowInView(number)).toBe(false);
    await models.analysedRowInView(number);
    const seen = await models.progressSeen();
    expect(seen.some((text) => /Generating the roof/.test(text))).toBe(true);
    expect(seen.some((text) => JOB_PHASE.test(text))).toBe(true);
  }, JOB_TEST_TIMEOUT);

  it("uploading a model shows the upload's step, then the job's phase and percent, and brings the analysed revision into view", async () => {
    // A short window, scrolled to the bottom: the revision list is out of view when the upload starts.
    await page.setViewportSize({ width: 1280, height: 500 });
    const models = new ModelsPage(page);
    await models.open(projectId);
    await scrollToBottom(page);
    expect(await models.listOutOfView()).toBe(true);
    const number = await models.upload({ name: "progress-panel.json", mimeType: "application/json", buffer: Buffer.from(JSON.stringify(panel)) });
    expect(await models.rowInView(number)).toBe(false);
    await models.analysedRowInView(number);
    const seen = await models.progressSeen();
    expect(seen.some((text) => /Uploading progress-panel\.json \(file 1 of 1\) · 0 %/.test(text))).toBe(true);
    expect(seen.some((text) => JOB_PHASE.test(text))).toBe(true);
  }, JOB_TEST_TIMEOUT);

  it("hanging the services shows its job's phases, then the new revision's analysis job on the same bar, and brings the result into view when done", async () => {
    await page.setViewportSize({ width: 1280, height: 500 });
    const clashes = new ClashesPage(page);
    await clashes.open(projectId, 1);
    await watchProgress(page);
    await clashes.hangServices();
    // The answer shows beside the button; the reader scrolls away while the job runs.
    await scrollToTop(page);
    expect(await clashes.hangResultInView()).toBe(false);
    await clashes.hangAnalysedInView();
    const seen = await progressSeen(page);
    // The hanging's job comes first (its queued state is drawn from the POST's answer, so it is always seen), then
    // the analysis job it queued, in the same box.
    const hanging = seen.findIndex((text) => HANG_PHASE.test(text));
    const analysis = seen.findIndex((text) => ANALYSIS_PHASE.test(text));
    expect(hanging).toBeGreaterThanOrEqual(0);
    expect(analysis).toBeGreaterThan(hanging);
    // Members newly zero invite removing them: the standing caution (lib/review/caution.ts, glossary.md) goes with them.
    expect(await page.getByTestId("hang-services-caution").textContent()).toBe(STANDING_CAUTION);
  }, JOB_TEST_TIMEOUT);
});
