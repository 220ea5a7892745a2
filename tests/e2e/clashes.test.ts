// Issue 7 end to end on the seeded demo: the Northfield roof's own runs and their clashes are in the table and the
// viewer; an MEP engineer proposes an opening, only the structural engineer accepts it, with written conditions;
// every step shows the standing caution; a viewer can only look.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, screenshot } from "../support/browser";
import { closeDb } from "../support/db";
import { openDemoProjectAs } from "../support/demo";
import { ClashesPage } from "./pages/clashes-page";

// Copied from glossary.md (the standing caution), so the test does not read ../shared.
const CAUTION = "Advisory results for coordination. Any removal, opening or change to a structural member needs the written approval of the engineer of record under the applicable local codes.";

let browser: Browser;

async function clashesAs(role: string): Promise<ClashesPage> {
  const { page, projectId } = await openDemoProjectAs(browser, role);
  const clashes = new ClashesPage(page);
  await clashes.open(projectId, 1);
  return clashes;
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("clash review on the demo roof", () => {
  it("lists the demo runs' clashes, filters them, and settles one between MEP and structural engineers", async () => {
    const mep = await clashesAs("mep_engineer");
    // lib/mep/demo-runs.ts: FA-01 1, HW-01 1, SA-02 1, SA-01 1, CHW-01 1, SPR-01 5, CT-01 6 clashes.
    expect(await mep.count()).toBe("16 of 16 clashes");
    expect(await mep.caution()).toBe(CAUTION);
    await mep.filter("system", "sprinkler");
    expect(await mep.count()).toBe("5 of 16 clashes");
    await mep.filter("system", "");
    await mep.filter("state", "hard");
    expect(await mep.count()).toBe("10 of 16 clashes");
    await mep.filter("state", "");

    await mep.select("CHW-01");
    await mep.propose("opening_proposed", "The pipe cannot drop: the air handler connection is fixed.");
    await mep.outcome().filter({ hasText: "Opening proposed" }).waitFor({ timeout: 60_000 });
    expect(await mep.decideForm().count()).toBe(0);
    await screenshot(mep.page, "clashes-proposed");

    const structural = await clashesAs("structural_engineer");
    await structural.select("CHW-01");
    await structural.decideForm().waitFor();
    await structural.accept("");
    await structural.page.getByTestId("decide-text-error").waitFor();
    await structural.accept("Pipe sleeve through a 100 mm hole at mid-length only; stiffening collar; re-check of the chord by the engineer of record.");
    await structural.outcome().filter({ hasText: "Opening accepted with conditions" }).waitFor({ timeout: 60_000 });
    await structural.page.getByTestId("clash-conditions").waitFor();
    await expect.poll(() => structural.history().count(), { timeout: 30_000 }).toBe(2);
    await screenshot(structural.page, "clashes-accepted");
  }, 300_000); // two people, two sign-ins and several page loads on a shared two-core machine

  it("lets a viewer look but not decide", async () => {
    const viewer = await clashesAs("viewer");
    await viewer.select("SA-01");
    expect(await viewer.proposeForm().count()).toBe(0);
    expect(await viewer.decideForm().count()).toBe(0);
    expect(await viewer.page.getByTestId("clash-caution").textContent()).toBe(CAUTION);
  });
});
