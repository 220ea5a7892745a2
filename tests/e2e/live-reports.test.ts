// A stored report over the live bus (liveevents brief item 1), in Chromium: a viewer has the report page open; the
// architect makes a PDF report on theirs; when the jobs process has stored it, the viewer's list of the revision's
// reports shows it first without a reload (not only the requester's page hears of it).
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, screenshot } from "../support/browser";
import { closeDb } from "../support/db";
import { openDemoProjectAs } from "../support/demo";
import { ReportPage } from "./pages/files-mail-report-pages";

let browser: Browser;
let projectId: string;
let viewer: Page;
let architect: Page;

beforeAll(async () => {
  browser = await launchBrowser();
  ({ page: viewer, projectId } = await openDemoProjectAs(browser, "viewer"));
  ({ page: architect } = await openDemoProjectAs(browser, "architect"));
});

afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("a report stored by another member", () => {
  it("appears in an open report page's list without a reload", async () => {
    await viewer.goto(`/projects/${projectId}/report`);
    await viewer.getByTestId("report-recent").waitFor();
    // A reload would drop this mark, so it cannot pass for a live update.
    await viewer.evaluate(() => Object.assign(window, { __notReloaded: true }));

    const report = new ReportPage(architect);
    await report.open(projectId);
    await report.chooseResults(["ULS-1"]);
    await report.make();
    const made = await (await report.madeFile()).getAttribute("href");
    expect(made).toMatch(/\/attachments\//);

    const newest = viewer.getByTestId("report-recent-file").first();
    await expect.poll(() => newest.getAttribute("href", { timeout: 1_000 }).catch(() => null), { timeout: 15_000 }).toBe(made);
    expect(await viewer.evaluate(() => (window as unknown as { __notReloaded?: boolean }).__notReloaded)).toBe(true);
    await screenshot(viewer, "live-report-list");
  });
});
