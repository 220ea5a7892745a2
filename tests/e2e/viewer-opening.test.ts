// Issue 13, navigation to a drawn roof: before the first colouring is drawn the viewer asks the server for exactly
// three things about the revision (its overview, its geometry and the opening result's columns), each once, all
// three started by the page's <head> (preloads) rather than by a script after hydration, and all three sent before
// any of them was answered. Asserted from the browser's own records (resource timing's initiator, Playwright's
// request events), never from how long anything took.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appUrl, launchBrowser } from "../support/browser";
import { closeDb } from "../support/db";
import { openDemoProjectAs } from "../support/demo";

// WebGL needs a software rasteriser in headless chromium without a GPU: ANGLE on SwiftShader.
const WEBGL_FLAGS = ["--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"];

let browser: Browser;
let page: Page;
let projectId: string;

beforeAll(async () => {
  browser = await launchBrowser({ extraArgs: WEBGL_FLAGS });
  ({ page, projectId } = await openDemoProjectAs(browser, "viewer", { viewport: { width: 1440, height: 900 } }));
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

/** "summary", "geometry" or "results/<id>" for a request about revision 1 of the project; null for anything else. */
const revisionPart = (url: string) => {
  const match = new RegExp(`^/api/projects/${projectId}/models/1/(.+)$`).exec(new URL(url).pathname);
  return match ? decodeURIComponent(match[1]) : null;
};

describe("opening the viewer on the demo roof", () => {
  it("fetches the overview, the geometry and the opening result's columns once each, from the page's head, side by side", async () => {
    const response = await page.request.get(appUrl(`/api/projects/${projectId}/models/1/summary`));
    const { revision } = (await response.json()) as { revision: { model: { combinations: { id: string }[] }; analysis: { resultIds: string[] } } };
    // The viewer opens with the first combination that has stored results (lib/models/result-order.ts).
    const opening = revision.model.combinations.map((c) => c.id).find((id) => revision.analysis.resultIds.includes(id));
    expect(opening).toBeDefined();
    const expected = ["geometry", `results/${opening}`, "summary"];

    const events: string[] = [];
    page.on("request", (request) => {
      const part = revisionPart(request.url());
      if (part) events.push(`sent ${part}`);
    });
    page.on("response", (answer) => {
      const part = revisionPart(answer.url());
      if (part) events.push(`answered ${part}`);
    });
    await page.goto(appUrl(`/projects/${projectId}/viewer?revision=1`));
    await page.waitForFunction(() => performance.getEntriesByName("viewer:colouring-drawn").length > 0, null, { timeout: 60_000 });

    const before = (await page.evaluate(() => {
      const drawn = performance.getEntriesByName("viewer:colouring-drawn")[0].startTime;
      return performance
        .getEntriesByType("resource")
        .filter((entry) => entry.startTime <= drawn)
        .map((entry) => ({ url: entry.name, initiator: (entry as PerformanceResourceTiming).initiatorType }));
    })) as { url: string; initiator: string }[];
    const asked = before.map((entry) => ({ part: revisionPart(entry.url), initiator: entry.initiator })).filter((entry) => entry.part !== null);
    // Each once: the viewer's own fetches took the preloaded answers instead of asking again.
    expect(asked.map((entry) => entry.part).sort()).toEqual(expected);
    // Started by <link rel="preload"> in the head, before any script ran.
    expect(asked.map((entry) => entry.initiator)).toEqual(["link", "link", "link"]);
    // Side by side: all three were sent before the first of them was answered.
    const firstAnswer = events.findIndex((event) => event.startsWith("answered "));
    expect(events.slice(0, firstAnswer).sort()).toEqual(expected.map((part) => `sent ${part}`));
  });
});
