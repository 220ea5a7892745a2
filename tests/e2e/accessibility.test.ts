// Issue 17 item 10: every page is checked with axe-core (Deque's accessibility engine, run in the page) against the
// WCAG 2.1 A and AA rules it automates; no serious or critical violation may remain. The engine is evaluated through
// the DevTools protocol, so the pages' Content-Security-Policy stays on and unchanged. Signed out: sign-in and the
// invitation page (/join); signed in: every page of tests/e2e/pages/app-pages.ts, the viewer also with a member's
// panel open and its options shown.
import axe from "axe-core";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appUrl, baseUrl, launchBrowser } from "../support/browser";
import { DEMO_PROJECT, demoAccount, demoAccounts } from "../support/demo";
import { SIGNED_IN_PAGES } from "./pages/app-pages";
import { JoinPage } from "./pages/join-page";
import { ProjectOverviewPage } from "./pages/project-overview-page";
import { ProjectsPage } from "./pages/projects-page";
import { SignInPage } from "./pages/sign-in-page";

const WEBGL_FLAGS = ["--use-gl=angle", "--use-angle=swiftshader", "--enable-unsafe-swiftshader"];

type Violation = { id: string; impact: string | null; help: string; nodes: { target: unknown[] }[] };

/** Runs axe-core on the page as it stands and returns its serious and critical violations, described for a reader. */
async function seriousViolations(page: Page): Promise<string[]> {
  await page.evaluate(axe.source);
  const violations = await page.evaluate(
    async () =>
      (
        await (window as unknown as { axe: typeof axe }).axe.run(document, {
          runOnly: { type: "tag", values: ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"] },
          resultTypes: ["violations"],
        })
      ).violations as unknown as Violation[],
  );
  return violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.slice(0, 3).map((n) => JSON.stringify(n.target)).join(", ")}`);
}

let browser: Browser;
let page: Page;
let projectId: string;
/** An invitation made for the /join page's check, cancelled afterwards so the demo's team stays as seeded. */
const invitee = `axe-${Date.now()}@northfield-demo.test`;
let joinLink = "";

beforeAll(async () => {
  browser = await launchBrowser({ extraArgs: WEBGL_FLAGS });
  const context = await browser.newContext({ baseURL: baseUrl(), viewport: { width: 1440, height: 900 } });
  page = await context.newPage();
  const signIn = new SignInPage(page);
  await signIn.open();
  expect(await seriousViolations(page), "sign-in page").toEqual([]);
  await signIn.signIn(demoAccount("owner").email, demoAccounts.password);
  const projects = new ProjectsPage(page);
  await projects.waitForList();
  projectId = await projects.open(DEMO_PROJECT);
  const overview = new ProjectOverviewPage(page);
  await overview.open(projectId);
  joinLink = await overview.invite(invitee, "Viewer");
});

afterAll(async () => {
  if (joinLink) {
    const overview = new ProjectOverviewPage(page);
    await overview.open(projectId);
    await overview.cancelInvitation(invitee);
  }
  await browser?.close();
});

describe("accessibility of every page (axe-core, WCAG 2.1 A and AA)", () => {
  const pages = SIGNED_IN_PAGES.map((p) => [p.name, p.path, p.ready] as const);

  it("the invitation page (/join), signed out, has no serious or critical violation", async () => {
    const context = await browser.newContext({ baseURL: baseUrl(), viewport: { width: 1440, height: 900 } });
    const signedOut = await context.newPage();
    await new JoinPage(signedOut).open(joinLink);
    await signedOut.getByTestId("join-submit").waitFor();
    expect(await seriousViolations(signedOut), "join").toEqual([]);
    await context.close();
  });

  it("the viewer with a member's panel open and its view options shown has no serious or critical violation", async () => {
    await page.goto(appUrl(`/projects/${projectId}/viewer`));
    await page.getByTestId("viewer-legend").waitFor({ timeout: 60_000 });
    await page.waitForFunction(() => window.__strutroom !== undefined);
    await page.evaluate(() => window.__strutroom!.selectMember("TCX-7-6"));
    await page.getByTestId("member-panel").waitFor();
    await page.getByTestId("viewer-options").locator("summary").click();
    expect(await seriousViolations(page), "viewer with panel").toEqual([]);
  });

  it.each(pages)("%s has no serious or critical violation", async (name, path, ready) => {
    await page.goto(appUrl(path(projectId)));
    if (ready === "main") await page.locator("main").first().waitFor();
    else await page.getByTestId(ready).first().waitFor({ timeout: 60_000 });
    await page.waitForLoadState("networkidle", { timeout: 5_000 }).catch(() => undefined);
    expect(await seriousViolations(page), name).toEqual([]);
  });
});
