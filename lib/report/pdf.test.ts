// The review report read back the way a person would: poppler's pdfinfo, pdftoppm (page images) and pdftotext
// (Debian's poppler-utils, ensured by scripts/test.mjs) — tools outside the project.
import { execFileSync } from "node:child_process";
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { analyzeModel } from "../analysis/analyze";
import { demoRoof } from "../analysis/demo-roof";
import { STANDING_CAUTION } from "../review/caution";
import { buildReportPdf } from "./pdf";
import { tripodReport } from "@/tests/support/fixtures/report";
import type { ReportInput } from "./types";

const work = mkdtempSync(path.join(tmpdir(), "strutroom-report-"));
afterAll(() => rmSync(work, { recursive: true, force: true }));

type ReadBack = { pages: number; images: number; text: string[] };

async function readBack(name: string, input: ReportInput): Promise<ReadBack> {
  const file = path.join(work, `${name}.pdf`);
  const built = await buildReportPdf(input);
  writeFileSync(file, built.pdf);
  const info = execFileSync("pdfinfo", [file]).toString();
  const pages = Number(/^Pages:\s+(\d+)/m.exec(info)?.[1]);
  expect(built.pages).toBe(pages);
  execFileSync("pdftoppm", ["-r", "30", "-png", file, path.join(work, name)]);
  const images = readdirSync(work).filter((f) => f.startsWith(`${name}-`) && f.endsWith(".png")).length;
  // -raw keeps the order the text was drawn in (row by row); pdftotext ends every page with a form feed.
  const text = execFileSync("pdftotext", ["-raw", file, "-"]).toString().split("\f").slice(0, pages).map((page) => page.replace(/\s+/g, " "));
  return { pages, images, text };
}

/**
 * Pixels near the glossary's tension (#0f766e) and compression (#c2410c) colours inside the plan drawing of one page,
 * rendered at 60 dpi as PPM and cropped to the drawing (100 pt to 448 pt from the top), which leaves out the
 * legend's swatches and the footer's rule.
 */
function coloursOnPage(name: string, page: number): { tension: number; compression: number } {
  const ppm = execFileSync("pdftoppm", ["-r", "60", "-f", String(page), "-l", String(page), "-x", "0", "-y", "83", "-W", "496", "-H", "290", path.join(work, `${name}.pdf`)]);
  // Binary PPM: "P6\n<width> <height>\n255\n" then RGB bytes.
  const header = /^P6\s+(\d+)\s+(\d+)\s+255\s/.exec(ppm.subarray(0, 50).toString("latin1"))!;
  const pixels = ppm.subarray(header[0].length);
  const near = (k: number, [r, g, b]: number[]) => Math.abs(pixels[k] - r) + Math.abs(pixels[k + 1] - g) + Math.abs(pixels[k + 2] - b) < 40;
  let tension = 0;
  let compression = 0;
  for (let k = 0; k + 2 < pixels.length; k += 3) {
    if (near(k, [0x0f, 0x76, 0x6e])) tension++;
    else if (near(k, [0xc2, 0x41, 0x0c])) compression++;
  }
  return { tension, compression };
}

describe("review report PDF", () => {
  it("has the caution on every page, numbered pages, and the project, revision and combinations", async () => {
    const report = await readBack("tripod", tripodReport());
    expect(report.pages).toBeGreaterThanOrEqual(4);
    expect(report.images).toBe(report.pages);
    report.text.forEach((page, k) => {
      expect(page, `page ${k + 1}`).toContain(STANDING_CAUTION);
      expect(page, `page ${k + 1}`).toContain(`page ${k + 1} of ${report.pages}`);
    });
    const all = report.text.join("\n");
    expect(report.text[0]).toContain("Northfield Sports Hall");
    expect(report.text[0]).toContain("Revision 3: Lantern added");
    expect(all).toContain("Permanent only 1.35G (ULS-1)");
    expect(all).toContain("Uplift 1.0G + 1.5W (ULS-3)");
    expect(all).toContain("1.35 x dead");
    expect(all).toContain("1 x dead + 1.5 x wind");
  });

  it("tabulates forces that match statics, the zero-force member, the state changes, clashes and open questions", async () => {
    const { text } = await readBack("tripod-content", tripodReport());
    const all = text.join("\n");
    // Symmetric tripod, apex load P, legs at sin(a) = h / L = 1 / sqrt(2): each leg carries P / (3 sin a)
    // (equilibrium of the apex, hand statics). ULS-1: P = 1.35 x 30 = 40.5 kN down, so N = -19.09 kN.
    // ULS-3: P = 30 - 1.5 x 40 = -30 kN (net up 30 kN), so N = +14.14 kN.
    expect(all).toMatch(/AD -19\.09 compression/);
    expect(all).toMatch(/AD 14\.14 tension/);
    // AB joins two fully restrained supports, so it cannot strain: zero-force in both.
    expect(all).toMatch(/Zero-force members: Permanent only 1\.35G \(ULS-1\) 1 member\(s\): AB/);
    expect(all).toContain("Members whose state differs: Permanent only 1.35G (ULS-1) against Uplift 1.0G + 1.5W (ULS-3)");
    for (const leg of ["AD", "BD", "CD"]) expect(all).toMatch(new RegExp(`${leg} compression -19\\.09 tension 14\\.14`));
    expect(all).not.toMatch(/AB zero-force 0\.00 zero-force/);
    expect(all).toContain("Opening accepted with conditions");
    expect(all).toContain("decided by Tomasz Reiner on 2026-03-03");
    expect(all).toContain("Conditions: Sleeve 100 mm at mid-length");
    expect(all).toContain("Can the lantern ring be lowered 200 mm?");
  });

  it("names the revision: number, date, who made it current and the content hash", async () => {
    const { text } = await readBack("tripod-identity", tripodReport());
    expect(text[0]).toContain("Revision 3: Lantern added");
    expect(text[0]).toContain("Revision created 2026-03-02 by Tomasz Reiner");
    expect(text[0]).toContain("Made current 2026-03-02 15:20 UTC by Tomasz Reiner");
    expect(text[0]).toContain(`Content hash (SHA-256) ${"9f2c4e".padEnd(64, "0")} of uploaded file lantern.json (2048 bytes)`);
  });

  it("reports support reactions that match statics and the reactions balance line per chosen result", async () => {
    const { text } = await readBack("tripod-reactions", tripodReport());
    const all = text.join("\n");
    // Hand statics of the tripod: the vertical load P at D splits equally over A, B, C by symmetry (Rz = P / 3), and
    // each leg's horizontal component (N cos a, cos a = 1/sqrt(2)) is taken by its support: for A (leg along -x to D)
    // Rx = -N cos a. ULS-1: P = 40.5 kN down, N = -19.09 kN: Rz = 13.50, Rx at A = -13.50 (outward push resisted).
    expect(all).toContain("Support reactions and deflection: Permanent only 1.35G (ULS-1)");
    expect(all).toMatch(/A -13\.50 0\.00 13\.50/);
    // ULS-3: net 30 kN up: Rz = -10.00 at each support
    expect(all).toMatch(/A 10\.00 0\.00 -10\.00/);
    expect(all).toMatch(/Reactions balance: sum of reactions \(0\.00, 0\.00, 40\.50\) kN against applied load \(0\.00, 0\.00, -40\.50\) kN; relative imbalance \S+ <= 1e-9\./);
    expect(all).toContain("Largest displacement: node D");
  });

  it("has a utilisation table per check with the governing result, and the arithmetic of the governing members", async () => {
    const { text } = await readBack("tripod-utilisation", tripodReport());
    const all = text.join("\n");
    expect(all).toContain("Utilisation: the most utilised members per check");
    expect(all).toContain("Design standard EN1993-1-1");
    // The legs are the most compressed under ULS-1 (19.09 kN) and the most stretched under ULS-3 (14.14 kN); the
    // compression check governs (buckling) with the larger force.
    expect(all).toMatch(/Check compression: .*AD Permanent only 1\.35G \(ULS-1\) -19\.09 \S+ 0\.\d{3}/);
    expect(all).toContain("Design-check arithmetic of the governing members");
    expect(all).toMatch(/Member AD: compression: .*under Permanent only 1\.35G \(ULS-1\)/);
    // EN 1993-1-1 (6.47)-(6.49) in the arithmetic, Greek letters as written (the embedded font has them), none lost as "?".
    expect(all).toMatch(/Elastic critical force Ncr π²·E·A·i²\/Lcr² [\d.]+ kN/);
    expect(all).toContain("Reduction factor χ");
    expect(all).not.toMatch(/\?²|\?\(/);
  });

  it("shows every clash with its decision history, and draws the plan in the force-state colours", async () => {
    const report = await readBack("tripod-plan", tripodReport());
    const all = report.text.join("\n");
    expect(all).toContain("Clash c-91ab: member AB, run SA-01 (hard)");
    expect(all).toMatch(/2026-03-02 16:00 3 Proposed Opening proposed Lucas Ferreira \(MEP engineer\) Duct SA-01 needs 100 mm\./);
    expect(all).toMatch(/2026-03-03 10:00 3 Decided Opening accepted with conditions Tomasz Reiner \(Structural engineer\)/);
    expect(all).toContain("Clash c-77fe: member CD, run CW-02 (clearance)");
    expect(all).toContain("No proposal or decision recorded yet.");
    // The plan page of ULS-1 (legs in compression) must have burnt-orange pixels and that of ULS-3 (legs in
    // tension) deep-teal ones: read back from pdftoppm's image of each plan page (a tool outside the project).
    const planPages = report.text.flatMap((page, k) => (page.includes("Plan coloured by force state:") ? [k + 1] : []));
    expect(planPages).toHaveLength(2);
    const colours = planPages.map((page) => coloursOnPage("tripod-plan", page));
    expect(colours[0].compression, "ULS-1 plan has compression colour").toBeGreaterThan(50);
    expect(colours[0].tension, "ULS-1 plan has no tension colour").toBe(0);
    expect(colours[1].tension, "ULS-3 plan has tension colour").toBeGreaterThan(50);
    expect(colours[1].compression, "ULS-3 plan has no compression colour").toBe(0);
  });

  it("shows each thread's record: proposal, decision with conditions, supersession with its reason; who, role, when, judged on what, the caution", async () => {
    const { text } = await readBack("tripod-threads", tripodReport());
    const all = text.join("\n");
    expect(all).toContain('Decisions in threads');
    expect(all).toContain('Thread "Cable tray through leg BD" on member BD (answered)');
    expect(all).toMatch(/2026-03-02 12:00 Proposed Lucas Ferreira \(MEP engineer\) revision 2, results of 2026-03-01 17:45 UTC Tray CT-3 through leg BD at 0\.8 m\./);
    expect(all).toMatch(/2026-03-02 14:10 Decided Tomasz Reiner \(Structural engineer\) revision 2, results of 2026-03-01 17:45 UTC Accepted for the tray only\. Conditions: Hole of 60 mm, edge distance 2 diameters/);
    expect(all).toMatch(/2026-03-03 09:05 Decision superseded Tomasz Reiner \(Structural engineer\) revision 3, results of 2026-03-02 09:30 UTC Reason: the lantern load makes BD work harder in revision 3\. Supersedes the decision of Tomasz Reiner \(2026-03-02 14:10 UTC\)\./);
    expect(all).toContain(`Caution shown with these steps: ${STANDING_CAUTION}`);
    // Without threads the section is left out rather than printed empty.
    const none = await readBack("tripod-no-threads", { ...tripodReport(), threads: [] });
    expect(none.text.join("\n")).not.toContain("Decisions in threads");
  });

  it("prints names in extended Latin, Greek and Cyrillic as written (embedded DejaVu Sans Condensed), in headings as in tables; only what the font lacks becomes '?'", async () => {
    const input = tripodReport();
    input.project = { ...input.project, name: "Hala sportowa Łódź-Żerań" };
    input.clashes = input.clashes.map((c) => ({ ...c, runId: "Zuluft–Δ7" }));
    input.clashes[0].history[0] = { ...input.clashes[0].history[0], by: "Ευάγγελος Παπαδάκης" };
    input.threads[0] = { ...input.threads[0], title: "Кабельный лоток через BD", steps: input.threads[0].steps.map((s) => ({ ...s, by: "Дарья Соколова" })) };
    input.openQuestions[0] = { ...input.openQuestions[0], title: "屋根 ring lowered?" };
    const { text } = await readBack("tripod-scripts", input);
    const all = text.join("\n");
    expect(text[0]).toContain("Hala sportowa Łódź-Żerań");
    expect(all).toContain("run Zuluft–Δ7 (hard)");
    expect(all).toMatch(/Proposed Opening proposed Ευάγγελος Παπαδάκης \(MEP engineer\)/);
    expect(all).toContain('Thread "Кабельный лоток через BD" on member BD');
    expect(all).toMatch(/Proposed Дарья Соколова \(MEP engineer\)/);
    // CJK is outside DejaVu Sans: "?" rather than an empty box.
    expect(all).toContain("?? ring lowered?");
    // The fonts are embedded (subsets), not referenced: pdffonts (poppler) lists them with "emb" yes.
    const fonts = execFileSync("pdffonts", [path.join(work, "tripod-scripts.pdf")]).toString();
    expect(fonts).toMatch(/DejaVuSansCondensed\s.*yes/);
    expect(fonts).toMatch(/DejaVuSansCondensed-Bold\s.*yes/);
    expect(fonts).not.toContain("Helvetica");
  });

  it("keeps the caution on every page of a long report (the demo roof, 1538 members, four combinations)", async () => {
    const model = demoRoof();
    const input: ReportInput = {
      ...tripodReport(),
      model,
      result: analyzeModel(model),
      combinations: model.combinations.map((c) => c.id),
      compare: ["ULS-2", "ULS-3"],
    };
    const report = await readBack("demo", input);
    // 1538 members in three side-by-side blocks need several pages per combination.
    expect(report.pages).toBeGreaterThan(4 * 3);
    expect(report.images).toBe(report.pages);
    report.text.forEach((page, k) => expect(page, `page ${k + 1}`).toContain(STANDING_CAUTION));
    for (const combination of model.combinations) expect(report.text.join("\n")).toContain(`${combination.name} (${combination.id})`);
  }, 60_000);
});
