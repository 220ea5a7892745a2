// The review report as a PDF (pdfkit, built-in Helvetica: nothing is fetched). Built from plain data
// (lib/report/types.ts), so it is tested without a database. Every page carries the standing caution.
import PDFDocument from "pdfkit";
import type { CaseResult } from "../analysis/analyze";
import { STANDING_CAUTION } from "../review/caution";
import { forceStateIn } from "../vocabulary/force-state";
import { stateChanges } from "./states";
import type { ReportInput } from "./types";

const PAGE = { size: "A4", margin: 50, footer: 70 } as const;
const COLOURS = { ink: "#0f172a", muted: "#475569", rule: "#cbd5e1", band: "#f1f5f9", tension: "#0f766e", compression: "#c2410c", zero: "#64748b" } as const;
const FONT = { regular: "Helvetica", bold: "Helvetica-Bold" } as const;

// pdfkit's built-in fonts use the WinAnsi code page: common typographic characters are mapped to their ASCII
// forms and anything else outside Latin-1 becomes "?", so user text can never break the document.
const REPLACEMENTS: Record<string, string> = { "≤": "<=", "≥": ">=", "−": "-", "→": "->", "≈": "~", "✓": "v" };
function safe(text: string): string {
  return text.replace(/[^\u0000-\u00ff\u2013\u2014\u2018\u2019\u201c\u201d\u2026\u2022\u20ac]/g, (ch) => REPLACEMENTS[ch] ?? "?");
}

function kn(value: number): string {
  return (Math.abs(value) < 0.005 ? 0 : value).toFixed(2);
}

type Column = { header: string; width: number; align?: "left" | "right" };

class ReportWriter {
  readonly doc: PDFKit.PDFDocument;
  private readonly bottom: number;
  private readonly width: number;

  constructor(title: string) {
    this.doc = new PDFDocument({ size: PAGE.size, margins: { top: PAGE.margin, left: PAGE.margin, right: PAGE.margin, bottom: PAGE.margin + PAGE.footer }, bufferPages: true, info: { Title: safe(title), Creator: "Strutroom" } });
    this.bottom = this.doc.page.height - PAGE.margin - PAGE.footer;
    this.width = this.doc.page.width - 2 * PAGE.margin;
  }

  private ensure(height: number): void {
    if (this.doc.y + height > this.bottom) this.doc.addPage();
  }

  heading(text: string, level: 1 | 2 = 1): void {
    this.ensure(level === 1 ? 60 : 40);
    this.doc.moveDown(level === 1 ? 0.8 : 0.5);
    this.doc.font(FONT.bold).fontSize(level === 1 ? 15 : 11.5).fillColor(COLOURS.ink).text(safe(text), PAGE.margin, this.doc.y, { width: this.width });
    this.doc.moveDown(0.3);
  }

  paragraph(text: string, options: { color?: string; size?: number } = {}): void {
    this.doc.font(FONT.regular).fontSize(options.size ?? 9.5).fillColor(options.color ?? COLOURS.ink).text(safe(text), PAGE.margin, this.doc.y, { width: this.width });
    this.doc.moveDown(0.4);
  }

  keyValues(pairs: [string, string][]): void {
    for (const [key, value] of pairs) {
      this.ensure(14);
      const y = this.doc.y;
      this.doc.font(FONT.bold).fontSize(9.5).fillColor(COLOURS.muted).text(safe(key), PAGE.margin, y, { width: 150 });
      this.doc.font(FONT.regular).fillColor(COLOURS.ink).text(safe(value), PAGE.margin + 155, y, { width: this.width - 155 });
      this.doc.moveDown(0.15);
    }
    this.doc.moveDown(0.3);
  }

  /** A table that breaks across pages, repeating its header; `colours` tints a cell's text. */
  table(columns: Column[], rows: string[][], colours?: (row: number, column: number) => string | undefined): void {
    const size = 8.5;
    const pad = 3;
    const header = () => {
      this.ensure(30);
      const y = this.doc.y;
      const height = Math.max(...columns.map((c) => this.doc.font(FONT.bold).fontSize(size).heightOfString(safe(c.header), { width: c.width - 2 * pad }))) + 2 * pad;
      this.doc.rect(PAGE.margin, y, this.width, height).fill(COLOURS.band);
      let x = PAGE.margin;
      for (const column of columns) {
        this.doc.font(FONT.bold).fontSize(size).fillColor(COLOURS.ink).text(safe(column.header), x + pad, y + pad, { width: column.width - 2 * pad, align: column.align ?? "left" });
        x += column.width;
      }
      this.doc.y = y + height;
    };
    header();
    rows.forEach((row, r) => {
      const height = Math.max(...row.map((cell, c) => this.doc.font(FONT.regular).fontSize(size).heightOfString(safe(cell), { width: columns[c].width - 2 * pad }))) + 2 * pad;
      if (this.doc.y + height > this.bottom) {
        this.doc.addPage();
        header();
      }
      const y = this.doc.y;
      let x = PAGE.margin;
      row.forEach((cell, c) => {
        this.doc.font(FONT.regular).fontSize(size).fillColor(colours?.(r, c) ?? COLOURS.ink).text(safe(cell), x + pad, y + pad, { width: columns[c].width - 2 * pad, align: columns[c].align ?? "left" });
        x += columns[c].width;
      });
      this.doc.moveTo(PAGE.margin, y + height).lineTo(PAGE.margin + this.width, y + height).lineWidth(0.4).strokeColor(COLOURS.rule).stroke();
      this.doc.y = y + height;
    });
    this.doc.x = PAGE.margin;
    this.doc.moveDown(0.6);
  }

  /** A long member list laid out in `groups` side-by-side blocks of the same columns, to save pages. */
  groupedTable(columns: Column[], rows: string[][], groups: number, colours?: (row: number, column: number) => string | undefined): void {
    const perRow = Math.ceil(rows.length / groups) || 0;
    const scale = this.width / groups / columns.reduce((sum, c) => sum + c.width, 0);
    const scaled = columns.map((c) => ({ ...c, width: c.width * scale }));
    const wide: Column[] = Array.from({ length: groups }, () => scaled).flat();
    const merged: string[][] = [];
    for (let k = 0; k < perRow; k++) {
      merged.push(Array.from({ length: groups }, (_, g) => rows[g * perRow + k] ?? columns.map(() => "")).flat());
    }
    this.table(wide, merged, colours ? (r, c) => colours(Math.floor(c / columns.length) * perRow + r, c % columns.length) : undefined);
  }

  /** Draws the footer (standing caution, page x of y) on every page; call once, at the end. */
  finish(label: string): void {
    const range = this.doc.bufferedPageRange();
    for (let i = range.start; i < range.start + range.count; i++) {
      this.doc.switchToPage(i);
      // Writing below the bottom margin would start a new page; lift the margin while the footer is drawn.
      const margins = this.doc.page.margins;
      this.doc.page.margins = { ...margins, bottom: 0 };
      const top = this.doc.page.height - PAGE.margin - PAGE.footer + 12;
      this.doc.moveTo(PAGE.margin, top).lineTo(PAGE.margin + this.width, top).lineWidth(0.6).strokeColor(COLOURS.compression).stroke();
      this.doc.font(FONT.bold).fontSize(8).fillColor(COLOURS.ink).text(`Standing caution: ${STANDING_CAUTION}`, PAGE.margin, top + 6, { width: this.width });
      this.doc.font(FONT.regular).fontSize(7.5).fillColor(COLOURS.muted).text(safe(`${label} — page ${i - range.start + 1} of ${range.count}`), PAGE.margin, this.doc.page.height - PAGE.margin - 10, { width: this.width, align: "right" });
      this.doc.page.margins = margins;
    }
  }
}

function resultName(input: ReportInput, id: string): string {
  const combination = input.model.combinations.find((c) => c.id === id);
  if (combination) return `${combination.name} (${id})`;
  const loadCase = input.model.loadCases.find((c) => c.id === id);
  return loadCase ? `${loadCase.name} (${id}, load case)` : id;
}

function factorsText(factors: Record<string, number>): string {
  return Object.entries(factors).map(([caseId, factor]) => `${factor} x ${caseId}`).join(" + ");
}

function stateColour(state: string): string | undefined {
  return state === "tension" ? COLOURS.tension : state === "compression" ? COLOURS.compression : state === "zero-force" ? COLOURS.zero : undefined;
}

function cover(w: ReportWriter, input: ReportInput): void {
  const { doc } = w;
  doc.moveDown(4);
  doc.font(FONT.regular).fontSize(11).fillColor(COLOURS.tension).text("STRUTROOM REVIEW REPORT");
  doc.moveDown(0.5);
  doc.font(FONT.bold).fontSize(24).fillColor(COLOURS.ink).text(safe(input.project.name));
  doc.moveDown(0.3);
  doc.font(FONT.regular).fontSize(13).fillColor(COLOURS.muted).text(safe(`Revision ${input.revision.number}: ${input.revision.name}`));
  doc.moveDown(1.5);
  if (input.project.description) w.paragraph(input.project.description);
  w.keyValues([
    ["Model", input.model.name],
    ["Revision created", `${input.revision.createdAt.slice(0, 10)}${input.revision.createdBy ? ` by ${input.revision.createdBy}` : ""}`],
    ["Analysis", input.result.status === "ok" ? "Analysed: stable" : "Unstable: no forces (see the model summary)"],
    ["Results in this report", input.combinations.map((id) => resultName(input, id)).join("; ") || "none chosen"],
    ["Compared", input.compare ? `${resultName(input, input.compare[0])} against ${resultName(input, input.compare[1])}` : "no comparison chosen"],
    ["Generated", `${input.generatedAt.slice(0, 16).replace("T", " ")} UTC by ${input.generatedBy}`],
  ]);
  doc.moveDown(1);
  const y = doc.y;
  const text = STANDING_CAUTION;
  const height = doc.font(FONT.bold).fontSize(10.5).heightOfString(text, { width: doc.page.width - 2 * PAGE.margin - 24 }) + 20;
  doc.rect(PAGE.margin, y, doc.page.width - 2 * PAGE.margin, height).lineWidth(1.2).strokeColor(COLOURS.compression).stroke();
  doc.font(FONT.bold).fontSize(10.5).fillColor(COLOURS.ink).text(text, PAGE.margin + 12, y + 10, { width: doc.page.width - 2 * PAGE.margin - 24 });
}

function modelSummary(w: ReportWriter, input: ReportInput): void {
  const { model, result } = input;
  const extent = (axis: "x" | "y" | "z") => {
    const values = model.nodes.map((n) => n[axis]);
    return values.length ? `${Math.min(...values).toFixed(2)} to ${Math.max(...values).toFixed(2)} m` : "-";
  };
  const restrained = model.supports.reduce((sum, s) => sum + Number(s.ux) + Number(s.uy) + Number(s.uz), 0);
  const residuals = Object.values(result.results).map((r) => r.equilibriumResidual);
  w.doc.addPage();
  w.heading("Model summary");
  w.keyValues([
    ["Nodes", String(model.nodes.length)],
    ["Members", String(model.members.length)],
    ["Supports", `${model.supports.length} nodes, ${restrained} restrained translations`],
    ["Extent x / y / z", `${extent("x")} / ${extent("y")} / ${extent("z")}`],
    ["Stability count", result.info?.countCheck?.reading ?? "-"],
    ["Largest equilibrium residual", residuals.length ? `${Math.max(...residuals).toExponential(2)} kN` : "-"],
    ["Zero-force in every combination", `${result.zeroInAll.length} member(s)`],
  ]);
  if (result.status === "unstable") {
    w.paragraph("The analysis found a mechanism, so no forces are reported:", { color: COLOURS.compression });
    for (const line of result.info?.instabilityText ?? (result.instability ?? []).map((i) => `Node ${i.node}: free along ${i.directions.join(", ")}`)) w.paragraph(`- ${line}`);
  }
  w.heading("Materials", 2);
  w.table(
    [{ header: "Material", width: 120 }, { header: "E (kN/m2)", width: 130, align: "right" }, { header: "fy (kN/m2)", width: 130, align: "right" }, { header: "Unit weight (kN/m3)", width: 115, align: "right" }],
    model.materials.map((m) => [m.id, m.E.toExponential(3), m.fy.toExponential(3), String(m.unitWeight)]),
  );
  w.heading("Sections", 2);
  const count = (id: string) => model.members.filter((m) => m.section === id).length;
  w.table(
    [{ header: "Section", width: 95 }, { header: "Material", width: 70 }, { header: "Outer diameter (m)", width: 85, align: "right" }, { header: "Wall (m)", width: 70, align: "right" }, { header: "Area (m2)", width: 85, align: "right" }, { header: "Members", width: 90, align: "right" }],
    model.sections.map((s) => [s.id, s.material, s.outerDiameter.toFixed(4), s.wallThickness.toFixed(4), s.area.toExponential(3), String(count(s.id))]),
  );
}

function loads(w: ReportWriter, input: ReportInput): void {
  w.heading("Load cases and combinations");
  w.table(
    [{ header: "Load case", width: 75 }, { header: "Name", width: 160 }, { header: "Category", width: 75 }, { header: "Self weight", width: 60 }, { header: "Nodal loads", width: 60, align: "right" }, { header: "Sum fz (kN)", width: 65, align: "right" }],
    input.model.loadCases.map((c) => [c.id, c.name, c.category, c.selfWeight ? "included" : "no", String(c.nodalLoads.length), kn(c.nodalLoads.reduce((s, l) => s + l.fz, 0))]),
  );
  w.table(
    [{ header: "Combination", width: 85 }, { header: "Name", width: 150 }, { header: "Factors", width: 260 }],
    input.model.combinations.map((c) => [c.id, c.name, factorsText(c.factors)]),
  );
}

function forces(w: ReportWriter, input: ReportInput, id: string, result: CaseResult): void {
  w.doc.addPage();
  w.heading(`Member forces: ${resultName(input, id)}`);
  w.paragraph("Axial force N in kN, tension positive. State as classified by the analysis.", { color: COLOURS.muted, size: 8.5 });
  const rows = input.model.members.map((m) => [m.id, kn(result.memberForces[m.id] ?? 0), forceStateIn(result, m.id)]);
  w.groupedTable(
    [{ header: "Member", width: 70 }, { header: "N (kN)", width: 60, align: "right" }, { header: "State", width: 70 }],
    rows,
    3,
    (r, c) => (c === 2 ? stateColour(rows[r]?.[2] ?? "") : undefined),
  );
  w.heading(`Zero-force members: ${resultName(input, id)}`, 2);
  w.paragraph(result.zeroForceMembers.length ? `${result.zeroForceMembers.length} member(s): ${result.zeroForceMembers.join(", ")}` : "None.");
}

function comparison(w: ReportWriter, input: ReportInput, [a, b]: [string, string]): void {
  const resultA = input.result.results[a];
  const resultB = input.result.results[b];
  w.heading(`Members whose state differs: ${resultName(input, a)} against ${resultName(input, b)}`);
  if (!resultA || !resultB) {
    w.paragraph("One of the two results is not in the analysis.");
    return;
  }
  const changes = stateChanges(input.model.members.map((m) => m.id), resultA, resultB);
  if (changes.length === 0) {
    w.paragraph("Every member has the same state in both.");
    return;
  }
  w.table(
    [{ header: "Member", width: 85 }, { header: `State in ${a}`, width: 105 }, { header: `N in ${a} (kN)`, width: 80, align: "right" }, { header: `State in ${b}`, width: 105 }, { header: `N in ${b} (kN)`, width: 80, align: "right" }],
    changes.map((c) => [c.memberId, c.a.state, kn(c.a.force), c.b.state, kn(c.b.force)]),
    (r, c) => (c === 1 ? stateColour(changes[r].a.state) : c === 3 ? stateColour(changes[r].b.state) : undefined),
  );
}

function clashLog(w: ReportWriter, input: ReportInput): void {
  w.heading("Clash log");
  if (input.clashes.length === 0) {
    w.paragraph("No clashes recorded for this revision.");
    return;
  }
  w.table(
    [{ header: "Clash", width: 60 }, { header: "Member", width: 50 }, { header: "Run", width: 45 }, { header: "Kind", width: 50 }, { header: "Outcome", width: 95 }, { header: "Proposed / decided by", width: 100 }, { header: "Note and conditions", width: 95 }],
    input.clashes.map((c) => [
      `${c.clashKey}${c.status === "cleared" ? " (cleared)" : ""}`,
      c.memberId,
      c.runId,
      c.kind,
      c.outcome ?? "open",
      [c.proposedBy ? `proposed by ${c.proposedBy}` : "", c.decidedBy ? `decided by ${c.decidedBy}${c.decidedAt ? ` on ${c.decidedAt.slice(0, 10)}` : ""}` : ""].filter(Boolean).join("; ") || "-",
      [c.note, c.conditions ? `Conditions: ${c.conditions}` : ""].filter(Boolean).join(" ") || "-",
    ]),
  );
}

function questions(w: ReportWriter, input: ReportInput): void {
  w.heading("Open questions");
  if (input.openQuestions.length === 0) {
    w.paragraph("No open questions.");
    return;
  }
  w.table(
    [{ header: "Question", width: 150 }, { header: "On", width: 90 }, { header: "State", width: 55 }, { header: "Raised by", width: 95 }, { header: "Date", width: 55 }, { header: "Comments", width: 50, align: "right" }],
    input.openQuestions.map((q) => [q.title, q.anchor, q.state, q.author, q.createdAt.slice(0, 10), String(q.comments)]),
  );
}

/** Builds the review report; resolves with the PDF bytes. */
export function buildReportPdf(input: ReportInput): Promise<Buffer> {
  const w = new ReportWriter(`${input.project.name}: review report, revision ${input.revision.number}`);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    w.doc.on("data", (chunk: Buffer) => chunks.push(chunk));
    w.doc.on("end", () => resolve(Buffer.concat(chunks)));
    w.doc.on("error", reject);
  });
  cover(w, input);
  modelSummary(w, input);
  loads(w, input);
  for (const id of input.combinations) {
    const result = input.result.results[id];
    if (result) forces(w, input, id, result);
  }
  w.doc.addPage();
  if (input.compare) comparison(w, input, input.compare);
  clashLog(w, input);
  questions(w, input);
  w.finish(`${input.project.name}, revision ${input.revision.number}`);
  w.doc.end();
  return done;
}
