// Two people in two browsers hold a review session on the demo roof: the structural engineer presents, the
// architect pins a question on a member, the engineer sees it at once and answers; the architect proposes, the
// engineer decides with conditions, and the thread's record shows who (in which role), on which revision, with
// the caution shown (issue 16 item 1); a viewer sees the thread but is given no way to pin.
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, screenshot } from "../support/browser";
import { closeDb } from "../support/db";
import { demoAccount, openDemoProjectAs } from "../support/demo";
import { ReviewPage } from "./pages/review-page";

// Copied from glossary.md (the standing caution), so the test does not read ../shared.
const CAUTION = "Advisory results for coordination. Any removal, opening or change to a structural member needs the written approval of the engineer of record under the applicable local codes.";

let browser: Browser;
const pages: Page[] = [];

async function signedInReview(role: string): Promise<ReviewPage> {
  const { page, projectId } = await openDemoProjectAs(browser, role);
  pages.push(page);
  const review = new ReviewPage(page);
  await review.open(projectId);
  return review;
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  for (const page of pages) await page.context().close();
  await browser?.close();
  await closeDb();
});

describe("live review session in two browsers", () => {
  it("shows the architect's pin to the presenting engineer, and the answer back to the architect", async () => {
    const engineer = await signedInReview("structural_engineer");
    const architect = await signedInReview("architect");

    await engineer.startPresenting();
    await engineer.sessionStatus().filter({ hasText: "You are presenting." }).waitFor();
    await architect.sessionStatus().filter({ hasText: `${demoAccount("structural_engineer").name} is presenting.` }).waitFor();
    await architect.presenceEntry(demoAccount("structural_engineer").name).filter({ hasText: "presenting" }).waitFor();

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

    // The thread's record: the architect proposes, the engineer decides with conditions, both seen live.
    await architect.reply("Hang the duct 50 mm clear of TCX-0-0, nothing fixed to the chord.", "proposal");
    const proposal = engineer.comment("nothing fixed to the chord");
    await proposal.waitFor();
    expect(await proposal.getAttribute("data-kind")).toBe("proposal");
    expect(await proposal.textContent()).toContain(`Proposed · ${demoAccount("architect").name} (Architect)`);
    await engineer.reply("Accepted as proposed.", "decision", "Hangers from the purlins only; nothing welded or drilled on TCX-0-0.");
    const decision = architect.comment("Hangers from the purlins only");
    await decision.waitFor();
    const record = await decision.textContent();
    expect(record).toContain(`Decided · ${demoAccount("structural_engineer").name} (Structural engineer)`);
    expect(record).toContain("judged on revision 1");
    expect(record).toContain("Conditions: Hangers from the purlins only; nothing welded or drilled on TCX-0-0.");
    expect(record).toContain(`Caution shown: ${CAUTION}`);
    // A proposal can no longer replace the decision: the architect may only comment now.
    expect(await architect.replyKinds().count()).toBe(0);
    await screenshot(architect.page, "review-session-thread-decided");

    const viewer = await signedInReview("viewer");
    await viewer.pinItem(title).waitFor();
    expect(await viewer.newPinForm().count()).toBe(0);

    // The review overview lists the pin; its link opens the thread in the viewer.
    await viewer.openOverview();
    await viewer.page.getByTestId("live-session-summary").filter({ hasText: demoAccount("structural_engineer").name }).waitFor();
    await viewer.page.getByTestId("sessions-pin-table").getByRole("link", { name: title }).click();
    await viewer.comment("keep 50 mm clear").waitFor();
  });
});
