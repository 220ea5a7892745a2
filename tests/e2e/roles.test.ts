import { readFileSync } from "node:fs";
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appUrl, launchBrowser, newContext, screenshot } from "../support/browser";
import { ProjectOverviewPage } from "./pages/project-overview-page";
import { ProjectsPage } from "./pages/projects-page";
import { SignInPage } from "./pages/sign-in-page";

// The seeded demo (scripts/db-seed.ts) and its documented sign-ins.
const accounts = JSON.parse(readFileSync(new URL("../../scripts/seed/demo-accounts.json", import.meta.url), "utf8")) as {
  password: string;
  users: { email: string; name: string; role: string }[];
};
const DEMO_PROJECT = "Northfield Community Sports Hall — roof";

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

describe("signing in as each demo role", () => {
  it.each(accounts.users)("$role sees the demo project, the right actions, and signs out", async ({ email, name, role }) => {
    const context = await newContext(browser);
    const page = await context.newPage();
    try {
      const signIn = new SignInPage(page);
      await signIn.open();
      await signIn.signIn(email, accounts.password);
      const projects = new ProjectsPage(page);
      await projects.waitForList();
      expect(await projects.signedInAs().textContent()).toBe(name);
      await screenshot(page, `projects-${role}`);

      await projects.open(DEMO_PROJECT);
      const overview = new ProjectOverviewPage(page);
      await overview.header.waitFor();
      await overview.waitForTeam(accounts.users.length);
      expect(await overview.nav.textContent()).toContain("Clashes");
      // Where the review stands (issue 17 item 16): the demo has a revision under review and open questions.
      expect(await page.getByTestId("review-state-revision").textContent()).toMatch(/^Revision \d+: /);
      expect(await page.getByTestId("review-state-threads").textContent()).toMatch(/\d+ open · \d+ answered · \d+ closed/);
      const isOwner = role === "owner";
      expect(await overview.invitePanel.isVisible()).toBe(isOwner);
      expect(await overview.roleSelect(email).count()).toBe(isOwner ? 1 : 0);
      await screenshot(page, `project-overview-${role}`);

      await projects.signOut();
      await page.goto(appUrl("/projects"));
      await page.waitForURL(/\/sign-in\?callbackUrl=%2Fprojects/);
    } finally {
      await context.close();
    }
  });
});

describe("refusals", () => {
  it("shows a wrong password beside the password field and stays signed out", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    try {
      const signIn = new SignInPage(page);
      await signIn.open();
      await signIn.signIn(accounts.users[0].email, "not-the-password");
      await signIn.passwordError().waitFor();
      expect(await signIn.passwordError().textContent()).toBe("E-mail or password is incorrect.");
      await signIn.signIn("not-an-email", "x");
      await signIn.emailError().waitFor();
      await screenshot(page, "sign-in-errors");
      const response = await page.request.get(appUrl("/api/projects"));
      expect(response.status()).toBe(401);
    } finally {
      await context.close();
    }
  });

  it("sends a signed-out visitor of a project page to sign in, then back to the page", async () => {
    const context = await newContext(browser);
    const page = await context.newPage();
    try {
      const viewer = accounts.users.find((u) => u.role === "viewer")!;
      await page.goto(appUrl("/account"));
      await page.waitForURL(/\/sign-in\?callbackUrl=%2Faccount/);
      await new SignInPage(page).signIn(viewer.email, accounts.password);
      await page.waitForURL(/\/account$/);
      expect(await page.getByTestId("account-email").textContent()).toBe(viewer.email);
      await screenshot(page, "account");
    } finally {
      await context.close();
    }
  });
});
