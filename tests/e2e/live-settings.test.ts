// The project's deflection limit over the live bus (liveevents brief item 2), in Chromium: the owner saves a new
// limit span/N on the overview; without a reload, the structural engineer's open settings form shows it and the
// architect's open viewer says, under the checks of the whole roof, that the project's limit is now span/N while
// the stored checks stay against the limit of their analysis. The demo's limit is put back afterwards.
import { eq } from "drizzle-orm";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { projects } from "@/db/schema";
import { appUrl, launchBrowser, screenshot } from "../support/browser";
import { closeDb, getDb } from "../support/db";
import { openDemoProjectAs } from "../support/demo";
import { ViewerPage } from "./pages/viewer-page";

// WebGL needs a software rasteriser in headless chromium without a GPU: ANGLE on SwiftShader.
const WEBGL_FLAGS = ["--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"];

let browser: Browser;
let projectId: string;
let before: number;
const pages: Record<"owner" | "structural_engineer" | "architect", Page> = {} as never;

beforeAll(async () => {
  browser = await launchBrowser({ extraArgs: WEBGL_FLAGS });
  for (const role of ["owner", "structural_engineer", "architect"] as const) ({ page: pages[role], projectId } = await openDemoProjectAs(browser, role));
  [{ before }] = await getDb().select({ before: projects.deflectionLimit }).from(projects).where(eq(projects.id, projectId));
});

afterAll(async () => {
  await browser?.close();
  if (before) await getDb().update(projects).set({ deflectionLimit: before }).where(eq(projects.id, projectId));
  await closeDb();
});

describe("the deflection limit changed by another member", () => {
  it("reaches an open settings form and an open viewer without a reload", async () => {
    // An unusual N, so it is neither the project's limit before nor the one the demo's revision was analysed with.
    const changed = before === 317 ? 318 : 317;
    const engineer = pages.structural_engineer;
    await engineer.goto(appUrl(`/projects/${projectId}`));
    await expect.poll(() => engineer.getByTestId("deflection-limit-stored").textContent(), { timeout: 30_000 }).toBe(`The project's limit now: span/${before}.`);
    const viewer = new ViewerPage(pages.architect);
    await viewer.open(projectId);
    const architect = pages.architect;
    await architect.getByTestId("roof-checks-deflection-limit").waitFor({ timeout: 60_000 });
    const storedChecks = await architect.getByTestId("roof-checks-deflection-limit").textContent();
    // Both pages mark themselves so a reload (which would drop the mark) cannot pass for a live update.
    for (const page of [engineer, architect]) await page.evaluate(() => Object.assign(window, { __notReloaded: true }));

    const owner = pages.owner;
    await owner.goto(appUrl(`/projects/${projectId}`));
    await owner.getByLabel(/vertical deflection at most span/).fill(String(changed));
    await owner.getByTestId("deflection-limit-submit").click();
    await owner.getByTestId("deflection-limit-saved").waitFor();

    await expect.poll(() => engineer.getByTestId("deflection-limit-stored").textContent(), { timeout: 15_000 }).toBe(`The project's limit now: span/${changed}.`);
    expect(await engineer.getByLabel(/vertical deflection at most span/).inputValue()).toBe(String(changed));
    await expect.poll(() => architect.getByTestId("roof-checks-project-limit").textContent(), { timeout: 15_000 }).toContain(`now span/${changed}`);
    // The stored checks keep the limit of their analysis: the new setting applies from the next analysis.
    expect(await architect.getByTestId("roof-checks-deflection-limit").textContent()).toBe(storedChecks);
    for (const page of [engineer, architect]) expect(await page.evaluate(() => (window as unknown as { __notReloaded?: boolean }).__notReloaded)).toBe(true);
    await screenshot(architect, "live-deflection-limit-viewer");
  });
});
