import { readFileSync } from "node:fs";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { appUrl, launchBrowser, newContext, screenshot } from "../support/browser";
import { AccountPage } from "./pages/account-page";
import { JoinPage } from "./pages/join-page";
import { ProjectOverviewPage } from "./pages/project-overview-page";
import { ProjectsPage } from "./pages/projects-page";
import { SignInPage } from "./pages/sign-in-page";

const accounts = JSON.parse(readFileSync(new URL("../../scripts/seed/demo-accounts.json", import.meta.url), "utf8")) as {
  password: string;
  users: { email: string; name: string; role: string }[];
};
const DEMO_PROJECT = "Northfield Community Sports Hall — roof";
const owner = accounts.users.find((u) => u.role === "owner")!;
const unique = `${process.pid}-${Math.floor(Math.random() * 1e6)}`;

let browser: Browser;
beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
});

async function signedIn(email: string, password: string): Promise<Page> {
  const context = await newContext(browser);
  const page = await context.newPage();
  const signIn = new SignInPage(page);
  await signIn.open();
  await signIn.signIn(email, password);
  await new ProjectsPage(page).waitForList();
  return page;
}

describe("creating a project", () => {
  it("the demo owner creates a project from the projects list, lands on its overview as its only owner, cancels an invitation and cannot remove themselves", async () => {
    const page = await signedIn(owner.email, accounts.password);
    const projects = new ProjectsPage(page);
    // The form checks the name before asking the server (schema shared with POST /api/projects).
    await projects.createProject({ name: "" });
    await projects.projectNameError().waitFor();

    const name = `Northfield practice court — canopy ${unique}`;
    await projects.createProject({ name, description: "Invented canopy over the outdoor court", designStandard: "AISC 360-22 (LRFD)" });
    await page.waitForURL(/\/projects\/[0-9a-f-]{36}$/);
    await page.getByRole("heading", { name }).waitFor();
    const overview = new ProjectOverviewPage(page);
    await overview.waitForTeam(1);
    expect(await page.getByTestId("team-member").count()).toBe(1);

    // The owner cancels a pending invitation, and cannot remove themselves as the project's only owner.
    const invitee = `canopy-${unique}@northfield-demo.test`;
    await overview.invite(invitee, "Viewer");
    await overview.pendingInvitation(invitee).waitFor();
    await overview.cancelInvitation(invitee);
    await overview.pendingInvitation(invitee).waitFor({ state: "detached" });
    await overview.removeMember(owner.email);
    await overview.teamMessage().waitFor();
    expect(await overview.teamMessage().textContent()).toMatch(/at least one owner/);
    expect(await page.getByTestId("team-member").count()).toBe(1);
    await page.goto(appUrl("/projects"));
    await projects.waitForList();
    expect(await projects.card(name).textContent()).toMatch(/Owner/);
    await page.context().close();
  });
});

describe("inviting and joining", () => {
  it("an owner invites a newcomer, who joins with the link once; a used link says so", async () => {
    const ownerPage = await signedIn(owner.email, accounts.password);
    const projectId = await new ProjectsPage(ownerPage).open(DEMO_PROJECT);
    const overview = new ProjectOverviewPage(ownerPage);
    await overview.waitForTeam(accounts.users.length);

    const newcomer = `newcomer-${unique}@northfield-demo.test`;
    const link = await overview.invite(newcomer, "Architect");
    expect(link).toMatch(/\/join\/[A-Za-z0-9_-]{40,}$/);
    await screenshot(ownerPage, "project-overview-invited");

    // Inviting a current member is refused beside the e-mail field.
    await overview.submitInvite(accounts.users[1].email, "Viewer");
    await overview.inviteEmailError().waitFor();

    const context = await newContext(browser);
    const page = await context.newPage();
    const join = new JoinPage(page);
    await join.open(link);
    await join.join("Rosa Whitfield", "short");
    await join.passwordError().waitFor();
    await screenshot(page, "join");
    await join.join("Rosa Whitfield", "a-long-newcomer-password");
    await page.waitForURL(new RegExp(`/projects/${projectId}$`));
    const joined = new ProjectOverviewPage(page);
    await joined.waitForTeam(accounts.users.length + 1);
    expect(await joined.invitePanel.isVisible()).toBe(false);
    expect(await joined.header.textContent()).toContain("Architect");

    // The owner changes the newcomer's role (through the server action); the newcomer then sees the new role.
    await overview.open(projectId);
    await overview.waitForTeam(accounts.users.length + 1);
    await overview.roleSelect(newcomer).selectOption({ label: "Viewer" });
    await overview.teamMessage().waitFor();
    expect(await overview.teamMessage().textContent()).toBe("Rosa Whitfield is now Viewer.");
    await ownerPage.context().close();
    await joined.open(projectId);
    expect(await joined.header.textContent()).toContain("Viewer");

    await join.open(link);
    await join.notice().waitFor();
    expect(await join.notice().textContent()).toContain("already been used");
    await screenshot(page, "join-used");
    await context.close();
  });
});

describe("account", () => {
  it("a member renames themselves and a wrong current password is refused beside its field", async () => {
    const architect = accounts.users.find((u) => u.role === "architect")!;
    const page = await signedIn(architect.email, accounts.password);
    const account = new AccountPage(page);
    await account.open();
    await account.rename(`${architect.name}`);
    await account.changePassword("definitely-wrong", "another-long-password");
    await account.currentPasswordError().waitFor();
    expect(await account.currentPasswordError().textContent()).toContain("not your current password");
    await screenshot(page, "account-errors");
    await page.context().close();
  });
});
