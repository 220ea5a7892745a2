// Issue 18 end to end: the import screens for IFC roofs (models page), IFC runs (clashes page) and BCF topics
// (review sessions page), on a fresh project with one person per role. Every file is written by the test: IFC STEP
// text from tests/support/fixtures/ifc-files.ts (entity names and attribute lists of the buildingSMART IFC4 schema) and a BCF 3.0
// archive from lib/bcf's writer (its XML is checked against the official BCF 3.0 schemas in lib/bcf/bcf.test.ts).
import { randomUUID } from "node:crypto";
import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { readBcf, writeBcf, type BcfFile } from "@/lib/bcf";
import { memberGlobalId } from "@/lib/ifc/guid";
import { ifcDuctFile, ifcTriangleAnalysisFile } from "@/tests/support/fixtures/ifc-files";
import { launchBrowser, screenshot } from "../support/browser";
import { closeDb } from "../support/db";
import { createProjectFixture, type ProjectFixture } from "../support/fixtures";
import { BcfImport, IfcRoofImport, IfcRunsImport } from "./pages/interop-pages";
import { ReviewPage } from "./pages/review-page";
import { signedInPage } from "./pages/sign-in-page";

let browser: Browser;
let fixture: ProjectFixture;
const as = (role: keyof ProjectFixture["users"]): Promise<Page> => signedInPage(browser, fixture.users[role].email, fixture.users[role].password);

beforeAll(async () => {
  browser = await launchBrowser();
  fixture = await createProjectFixture("e2e-interop");
});
afterAll(async () => {
  await browser?.close();
  await closeDb();
});

// Without the bad pipe segment (ellipse profile) the duct file reads cleanly.
const cleanDuctFile = () => ifcDuctFile().replace(/#\d+=IFCPIPESEGMENT\('2BadSegment[^\n]*\n/, "");

function bcfArchive(): { bytes: Uint8Array; titles: string[] } {
  const comment = (text: string, minute: number) => ({ guid: randomUUID(), date: `2026-11-20T10:${String(minute).padStart(2, "0")}:00Z`, author: "reviewer@elsewhere.test", text });
  const topic = (title: string, comments: ReturnType<typeof comment>[]) => ({
    guid: randomUUID(),
    title,
    status: "Open",
    type: "Structural",
    creationDate: "2026-11-20T10:00:00Z",
    creationAuthor: "reviewer@elsewhere.test",
    labels: ["roof"],
    comments,
    viewpoints: [],
  });
  const titles = [`Splice near grid 4 ${randomUUID().slice(0, 6)}`, `Gutter support at C ${randomUUID().slice(0, 6)}`];
  const file: BcfFile = {
    version: "3.0",
    topics: [topic(titles[0], [comment("Is the splice at a node?", 1), comment("It is 300 mm off.", 2)]), topic(titles[1], [comment("Bracket on the bottom chord?", 3)])],
  };
  return { bytes: writeBcf(file, ["Open", "Closed"]), titles };
}

describe("IFC and BCF import screens", () => {
  it("the structural engineer reads an IFC roof: every problem listed by GlobalId, then a clean file saved as a revision", async () => {
    const page = await as("structural_engineer");
    const roof = new IfcRoofImport(page);
    await roof.open(fixture.projectId);
    await roof.read("bad-roof.ifc", ifcTriangleAnalysisFile().replace("IFCCIRCLEHOLLOWPROFILEDEF(.AREA.,'CHS 88.9x4',$,44.45,4.)", "IFCRECTANGLEPROFILEDEF(.AREA.,$,$,100.,50.)"));
    await page.getByTestId("ifc-roof-problems").waitFor();
    expect(await roof.problems()).toEqual([
      "4MembAB00000000000000A: profile IfcRectangleProfileDef is not a circular hollow section",
      "4MembAC00000000000000A: profile IfcRectangleProfileDef is not a circular hollow section",
      "4MembBC00000000000000B: profile IfcRectangleProfileDef is not a circular hollow section",
    ]);
    expect(await roof.summary().count()).toBe(0);

    await roof.read("triangle.ifc", ifcTriangleAnalysisFile());
    await roof.summary().waitFor();
    // The file written: 3 connections, 3 curve members, 3 supports, 1 tube, 1 steel, 1 load case, 1 combination.
    expect(await roof.summary().textContent()).toContain("Read from the analysis model: 3 nodes, 3 members, 3 supports, 1 section, 1 material, 1 load case, 1 combination.");
    await screenshot(page, "ifc-roof-preview");
    expect(await roof.save()).toContain("Revision 1 saved as a draft");
    await page.context().close();
  });

  it("the MEP engineer previews IFC runs (systems, fittings skipped, elements not read) and confirms a clean file", async () => {
    const page = await as("mep_engineer");
    const runs = new IfcRunsImport(page);
    await runs.open(fixture.projectId, 1);
    await runs.preview("services.ifc", ifcDuctFile());
    // tests/support/fixtures/ifc-files.ts ifcDuctFile: one supply-air run of three segments, one cable tray, an elbow, an ellipse pipe.
    expect(await runs.systems()).toEqual(["Supply air: 1", "cable tray: 1"]);
    expect(await runs.summary().textContent()).toContain("2 runs read (drawn in the 3D view above); 1 fitting skipped.");
    expect(await runs.problems()).toEqual([expect.stringMatching(/^2BadSegment00000000001: .*IfcEllipseProfileDef is not read/)]);
    expect(await runs.confirmButton().count()).toBe(0);
    await screenshot(page, "ifc-runs-preview-problems");

    await runs.preview("services-clean.ifc", cleanDuctFile());
    expect(await runs.problems()).toEqual([]);
    expect(await runs.confirm()).toMatch(/^Stored 2 run\(s\)\. Clashes found: \d+/);
    await page.getByTestId("runs-list").waitFor();
    expect((await runs.runIds()).sort()).toEqual(["1AAAAAAAAAAAAAAAAAAA-1", "2TrayTrayTrayTrayTray1"]);
    await page.context().close();
  });

  it("the architect imports a BCF archive: topics become pins with their comments, and a second import adds nothing", async () => {
    const page = await as("architect");
    const bcf = new BcfImport(page);
    await bcf.open(fixture.projectId);
    await bcf.upload("broken.bcf", new TextEncoder().encode("this is not a zip archive"));
    await page.getByTestId("bcf-import-problems").waitFor();
    expect((await bcf.problems()).length).toBeGreaterThan(0);

    const { bytes, titles } = bcfArchive();
    await bcf.upload("review.bcf", bytes);
    await page.getByTestId("bcf-import-done").waitFor();
    expect(await bcf.result()).toBe("2 topics added as pins, 3 comments added; 0 topics already here.");
    await page.getByTestId("sessions-pin-table").waitFor();
    await expect.poll(() => bcf.pinTitles()).toEqual(expect.arrayContaining(titles));

    await bcf.upload("review.bcf", bytes);
    await expect.poll(() => bcf.result()).toBe("0 topics added as pins, 0 comments added; 2 topics already here — nothing new in this file.");
    await page.context().close();
  });

  it("the pin's author saves the viewer's view with a snapshot, restores it with one click, and the BCF export carries it", async () => {
    const page = await as("architect");
    const review = new ReviewPage(page);
    await review.open(fixture.projectId);
    await page.waitForFunction(() => window.__strutroom?.memberCount === 3, undefined, { timeout: 60_000 });
    const title = `Gutter bracket on AB ${randomUUID().slice(0, 6)}`;
    await review.pinOnMember("AB", title, "Bracket at mid-span?");
    await page.getByTestId("pin-thread").waitFor();
    await page.getByTestId("pin-view-none").waitFor();
    await page.evaluate(() => window.__strutroom!.selectMember("AC"));
    await page.getByTestId("pin-view-save").click();
    await page.getByTestId("pin-view-snapshot").waitFor();
    await screenshot(page, "pin-saved-view");

    await page.evaluate(() => window.__strutroom!.selectMember("BC"));
    await expect.poll(() => page.getByTestId("member-panel-id").textContent()).toBe("Member BC");
    await page.getByTestId("pin-view-restore").click();
    await expect.poll(() => page.getByTestId("member-panel-id").textContent()).toBe("Member AC");

    const exported = await page.request.get(`/api/projects/${fixture.projectId}/exports/pins.bcf`);
    expect(exported.status()).toBe(200);
    const topic = readBcf(new Uint8Array(await exported.body())).file!.topics.find((t) => t.title === title)!;
    expect(topic.viewpoints[0].selection).toEqual([memberGlobalId("AC")]);
    // PNG signature (W3C PNG specification §5.2): the canvas capture is stored and exported as it was taken.
    expect(Buffer.from(topic.viewpoints[0].snapshot!.subarray(0, 8)).toString("hex")).toBe("89504e470d0a1a0a");
    await page.context().close();
  });

  it("a viewer sees none of the import forms (the rule book decides)", async () => {
    const page = await as("viewer");
    const roof = new IfcRoofImport(page);
    await roof.open(fixture.projectId);
    await page.getByText("Only the structural engineer can add revisions.").waitFor();
    expect(await roof.form.count()).toBe(0);
    const runs = new IfcRunsImport(page);
    await runs.open(fixture.projectId, 1);
    expect(await runs.form.count()).toBe(0);
    const bcf = new BcfImport(page);
    await bcf.open(fixture.projectId);
    await page.getByTestId("sessions-pin-table").waitFor();
    expect(await bcf.form.count()).toBe(0);
    await page.context().close();
  });
});
