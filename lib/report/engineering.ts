// The report's engineering pages: the plan coloured by force state and the support reactions with the
// "reactions balance" line per chosen result, the utilisation table (top members per check with the governing
// result) and the design-check arithmetic of the governing members.
import type { CaseResult } from "../analysis/analyze";
import { largestDisplacement, reactionBalance } from "../analysis/reaction-balance";
import type { StoredMemberReview } from "../models/analyse";
import { NOT_CHECKED } from "../review/caution";
import { COLOURS, FONT, PAGE, kn, type ReportWriter } from "./pdf-writer";
import { drawPlan, drawPlanLegend } from "./plan-drawing";
import type { ReportInput } from "./types";

/** How many members the utilisation table lists per check, and how many of those show their arithmetic. */
export const TOP_PER_CHECK = 10;
export const ARITHMETIC_PER_CHECK = 3;

const mm = (metres: number) => (metres * 1000).toFixed(2);

/** A page with the roof in plan for one result, its legend, and the largest displacement. */
export function planPage(w: ReportWriter, title: string, result: CaseResult, input: ReportInput): void {
  const { doc } = w;
  doc.addPage();
  w.heading(`Plan coloured by force state: ${title}`);
  const top = doc.y + 4;
  // Room below for the legend and, on small roofs, the reactions table.
  const height = Math.min(w.width * 0.75, w.bottom - top - 60);
  const counts = drawPlan(doc, input.model, result, { x: PAGE.margin, y: top, width: w.width, height });
  drawPlanLegend(doc, counts, PAGE.margin, top + height + 8);
  doc.x = PAGE.margin;
}

/** The support reactions of one result as a table, with the balance line and the largest displacement. */
export function reactionsSection(w: ReportWriter, title: string, id: string, result: CaseResult, input: ReportInput): void {
  w.heading(`Support reactions and deflection: ${title}`, 2);
  const rows = Object.entries(result.reactions).map(([node, r]) => [node, kn(r.fx), kn(r.fy), kn(r.fz)]);
  w.table(
    [{ header: "Support node", width: 140 }, { header: "Rx (kN)", width: 118, align: "right" }, { header: "Ry (kN)", width: 118, align: "right" }, { header: "Rz (kN)", width: 119, align: "right" }],
    rows,
  );
  const balance = reactionBalance(input.model, id, result);
  w.paragraph(balance.text, { color: balance.balanced ? COLOURS.ink : COLOURS.compression });
  const moved = largestDisplacement(result);
  if (moved) w.paragraph(`Largest displacement: node ${moved.node}, ux ${mm(moved.ux)} mm, uy ${mm(moved.uy)} mm, uz ${mm(moved.uz)} mm (|u| = ${mm(moved.size)} mm).`);
}

type Ranked = { member: string; review: StoredMemberReview & { governing: NonNullable<StoredMemberReview["governing"]> } };

/** Members grouped by the check that governs them (mode and clause), most utilised first. */
export function rankByCheck(members: Record<string, StoredMemberReview>): Map<string, Ranked[]> {
  const groups = new Map<string, Ranked[]>();
  for (const [member, review] of Object.entries(members)) {
    const governing = review.governing;
    if (!governing) continue;
    const key = `${governing.mode}: ${governing.clause}`;
    const list = groups.get(key) ?? [];
    list.push({ member, review: { ...review, governing } });
    groups.set(key, list);
  }
  for (const list of groups.values()) list.sort((a, b) => b.review.governing.utilisation - a.review.governing.utilisation || a.member.localeCompare(b.member));
  return new Map([...groups.entries()].sort(([a], [b]) => a.localeCompare(b)));
}

/** The utilisation table (top members per check) and the arithmetic of the governing ones. */
export function utilisationSection(w: ReportWriter, input: ReportInput, resultName: (id: string) => string): void {
  w.doc.addPage();
  w.heading("Utilisation: the most utilised members per check");
  const review = input.review;
  if (!review) {
    w.paragraph("No member review is stored for this revision, so there are no design checks to report.");
    return;
  }
  w.paragraph(
    `Design standard ${review.standard}. Each member's governing check is the largest utilisation over the design results (ultimate combinations; load cases when there are none). ` +
      NOT_CHECKED,
    { color: COLOURS.muted, size: 8.5 },
  );
  const groups = rankByCheck(review.members);
  if (groups.size === 0) {
    w.paragraph("No member carries force in a design result.");
    return;
  }
  for (const [check, ranked] of groups) {
    w.heading(`Check ${check}`, 2);
    const top = ranked.slice(0, TOP_PER_CHECK);
    w.table(
      [{ header: "Member", width: 80 }, { header: "Governing result", width: 150 }, { header: "N (kN)", width: 75, align: "right" }, { header: "Resistance (kN)", width: 95, align: "right" }, { header: "Utilisation", width: 95, align: "right" }],
      top.map(({ member, review: r }) => [member, resultName(r.governing.result), kn(r.governing.force), kn(r.governing.resistance), r.governing.utilisation.toFixed(3)]),
      (row, column) => (column === 4 && top[row].review.governing.utilisation > 1 ? COLOURS.compression : undefined),
    );
    if (ranked.length > TOP_PER_CHECK) w.paragraph(`${ranked.length - TOP_PER_CHECK} more member(s) governed by this check, less utilised.`, { color: COLOURS.muted, size: 8.5 });
  }
  w.heading("Design-check arithmetic of the governing members");
  for (const [check, ranked] of groups) {
    for (const { member, review: r } of ranked.slice(0, ARITHMETIC_PER_CHECK)) {
      w.heading(`Member ${member}: ${check}, under ${resultName(r.governing.result)}`, 2);
      w.table(
        [{ header: "Step", width: 190 }, { header: "Expression", width: 185 }, { header: "Value", width: 120, align: "right" }],
        r.governing.steps.map((step) => [step.label, step.expression ?? "", `${typeof step.value === "number" ? Number(step.value.toPrecision(6)) : step.value} ${step.unit}`.trim()]),
      );
      const warnings = r.warnings.length ? r.warnings : r.governing.warnings;
      for (const warning of warnings) w.paragraph(`Warning: ${warning}`, { color: COLOURS.compression, size: 8.5 });
    }
  }
  w.doc.font(FONT.regular);
}
