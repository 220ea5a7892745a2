// CSV exports of stored analysis results: member forces of one result, node displacements and support reactions of
// one result, and the envelope (pure; papaparse writes the CSV so quoting follows RFC 4180).
import Papa from "papaparse";
import type { AnalysisResult } from "../analysis/analyze";
import type { TrussModel } from "../analysis/model";
import { forceStateIn } from "../vocabulary/force-state";

// Cells starting with =, +, -, @, tab or CR are prefixed with a quote so a spreadsheet shows them as text (OWASP
// "CSV Injection"). papaparse's own pattern for `escapeFormulae: true` ends in `.*$`, which misses a cell with a
// line break, so the bare prefix pattern is passed. Numbers are never escaped (negative forces stay numbers).
export const UNPARSE = { newline: "\n", escapeFormulae: /^[=+\-@\t\r]/ } as const;

/**
 * Forces are printed to 0.01 kN, as people read them (issue 17 item 14: 17 digits helped nobody); the state column
 * says whether a force that prints as 0 counts as zero-force. A rounded -0 prints as 0.
 */
export function roundForce(kN: number): number {
  return Math.round(kN * 100) / 100 + 0;
}

/** Displacements to 0.001 mm (the model is in metres). */
export function roundMillimetres(metres: number): number {
  return Math.round(metres * 1e6) / 1000 + 0;
}

export const NODE_RESULT_COLUMNS = ["node", "x_m", "y_m", "z_m", "result", "ux_mm", "uy_mm", "uz_mm", "supported", "reaction_fx_kN", "reaction_fy_kN", "reaction_fz_kN"] as const;

/** One row per node: its displacement in the result and, at a support, the reaction (empty cells elsewhere). */
export function nodeResultsCsv(model: TrussModel, result: AnalysisResult, resultId: string): string {
  const caseResult = result.results[resultId];
  if (!caseResult) throw new Error(`The analysis has no result "${resultId}".`);
  const rows = model.nodes.map((node) => {
    const d = caseResult.displacements[node.id] ?? { ux: 0, uy: 0, uz: 0 };
    const r = caseResult.reactions[node.id];
    return [
      node.id, node.x, node.y, node.z, resultId,
      roundMillimetres(d.ux), roundMillimetres(d.uy), roundMillimetres(d.uz),
      r ? "true" : "false",
      r ? roundForce(r.fx) : "", r ? roundForce(r.fy) : "", r ? roundForce(r.fz) : "",
    ];
  });
  return Papa.unparse({ fields: [...NODE_RESULT_COLUMNS], data: rows }, UNPARSE) + "\n";
}

export const MEMBER_FORCE_COLUMNS = ["member", "node_i", "node_j", "section", "result", "axial_force_kN", "state"] as const;
export const ENVELOPE_COLUMNS = ["member", "node_i", "node_j", "section", "max_tension_kN", "max_compression_kN", "zero_in_all", "governing_tension", "governing_compression"] as const;

/** One row per member: its axial force (kN, tension positive) and state in the result. */
export function memberForcesCsv(model: TrussModel, result: AnalysisResult, resultId: string): string {
  const caseResult = result.results[resultId];
  if (!caseResult) throw new Error(`The analysis has no result "${resultId}".`);
  const rows = model.members.map((member) => [
    member.id,
    member.i,
    member.j,
    member.section,
    resultId,
    roundForce(caseResult.memberForces[member.id] ?? 0),
    forceStateIn(caseResult, member.id),
  ]);
  return Papa.unparse({ fields: [...MEMBER_FORCE_COLUMNS], data: rows }, UNPARSE) + "\n";
}

/** One row per member: the largest tension and compression over the envelope's results, and where they occur. */
export function envelopeCsv(model: TrussModel, result: AnalysisResult): string {
  const rows = model.members.map((member) => {
    const entry = result.envelope[member.id];
    const governing = result.info?.governing?.[member.id];
    return [
      member.id,
      member.i,
      member.j,
      member.section,
      entry ? roundForce(entry.maxTension) : "",
      entry ? roundForce(entry.maxCompression) : "",
      entry ? String(entry.zeroInAll) : "",
      governing?.maxTension ?? "",
      governing?.maxCompression ?? "",
    ];
  });
  return Papa.unparse({ fields: [...ENVELOPE_COLUMNS], data: rows }, UNPARSE) + "\n";
}
