// The review report as a PDF (pdfkit, DejaVu Sans Condensed embedded: nothing is fetched). Built from plain data
// (lib/report/types.ts), so it is tested without a database. Every page carries the standing caution.
import type { CaseResult } from "../analysis/analyze";
import { STANDING_CAUTION } from "../review/caution";
import { forceStateIn } from "../vocabulary/force-state";
import { planPage, reactionsSection, utilisationSection } from "./engineering";
import { COLOURS, FONT, PAGE, ReportWriter, kn, safe } from "./pdf-writer";
import { drawClashSnippet } from "./plan-drawing";
import { stateChanges } from "./states";
import type { ReportClash, ReportInput, ReportThreadStep } from "./types";

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
    ["Revision", `${input.revision.number}: ${input.revision.name}`],
    ["Revision created", `${input.revision.createdAt.slice(0, 10)}${input.revision.createdBy ? ` by ${input.revision.createdBy}` : ""}`],
    [
      "Made current",
      input.identity.madeCurrent
        ? `${input.identity.madeCurrent.at.slice(0, 16).replace("T", " ")} UTC by ${input.identity.madeCurrent.by ?? "a former member"}${input.identity.isCurrent ? "" : " (no longer the current revision)"}`
        : "not marked current",
    ],
    ...input.identity.hashes.map((h): [string, string] => ["Content hash (SHA-256)", `${h.sha256} of ${h.of}`]),
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

function historyText(clash: ReportClash): string[][] {
  return clash.history.map((h) => [
    h.at.slice(0, 16).replace("T", " "),
    h.revision === null ? "-" : String(h.revision),
    h.step,
    h.outcome ?? "-",
    [h.by ?? "a former member", h.role ? `(${h.role})` : ""].filter(Boolean).join(" "),
    h.text || "-",
  ]);
}

/** Each clash with a plan snippet around it (force state of the first chosen result) and its decision history. */
function clashDetails(w: ReportWriter, input: ReportInput): void {
  const shown = input.combinations.find((id) => input.result.results[id]);
  const result = shown ? input.result.results[shown] : undefined;
  w.heading("Clashes one by one: where, and what was decided");
  if (result) w.paragraph(`Snippets show 6 m x 6 m of the roof in plan around each clash (circled), members coloured by force state under ${resultName(input, shown!)}.`, { color: COLOURS.muted, size: 8.5 });
  const size = 130;
  for (const clash of input.clashes) {
    w.ensure(size + 40);
    const top = w.doc.y;
    if (result) drawClashSnippet(w.doc, input.model, result, clash.point, { x: PAGE.margin, y: top, width: size, height: size });
    const x = PAGE.margin + (result ? size + 12 : 0);
    const width = w.width - (x - PAGE.margin);
    w.doc.font(FONT.bold).fontSize(10).fillColor(COLOURS.ink).text(safe(`Clash ${clash.clashKey}: member ${clash.memberId}, run ${clash.runId} (${clash.kind})`), x, top, { width });
    w.doc.font(FONT.regular).fontSize(8.5).fillColor(COLOURS.ink);
    w.doc.text(safe(`At x ${clash.point.x.toFixed(2)} m, y ${clash.point.y.toFixed(2)} m, z ${clash.point.z.toFixed(2)} m. Status ${clash.status}. Outcome now: ${clash.outcome ?? "open (nothing proposed)"}.`), x, w.doc.y + 2, { width });
    w.doc.y = Math.max(w.doc.y + 4, result ? top + size + 6 : w.doc.y);
    w.doc.x = PAGE.margin;
    if (clash.history.length === 0) w.paragraph("No proposal or decision recorded yet.", { color: COLOURS.muted, size: 8.5 });
    else
      w.table(
        [{ header: "When (UTC)", width: 72 }, { header: "Rev.", width: 30, align: "right" }, { header: "Step", width: 75 }, { header: "Outcome", width: 95 }, { header: "By", width: 95 }, { header: "Note, conditions or reason", width: 128 }],
        historyText(clash),
      );
  }
}

const stamp = (iso: string) => iso.slice(0, 16).replace("T", " ");

function judgedOnText({ judgedOn }: ReportThreadStep): string {
  if (judgedOn.revision === null) return "no revision was current";
  return `revision ${judgedOn.revision}, ${judgedOn.analysedAt ? `results of ${stamp(judgedOn.analysedAt)} UTC` : "no results stored"}`;
}

function threadStepRow(s: ReportThreadStep): string[] {
  const supersedes = s.supersedes ? `Supersedes the decision of ${s.supersedes.by} (${stamp(s.supersedes.at)} UTC).` : "";
  return [stamp(s.at), s.step, [s.by, s.role ? `(${s.role})` : ""].filter(Boolean).join(" "), judgedOnText(s), [s.text, s.conditions ? `Conditions: ${s.conditions}` : "", supersedes].filter(Boolean).join(" ")];
}

/** The record of each thread with proposals or decisions: who, in which role, when, judged on what, and the caution shown. */
function threadDecisions(w: ReportWriter, input: ReportInput): void {
  w.heading("Decisions in threads");
  w.paragraph("Each proposal, decision and supersession recorded in the team's threads (the record is append-only), with the revision and results it was judged on.", { color: COLOURS.muted, size: 8.5 });
  for (const thread of input.threads) {
    w.heading(`Thread "${thread.title}" on ${thread.anchor} (${thread.state})`, 2);
    w.table(
      [{ header: "When (UTC)", width: 72 }, { header: "Step", width: 70 }, { header: "By", width: 100 }, { header: "Judged on", width: 95 }, { header: "Text, conditions or reason", width: 158 }],
      thread.steps.map(threadStepRow),
    );
    for (const caution of new Set(thread.steps.flatMap((s) => (s.caution ? [s.caution] : [])))) w.paragraph(`Caution shown with these steps: ${caution}`, { color: COLOURS.muted, size: 8.5 });
  }
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

/** Called with the share of the report drawn so far (0 to 1); awaited, so progress can be stored between parts. */
export type ReportProgress = (fraction: number) => void | Promise<void>;

/** Builds the review report; resolves with the PDF bytes and the page count. */
export async function buildReportPdf(input: ReportInput, onProgress: ReportProgress = () => {}): Promise<{ pdf: Buffer; pages: number }> {
  const w = new ReportWriter(`${input.project.name}: review report, revision ${input.revision.number}`);
  const chunks: Buffer[] = [];
  const done = new Promise<Buffer>((resolve, reject) => {
    w.doc.on("data", (chunk: Buffer) => chunks.push(chunk));
    w.doc.on("end", () => resolve(Buffer.concat(chunks)));
    w.doc.on("error", reject);
  });
  const chosen = input.combinations.filter((id) => input.result.results[id]);
  // cover and summary, one part per chosen result, the review, then clashes and questions
  const parts = chosen.length + 3;
  let part = 0;
  const step = async () => onProgress(++part / parts);
  cover(w, input);
  modelSummary(w, input);
  loads(w, input);
  await step();
  for (const id of chosen) {
    const result = input.result.results[id];
    planPage(w, resultName(input, id), result, input);
    reactionsSection(w, resultName(input, id), id, result, input);
    forces(w, input, id, result);
    await step();
  }
  utilisationSection(w, input, (id) => resultName(input, id));
  await step();
  w.doc.addPage();
  if (input.compare) comparison(w, input, input.compare);
  clashLog(w, input);
  if (input.clashes.length) clashDetails(w, input);
  if (input.threads.length) threadDecisions(w, input);
  questions(w, input);
  await step();
  w.finish(`${input.project.name}, revision ${input.revision.number}`);
  const pages = w.doc.bufferedPageRange().count;
  w.doc.end();
  return { pdf: await done, pages };
}
