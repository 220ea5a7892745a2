// Issue 16 end to end: the demo's story (README "What to try", lib/analysis/demo-roof.ts), walked by the MEP
// engineer and the structural engineer in two browsers at once on the clashes page of the current revision. Each
// step made in one browser appears in the other without a reload (live invalidation). The opening through the
// zero-everywhere edge chord is proposed by one person and accepted with conditions by another; the opening
// through the strut that works under wind is refused with its reason shown; the riser through the working chord
// is rerouted.
import type { Browser } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { launchBrowser, screenshot } from "../support/browser";
import { closeDb } from "../support/db";
import { demoAccount, openDemoProjectAs } from "../support/demo";
import { ClashesPage } from "./pages/clashes-page";

let browser: Browser;
const LIVE = { timeout: 30_000 };

async function clashesAs(role: string): Promise<ClashesPage> {
  const { page: signedIn, projectId } = await openDemoProjectAs(browser, role);
  const page = new ClashesPage(signedIn);
  // No ?revision=: the page opens the current revision (the demo's revision 1).
  await page.openDefault(projectId);
  return page;
}

beforeAll(async () => {
  browser = await launchBrowser();
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

describe("the demo's story, as the MEP engineer and the structural engineer", () => {
  it("accepts the opening through the idle edge chord, refuses the one through the strut, reroutes the riser", async () => {
    const [mep, structural] = await Promise.all([clashesAs("mep_engineer"), clashesAs("structural_engineer")]);
    const mepName = demoAccount("mep_engineer").name;
    const structuralName = demoAccount("structural_engineer").name;

    // FA-01 × TCY-0-5: zero in every combination, idle.
    await Promise.all([mep.select("FA-01"), structural.select("FA-01")]);
    const member = await mep.page.getByTestId("clash-panel").textContent();
    expect(member).toContain("TCY-0-5");
    expect(member).toContain("Zero in all");
    expect(member).toContain("verdict: idle");
    await mep.propose("opening_proposed", "The intake cannot rise: the louvre on the gable is fixed.");
    await mep.outcome().filter({ hasText: "Opening proposed" }).waitFor(LIVE);
    // Seen live by the structural engineer, who may decide (the MEP engineer proposed it).
    await structural.outcome().filter({ hasText: "Opening proposed" }).waitFor(LIVE);
    await structural.decideForm().waitFor(LIVE);
    await structural.accept("Sleeved opening of 350 mm at mid-length of TCY-0-5 only, collar to the engineer of record's detail, clear of the bearing plates.");
    await mep.outcome().filter({ hasText: "Opening accepted with conditions" }).waitFor(LIVE);
    expect(await mep.page.getByTestId("clash-conditions").textContent()).toContain("Sleeved opening of 350 mm");
    await expect.poll(() => mep.history().count(), LIVE).toBe(2);
    const history = await mep.page.getByTestId("clash-history").textContent();
    expect(history).toContain(`${mepName} (MEP engineer)`);
    expect(history).toContain(`${structuralName} (Structural engineer)`);
    expect(history).toContain("judged on revision 1");
    // A proposal can no longer replace the decision.
    await mep.page.getByTestId("propose-blocked").waitFor();
    await screenshot(mep.page, "story-opening-accepted");

    // HW-01 × RS-W1: zero under gravity, works under the wind from the west.
    await Promise.all([mep.select("HW-01"), structural.select("HW-01")]);
    expect(await structural.page.getByTestId("clash-panel").textContent()).toContain("verdict: load-bearing");
    await mep.propose("opening_proposed", "Could the heating pipe pass through the strut?");
    await structural.decideForm().waitFor(LIVE);
    await structural.refuse("RS-W1 is zero under gravity but carries 91 kN under the wind from the west: it holds the roof in plan.");
    await mep.outcome().filter({ hasText: "Opening refused" }).waitFor(LIVE);
    expect(await mep.page.getByTestId("clash-refusal").textContent()).toContain("carries 91 kN under the wind from the west");
    await screenshot(mep.page, "story-opening-refused");

    // SA-02 × BCX-7-5: a working chord; the run is rerouted.
    await Promise.all([mep.select("SA-02"), structural.select("SA-02")]);
    expect(await mep.page.getByTestId("clash-panel").textContent()).toContain("Load-bearing");
    await mep.propose("reroute_run", "Riser moves 1.5 m east, between the bottom chords.");
    await structural.decideForm().waitFor(LIVE);
    await structural.page.getByTestId("decide-submit").click();
    await mep.outcome().filter({ hasText: "Decided: Reroute the run" }).waitFor(LIVE);
    await screenshot(structural.page, "story-reroute");

    // The table groups by system: the heating pipe's clash under its own header.
    await mep.page.getByTestId("clash-group-by").selectOption("system");
    await mep.page.getByTestId("clash-group").filter({ hasText: "System: heating · 1 clash" }).waitFor();
  }, 300_000); // two people, two sign-ins and several live round trips on a shared two-core machine
});
