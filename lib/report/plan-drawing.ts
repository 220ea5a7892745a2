// The roof in plan (x to the right, y up the page) drawn with pdfkit's vector paths: each member a line in its
// force state's colour, thicker with |N| so the state reads without colour too, zero-force thin and translucent
// (glossary). The same drawing, clipped to a window, is a clash's snippet with the clash point marked.
import type { CaseResult } from "../analysis/analyze";
import type { TrussModel } from "../analysis/model";
import { FORCE_STATE_LABELS, forceStateOf, type ForceState } from "../vocabulary/force-state";
import { COLOURS, FONT } from "./pdf-writer";

type Box = { x: number; y: number; width: number; height: number };
type Window = { minX: number; minY: number; maxX: number; maxY: number };

const LINE_COLOUR: Record<ForceState, string> = { tension: COLOURS.tension, compression: COLOURS.compression, "zero-force": COLOURS.zeroLine };

/** The model's extent in plan, with a margin of 4 % of the larger span so edge members and supports show whole. */
export function planWindow(model: TrussModel): Window {
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  for (const n of model.nodes) {
    minX = Math.min(minX, n.x);
    minY = Math.min(minY, n.y);
    maxX = Math.max(maxX, n.x);
    maxY = Math.max(maxY, n.y);
  }
  const pad = 0.04 * Math.max(maxX - minX, maxY - minY, 1e-3);
  return { minX: minX - pad, minY: minY - pad, maxX: maxX + pad, maxY: maxY + pad };
}

/** Scale and offset that fit the window into the box, keeping plan proportions. */
function fit(window: Window, box: Box) {
  const spanX = Math.max(window.maxX - window.minX, 1e-6);
  const spanY = Math.max(window.maxY - window.minY, 1e-6);
  const scale = Math.min(box.width / spanX, box.height / spanY);
  const left = box.x + (box.width - spanX * scale) / 2;
  const bottom = box.y + box.height - (box.height - spanY * scale) / 2;
  return { scale, at: (x: number, y: number): [number, number] => [left + (x - window.minX) * scale, bottom - (y - window.minY) * scale] };
}

/** Member counts per force state, for the legend. */
export type PlanCounts = Record<ForceState, number>;

/**
 * Draws the members (zero-force underneath, then by growing |N|) and the supports as small squares; returns the
 * count of members per state. `window` clips to part of the roof (a clash snippet); the whole roof otherwise.
 */
export function drawPlan(doc: PDFKit.PDFDocument, model: TrussModel, result: CaseResult, box: Box, window: Window = planWindow(model)): PlanCounts {
  const { at, scale } = fit(window, box);
  const nodes = new Map(model.nodes.map((n) => [n.id, n]));
  const zero = new Set(result.zeroForceMembers);
  let largest = 0;
  for (const m of model.members) largest = Math.max(largest, Math.abs(result.memberForces[m.id] ?? 0));
  const counts: PlanCounts = { tension: 0, compression: 0, "zero-force": 0 };
  const lines = model.members.map((m) => {
    const force = result.memberForces[m.id] ?? 0;
    const state = forceStateOf(force, zero.has(m.id));
    counts[state] += 1;
    return { m, state, size: state === "zero-force" ? 0 : Math.abs(force) / (largest || 1) };
  });
  lines.sort((a, b) => a.size - b.size);
  doc.save();
  doc.rect(box.x, box.y, box.width, box.height).clip();
  doc.lineCap("round");
  for (const { m, state, size } of lines) {
    const a = nodes.get(m.i);
    const b = nodes.get(m.j);
    // Only what the window shows is written: a clash snippet of a large roof stays small.
    if (!a || !b || Math.max(a.x, b.x) < window.minX || Math.min(a.x, b.x) > window.maxX || Math.max(a.y, b.y) < window.minY || Math.min(a.y, b.y) > window.maxY) continue;
    doc.moveTo(...at(a.x, a.y)).lineTo(...at(b.x, b.y));
    doc.lineWidth(state === "zero-force" ? 0.3 : 0.5 + 2.5 * size);
    doc.strokeOpacity(state === "zero-force" ? 0.6 : 1).strokeColor(LINE_COLOUR[state]).stroke();
  }
  doc.strokeOpacity(1);
  const mark = Math.max(2, Math.min(4, 0.15 * scale));
  for (const support of model.supports) {
    const n = nodes.get(support.node);
    if (!n) continue;
    const [x, y] = at(n.x, n.y);
    doc.rect(x - mark / 2, y - mark / 2, mark, mark).fillColor(COLOURS.ink).fill();
  }
  doc.restore();
  doc.rect(box.x, box.y, box.width, box.height).lineWidth(0.5).strokeColor(COLOURS.rule).stroke();
  return counts;
}

/** The legend under a plan: a swatch and count per state, the support mark, and how thickness reads. */
export function drawPlanLegend(doc: PDFKit.PDFDocument, counts: PlanCounts, x: number, y: number): void {
  let left = x;
  for (const state of ["tension", "compression", "zero-force"] as const) {
    doc.moveTo(left, y + 5).lineTo(left + 18, y + 5).lineWidth(state === "zero-force" ? 0.6 : 2.5).strokeColor(LINE_COLOUR[state]).stroke();
    const label = `${FORCE_STATE_LABELS[state]}: ${counts[state]}`;
    doc.font(FONT.regular).fontSize(8.5).fillColor(COLOURS.ink).text(label, left + 22, y, { lineBreak: false });
    left += 30 + doc.widthOfString(label) + 14;
  }
  doc.rect(left, y + 2, 5, 5).fillColor(COLOURS.ink).fill();
  doc.font(FONT.regular).fontSize(8.5).fillColor(COLOURS.ink).text("Support", left + 9, y, { lineBreak: false });
  doc.font(FONT.regular).fontSize(8).fillColor(COLOURS.muted).text("Line thickness grows with |N|; zero-force members are thin. Plan view: x to the right, y up; top and bottom layers overlap.", x, y + 14);
}

/** A clash's snippet: the roof around the clash point (±`half` m in plan), with the point circled in clash rose. */
export function drawClashSnippet(doc: PDFKit.PDFDocument, model: TrussModel, result: CaseResult, point: { x: number; y: number }, box: Box, half = 3): void {
  const window = { minX: point.x - half, minY: point.y - half, maxX: point.x + half, maxY: point.y + half };
  drawPlan(doc, model, result, box, window);
  const { at } = fit(window, box);
  const [x, y] = at(point.x, point.y);
  doc.circle(x, y, 5).lineWidth(1.5).strokeColor(COLOURS.clash).stroke();
  doc.circle(x, y, 1.5).fillColor(COLOURS.clash).fill();
}
