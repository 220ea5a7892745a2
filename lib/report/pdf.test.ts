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
  writeFileSync(file, await buildReportPdf(input));
  const info = execFileSync("pdfinfo", [file]).toString();
  const pages = Number(/^Pages:\s+(\d+)/m.exec(info)?.[1]);
  execFileSync("pdftoppm", ["-r", "30", "-png", file, path.join(work, name)]);
  const images = readdirSync(work).filter((f) => f.startsWith(`${name}-`) && f.endsWith(".png")).length;
  // -raw keeps the order the text was drawn in (row by row); pdftotext ends every page with a form feed.
  const text = execFileSync("pdftotext", ["-raw", file, "-"]).toString().split("\f").slice(0, pages).map((page) => page.replace(/\s+/g, " "));
  return { pages, images, text };
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
