// Two people in two browsers hold a review session on the demo roof: the structural engineer presents, the
// architect pins a question on a member, the engineer sees it at once and answers; a viewer sees the thread
// but is given no way to pin.
import { readFileSync } from "node:fs";
import type { Browser, BrowserContext } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, newContext, screenshot } from "../support/browser";
import { ProjectsPage } from "./pages/projects-page";
import { ReviewPage } from "./pages/review-page";
import { SignInPage } from "./pages/sign-in-page";

const accounts = JSON.parse(readFileSync(new URL("../../scripts/seed/demo-accounts.json", import.meta.url), "utf8")) as {
  password: string;
  users: { email: string; name: string; role: string }[];
};
const DEMO_PROJECT = "Northfield Community Sports Hall — roof";
const account = (role: string) => accounts.users.find((u) => u.role === role)!;

let browser: Browser;
const contexts: BrowserContext[] = [];

async function signedInReview(role: string): Promise<ReviewPage> {
  const context = await newContext(browser);
  contexts.push(context);
  const page = await context.newPage();
  const signIn = new SignInPage(page);
  await signIn.open();
  await signIn.signIn(account(role).email, accounts.password);
  const projects = new ProjectsPage(page);
  await projects.waitForList();
  const projectId = await projects.open(DEMO_PROJECT);
  const review = new ReviewPage(page);
  await review.open(projectId);
  return review;
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  for (const context of contexts) await context.close();
  await browser?.close();
});

describe("live review session in two browsers", () => {
  it("shows the architect's pin to the presenting engineer, and the answer back to the architect", async () => {
    const engineer = await signedInReview("structural_engineer");
    const architect = await signedInReview("architect");

    await engineer.startPresenting();
    await engineer.sessionStatus().filter({ hasText: "You are presenting." }).waitFor();
    await architect.sessionStatus().filter({ hasText: `${account("structural_engineer").name} is presenting.` }).waitFor();
    await architect.presenceEntry(account("structural_engineer").name).filter({ hasText: "presenting" }).waitFor();

    const title = `Can a 150 mm duct pass beside TCX-0-0? (${Date.now()})`;
    await architect.pinOnMember("TCX-0-0", title, "@Tomasz the duct runs along grid line 1.");
    await engineer.pinItem(title).waitFor();
    expect(await engineer.pinItem(title).textContent()).toContain("member TCX-0-0");
    await screenshot(engineer.page, "review-session-engineer-sees-pin");

    await engineer.pinItem(title).click();
    await engineer.comment("the duct runs along grid line 1").waitFor();
    await engineer.reply("Yes, keep 50 mm clear of the chord.");
    await architect.pinItem(title).click();
    await architect.comment("keep 50 mm clear").waitFor();
    await screenshot(architect.page, "review-session-architect-sees-answer");

    const viewer = await signedInReview("viewer");
    await viewer.pinItem(title).waitFor();
    expect(await viewer.newPinForm().count()).toBe(0);

    // The review overview lists the pin; its link opens the thread in the viewer.
    await viewer.openOverview();
    await viewer.page.getByTestId("live-session-summary").filter({ hasText: account("structural_engineer").name }).waitFor();
    await viewer.page.getByTestId("sessions-pin-table").getByRole("link", { name: title }).click();
    await viewer.comment("keep 50 mm clear").waitFor();
  });
});
