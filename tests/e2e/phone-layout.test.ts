// Issue 17 item 11 in Chromium on a phone (390 × 844) and a tablet (768 × 1024): no page scrolls sideways and no
// element is cut off (document width against the window's, and every element's box against the window and any box
// that clips it: tests/support/layout.ts); the clash table turns into cards; in the viewer the legend does not cover
// the member panel. At 1440 × 900 the clash table's Thread links are never clipped. Screenshots of each page at
// each size are saved as artifacts (ARTIFACTS_DIR/screenshots/phone-*.png, tablet-*.png).
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appUrl, baseUrl, launchBrowser, screenshot } from "../support/browser";
import { openDemoProjectAs } from "../support/demo";
import { cutOffElements, horizontalOverflow } from "../support/layout";
import { SIGNED_IN_PAGES, type AppPage } from "./pages/app-pages";

// The viewer draws with WebGL: a software rasteriser in headless chromium without a GPU.
const WEBGL_FLAGS = ["--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"];
const SIZES = [
  { device: "phone", viewport: { width: 390, height: 844 } },
  { device: "tablet", viewport: { width: 768, height: 1024 } },
] as const;

let browser: Browser;

beforeAll(async () => {
  browser = await launchBrowser({ extraArgs: WEBGL_FLAGS });
});
afterAll(async () => {
  await browser?.close();
});

async function openPage(page: Page, projectId: string, { path, ready }: AppPage) {
  await page.goto(appUrl(path(projectId)));
  if (ready === "main") await page.locator("main").first().waitFor();
  else await page.getByTestId(ready).first().waitFor({ timeout: 60_000 });
  await page.waitForLoadState("networkidle", { timeout: 5_000 }).catch(() => undefined);
}

/** The page's sideways overflow and cut-off elements, as one list (empty when the page fits). */
async function layoutProblems(page: Page): Promise<string[]> {
  const overflow = await horizontalOverflow(page);
  return [...(overflow > 0 ? [`the page is ${overflow} px wider than the window`] : []), ...(await cutOffElements(page))];
}

describe.each(SIZES)("on a $device ($viewport.width × $viewport.height)", ({ device, viewport }) => {
  let page: Page;
  let projectId: string;

  beforeAll(async () => {
    ({ page, projectId } = await openDemoProjectAs(browser, "structural_engineer", { viewport }));
  });
  afterAll(async () => {
    await page?.context().close();
  });

  it("the sign-in page fits the window", async () => {
    const context = await browser.newContext({ baseURL: baseUrl(), viewport });
    const signedOut = await context.newPage();
    await signedOut.goto(appUrl("/sign-in"));
    await signedOut.locator("form").first().waitFor();
    expect(await layoutProblems(signedOut)).toEqual([]);
    await screenshot(signedOut, `${device}-sign-in`);
    await context.close();
  });

  it.each(SIGNED_IN_PAGES)("$name fits the window: nothing scrolls sideways or is cut off", async (appPage) => {
    await openPage(page, projectId, appPage);
    expect(await layoutProblems(page)).toEqual([]);
    await screenshot(page, `${device}-${appPage.name.replace(/\W+/g, "-")}`);
  });

  it("shows the clashes as cards, each with its Thread link inside the window", async () => {
    await openPage(page, projectId, SIGNED_IN_PAGES.find((p) => p.name === "clashes")!);
    const cards = page.getByTestId("clash-card");
    await cards.first().waitFor({ timeout: 60_000 });
    expect(await page.getByTestId("clash-table").isVisible()).toBe(false);
    const links = await page.getByTestId("clash-card-thread").all();
    expect(links.length).toBe(await cards.count());
    for (const link of links) {
      const box = (await link.boundingBox())!;
      expect(box.x).toBeGreaterThanOrEqual(0);
      expect(box.x + box.width).toBeLessThanOrEqual(viewport.width);
    }
  });

  it("keeps the legend off the member panel in the viewer", async () => {
    await openPage(page, projectId, SIGNED_IN_PAGES.find((p) => p.name === "viewer")!);
    await page.waitForFunction(() => window.__strutroom !== undefined);
    await page.evaluate(() => window.__strutroom!.selectMember("TCX-7-6"));
    const panel = page.getByTestId("member-panel");
    await panel.waitFor();
    await panel.scrollIntoViewIfNeeded();
    // Wherever the legend and the panel overlap on screen, what is drawn on top is the panel.
    const covered = await panel.evaluate((aside) => {
      const legend = document.querySelector("[data-testid=viewer-legend]");
      if (!legend) return [];
      const a = aside.getBoundingClientRect();
      const l = legend.getBoundingClientRect();
      const [left, right, top, bottom] = [Math.max(a.left, l.left), Math.min(a.right, l.right), Math.max(a.top, l.top), Math.min(a.bottom, l.bottom)];
      const hits: string[] = [];
      if (left >= right || top >= bottom) return hits;
      for (let i = 0; i <= 4; i += 1)
        for (let j = 0; j <= 4; j += 1) {
          const x = left + ((right - left) * (i + 0.5)) / 5.5;
          const y = top + ((bottom - top) * (j + 0.5)) / 5.5;
          const at = document.elementFromPoint(x, y);
          if (at && !aside.contains(at)) hits.push(`${Math.round(x)},${Math.round(y)}: ${at.tagName}`);
        }
      return hits;
    });
    expect(covered).toEqual([]);
    expect(await layoutProblems(page)).toEqual([]);
    await screenshot(page, `${device}-viewer-member-panel`);
  });
});

describe("at 1440 × 900", () => {
  it("never clips the clash table's Thread links", async () => {
    const { page, projectId } = await openDemoProjectAs(browser, "structural_engineer", { viewport: { width: 1440, height: 900 } });
    await openPage(page, projectId, SIGNED_IN_PAGES.find((p) => p.name === "clashes")!);
    await page.getByTestId("clash-table").waitFor({ timeout: 60_000 });
    expect(await page.getByTestId("clash-cards").isVisible()).toBe(false);
    const links = await page.getByTestId("clash-thread").all();
    expect(links.length).toBeGreaterThan(0);
    const clipped = await page.getByTestId("clash-table").evaluate((table) => {
      const box = table.parentElement!.getBoundingClientRect();
      return Array.from(table.querySelectorAll("[data-testid=clash-thread]"))
        .map((link) => link.getBoundingClientRect())
        .filter((r) => r.left < box.left || r.right > box.right || r.right > window.innerWidth)
        .map((r) => `${Math.round(r.left)}–${Math.round(r.right)} px in ${Math.round(box.left)}–${Math.round(box.right)} px`);
    });
    expect(clipped).toEqual([]);
    expect(await layoutProblems(page)).toEqual([]);
    await screenshot(page, "clashes-1440");
    await page.context().close();
  });
});
