// Issue 17 item 12, progress on long work: generating a roof shows a progress bar with the phase (the browser's own
// step, then the analysis job's phase and percent, which follows the job over the live bus), and when the analysis
// is done the new revision's row scrolls into view. The report's bar is covered by files-mail-report.test.ts.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser } from "../support/browser";
import { closeDb } from "../support/db";
import { demoAccount, demoAccounts, demoProjectId } from "../support/demo";
import { ModelsPage } from "./pages/models-page";
import { signedInPage } from "./pages/sign-in-page";

let browser: Browser;
let page: Page;
let projectId: string;

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
    expect(seen.some((text) => /(Waiting for the job runner|Starting|Solving|Reviewing|Storing).* · \d+ %/.test(text))).toBe(true);
  });
});
