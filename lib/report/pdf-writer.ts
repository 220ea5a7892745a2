// The review report's page writer (pdfkit, DejaVu Sans Condensed embedded: nothing is fetched): headings, paragraphs,
// key-value lists, tables that break across pages, and the footer with the standing caution on every page.
import { readFileSync } from "node:fs";
import { createRequire } from "node:module";
import PDFDocument from "pdfkit";
import { STANDING_CAUTION } from "../review/caution";

export const PAGE = { size: "A4", margin: 50, footer: 70 } as const;
// Tension, compression, zero-force (lines: slate #94a3b8, translucent; text: a darker slate to stay readable) and clash
// rose are the glossary's colours.
export const COLOURS = { ink: "#0f172a", muted: "#475569", rule: "#cbd5e1", band: "#f1f5f9", tension: "#0f766e", compression: "#c2410c", zero: "#64748b", zeroLine: "#94a3b8", clash: "#e11d48" } as const;
export const FONT = { regular: "DejaVuSansCondensed", bold: "DejaVuSansCondensed-Bold" } as const;

// DejaVu Sans Condensed and its bold from the npm package dejavu-fonts-ttf (Bitstream Vera licence; DejaVu's changes
// are in the public domain), embedded as subsets: names in extended Latin, Greek and Cyrillic print as written, where
// pdfkit's built-in Helvetica has only the WinAnsi code page. Condensed, as the tables were laid out for Helvetica's
// widths (DejaVu Sans is wider). Read once per process.
const fontFile = (name: string) => readFileSync(createRequire(import.meta.url).resolve(`dejavu-fonts-ttf/ttf/${name}`));
let fontBytes: Record<keyof typeof FONT, Buffer> | null = null;
const fonts = () => (fontBytes ??= { regular: fontFile("DejaVuSansCondensed.ttf"), bold: fontFile("DejaVuSansCondensed-Bold.ttf") });

// The Unicode blocks DejaVu Sans draws in full (its coverage file, unicover.txt): Latin with its extensions and
// IPA, Greek, Cyrillic, Latin and Greek extended, general punctuation, super- and subscripts, the euro, arrows,
// mathematical operators, geometric shapes and the tick. Any other character (CJK, emoji, …) becomes "?" rather
// than an empty box; combining marks left over after composing (the bar of a slenderness) are dropped.
const NOT_DRAWN = /[^\u0000-\u02af\u0370-\u03ff\u0400-\u04ff\u1e00-\u1fff\u2000-\u206f\u2070-\u209f\u20ac\u2190-\u22ff\u25a0-\u25ff\u2713]/gu;
export function safe(text: string): string {
  return text.normalize("NFC").replace(/[\u0300-\u036f]/g, "").replace(NOT_DRAWN, "?");
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
    this.doc.registerFont(FONT.regular, fonts().regular);
    this.doc.registerFont(FONT.bold, fonts().bold);
    this.doc.font(FONT.regular);
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

  /** The font size, from `size` down to 6 pt, at which the longest word of `text` fits `width` (a hash is not broken). */
  private sizeToFit(text: string, width: number, size: number): number {
    const longest = text.split(/\s+/).reduce((a, b) => (b.length > a.length ? b : a), "");
    let fitted = size;
    while (fitted > 6 && this.doc.fontSize(fitted).widthOfString(longest) > width) fitted -= 0.5;
    return fitted;
  }

  keyValues(pairs: [string, string][]): void {
    for (const [key, value] of pairs) {
      this.ensure(14);
      const y = this.doc.y;
      this.doc.font(FONT.bold).fontSize(9.5).fillColor(COLOURS.muted).text(safe(key), PAGE.margin, y, { width: 150 });
      this.doc.font(FONT.regular).fillColor(COLOURS.ink).fontSize(this.sizeToFit(safe(value), this.width - 155, 9.5)).text(safe(value), PAGE.margin + 155, y, { width: this.width - 155 });
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

