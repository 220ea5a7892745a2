// The review report's page writer (pdfkit, built-in Helvetica: nothing is fetched): headings, paragraphs,
// key-value lists, tables that break across pages, and the footer with the standing caution on every page.
import PDFDocument from "pdfkit";
import { STANDING_CAUTION } from "../review/caution";

export const PAGE = { size: "A4", margin: 50, footer: 70 } as const;
// Tension, compression, zero-force (lines: slate #94a3b8, translucent; text: a darker slate to stay readable) and clash
// rose are the glossary's colours.
export const COLOURS = { ink: "#0f172a", muted: "#475569", rule: "#cbd5e1", band: "#f1f5f9", tension: "#0f766e", compression: "#c2410c", zero: "#64748b", zeroLine: "#94a3b8", clash: "#e11d48" } as const;
export const FONT = { regular: "Helvetica", bold: "Helvetica-Bold" } as const;

// pdfkit's built-in fonts use the WinAnsi code page: common typographic characters are mapped to their ASCII
// forms and anything else outside Latin-1 becomes "?", so user text can never break the document.
// Greek letters of the design-check arithmetic are spelt out (the code page has none); combining marks (the bar of
// a slenderness, left over after composing what Latin-1 has, like é) are dropped.
const REPLACEMENTS: Record<string, string> = {
  "≤": "<=", "≥": ">=", "−": "-", "→": "->", "≈": "~", "✓": "v", "√": "sqrt", "∞": "inf",
  α: "alpha", β: "beta", γ: "gamma", δ: "delta", Δ: "Delta", ε: "eps", η: "eta", λ: "lambda", μ: "mu", ν: "nu", π: "pi", ρ: "rho", σ: "sigma", τ: "tau", φ: "phi", Φ: "Phi", χ: "chi", ψ: "psi", ω: "omega", Ω: "Omega",
};
export function safe(text: string): string {
  return text.normalize("NFC").replace(/[\u0300-\u036f]/g, "").replace(/[^\u0000-\u00ff\u2013\u2014\u2018\u2019\u201c\u201d\u2026\u2022\u20ac]/g, (ch) => REPLACEMENTS[ch] ?? "?");
}

export function kn(value: number): string {
  return (Math.abs(value) < 0.005 ? 0 : value).toFixed(2);
}

export type Column = { header: string; width: number; align?: "left" | "right" };

export class ReportWriter {
  readonly doc: PDFKit.PDFDocument;
  readonly bottom: number;
  readonly width: number;

  constructor(title: string) {
    this.doc = new PDFDocument({ size: PAGE.size, margins: { top: PAGE.margin, left: PAGE.margin, right: PAGE.margin, bottom: PAGE.margin + PAGE.footer }, bufferPages: true, info: { Title: safe(title), Creator: "Strutroom" } });
    this.bottom = this.doc.page.height - PAGE.margin - PAGE.footer;
    this.width = this.doc.page.width - 2 * PAGE.margin;
  }

  /** Starts a new page unless `height` points fit above the footer. */
  ensure(height: number): void {
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

