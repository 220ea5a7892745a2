import Papa from "papaparse";
import {
  fabrications,
  loadCategories,
  type Fabrication,
  validateModel,
  type Combination,
  type LoadCase,
  type Locator,
  type ModelProblem,
  type TrussModel,
  type ValidationResult,
} from "./model";

/**
 * CSV tables accepted by `modelFromCsv` (keys case-insensitive, ".csv" optional; first line is the header):
 *   nodes        id,x,y,z                                           (required)
 *   members      id,i,j,section[,effectiveLengthFactor]             (required)
 *   sections     id,material,area,radiusOfGyration,outerDiameter,wallThickness[,fabrication]   (required;
 *                fabrication hot-finished or cold-formed, cold-formed when absent or empty)
 *   supports     node,ux,uy,uz   (true/false, yes/no, 1/0)          (required)
 *   loads        loadCase,node,fx,fy,fz                              (nodal loads)
 *   materials    id,E,fy,unitWeight[,fu]     (optional: S355 steel "S355" when absent; fu from the grade when empty)
 *   loadCases    id,name,category,selfWeight (optional: one "other" case per loadCase named in loads)
 *   combinations id,name,loadCase,factor     (optional: one line per factor)
 */
export const csvColumns = {
  nodes: ["id", "x", "y", "z"],
  members: ["id", "i", "j", "section"],
  sections: ["id", "material", "area", "radiusOfGyration", "outerDiameter", "wallThickness"],
  supports: ["node", "ux", "uy", "uz"],
  loads: ["loadCase", "node", "fx", "fy", "fz"],
  materials: ["id", "E", "fy", "unitWeight"],
  loadCases: ["id", "name", "category", "selfWeight"],
  combinations: ["id", "name", "loadCase", "factor"],
} as const;

type TableName = keyof typeof csvColumns;
const requiredTables: TableName[] = ["nodes", "members", "sections", "supports"];

// S355 with E 210 GPa and 78.5 kN/m3 (EN 1993-1-1; common practice) when no materials table is given.
const defaultMaterial = { id: "S355", E: 210e6, fy: 355e3, unitWeight: 78.5 };

type Row = { line: number; cells: Record<string, string> };

function parseTable(name: TableName, text: string, problems: ModelProblem[]): Row[] {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: false });
  const lines = parsed.data;
  const headerAt = lines.findIndex((cells) => cells.some((c) => c.trim() !== ""));
  if (headerAt < 0) return [];
  const header = lines[headerAt].map((h) => h.trim());
  for (const column of csvColumns[name]) {
    if (!header.includes(column)) problems.push({ where: `${name}.csv header`, message: `missing column "${column}"` });
  }
  const rows: Row[] = [];
  for (let k = headerAt + 1; k < lines.length; k++) {
    if (lines[k].every((c) => c.trim() === "")) continue;
    const cells: Record<string, string> = {};
    header.forEach((h, c) => (cells[h] = (lines[k][c] ?? "").trim()));
    rows.push({ line: k + 1, cells });
  }
  return rows;
}

/** Reads CSV tables into a model (validated like JSON); problems name the file and line. */
export function modelFromCsv(tables: Record<string, string>, options: { name?: string } = {}): ValidationResult {
  const problems: ModelProblem[] = [];
  const byName = new Map<string, string>();
  for (const [key, text] of Object.entries(tables)) byName.set(key.toLowerCase().replace(/\.csv$/, "").replace(/[_-]/g, ""), text);
  const get = (name: TableName): Row[] | undefined => {
    const text = byName.get(name.toLowerCase());
    return text === undefined ? undefined : parseTable(name, text, problems);
  };
  for (const name of requiredTables) {
    if (!byName.has(name.toLowerCase())) problems.push({ where: `${name}.csv`, message: "table missing" });
  }

  const at = (table: TableName, row: Row, label?: string) => `${table}.csv line ${row.line}${label ? ` (${label})` : ""}`;
  const number = (table: TableName, row: Row, column: string): number => {
    const raw = row.cells[column] ?? "";
    const value = raw === "" ? NaN : Number(raw);
    if (!Number.isFinite(value)) {
      problems.push({ where: at(table, row, row.cells.id ?? row.cells.node), message: `${column} is not a finite number ("${raw}")` });
      return 0; // keeps checking the rest of the model; the problem above already stops the import
    }
    return value;
  };
  const flag = (table: TableName, row: Row, column: string): boolean => {
    const raw = (row.cells[column] ?? "").toLowerCase();
    if (["true", "yes", "y", "1", "x"].includes(raw)) return true;
    if (["false", "no", "n", "0", ""].includes(raw)) return false;
    problems.push({ where: at(table, row, row.cells.id ?? row.cells.node), message: `${column} must be true or false ("${raw}")` });
    return false;
  };

  const nodeRows = get("nodes") ?? [];
  const memberRows = get("members") ?? [];
  const sectionRows = get("sections") ?? [];
  const supportRows = get("supports") ?? [];
  const loadRows = get("loads") ?? [];
  const materialRows = get("materials");
  const caseRows = get("loadCases");
  const comboRows = get("combinations") ?? [];

  const locations: Record<string, string[]> = {};
  const loadLocations: string[][] = [];
  const record = <T>(table: keyof TrussModel, rows: Row[], label: (r: Row) => string, make: (r: Row) => T): T[] => {
    locations[table] = rows.map((r) => at(table as TableName, r, label(r)));
    return rows.map(make);
  };

  const fabrication = (r: Row): Fabrication => {
    const raw = r.cells.fabrication;
    if ((fabrications as readonly string[]).includes(raw)) return raw as Fabrication;
    problems.push({ where: at("sections", r, r.cells.id), message: `fabrication must be ${fabrications.join(" or ")} (got "${raw}")` });
    return "cold-formed";
  };

  const model: TrussModel = {
    format: "truss-model/1",
    name: options.name ?? "CSV import",
    materials: materialRows
      ? record("materials", materialRows, (r) => r.cells.id, (r) => ({
          id: r.cells.id ?? "",
          E: number("materials", r, "E"),
          fy: number("materials", r, "fy"),
          unitWeight: number("materials", r, "unitWeight"),
          ...((r.cells.fu ?? "") === "" ? {} : { fu: number("materials", r, "fu") }),
        }))
      : [defaultMaterial],
    sections: record("sections", sectionRows, (r) => r.cells.id, (r) => ({
      id: r.cells.id ?? "",
      material: r.cells.material ?? "",
      area: number("sections", r, "area"),
      radiusOfGyration: number("sections", r, "radiusOfGyration"),
      outerDiameter: number("sections", r, "outerDiameter"),
      wallThickness: number("sections", r, "wallThickness"),
      ...((r.cells.fabrication ?? "") === "" ? {} : { fabrication: fabrication(r) }),
    })),
    nodes: record("nodes", nodeRows, (r) => r.cells.id, (r) => ({
      id: r.cells.id ?? "",
      x: number("nodes", r, "x"),
      y: number("nodes", r, "y"),
      z: number("nodes", r, "z"),
    })),
    members: record("members", memberRows, (r) => r.cells.id, (r) => ({
      id: r.cells.id ?? "",
      i: r.cells.i ?? "",
      j: r.cells.j ?? "",
      section: r.cells.section ?? "",
      ...(r.cells.effectiveLengthFactor ? { effectiveLengthFactor: number("members", r, "effectiveLengthFactor") } : {}),
    })),
    supports: record("supports", supportRows, (r) => r.cells.node, (r) => ({
      node: r.cells.node ?? "",
      ux: flag("supports", r, "ux"),
      uy: flag("supports", r, "uy"),
      uz: flag("supports", r, "uz"),
    })),
    loadCases: [],
    combinations: [],
  };
  if (!materialRows) locations.materials = ["default material S355"];

  const cases = new Map<string, LoadCase>();
  const caseOrder: string[] = [];
  const caseWhere: string[] = [];
  for (const r of caseRows ?? []) {
    const category = r.cells.category as LoadCase["category"];
    if (!loadCategories.includes(category)) {
      problems.push({ where: at("loadCases", r, r.cells.id), message: `category must be one of ${loadCategories.join(", ")} ("${r.cells.category}")` });
    }
    const id = r.cells.id ?? "";
    caseOrder.push(id);
    caseWhere.push(at("loadCases", r, id));
    loadLocations.push([]);
    cases.set(id, { id, name: r.cells.name || id, category, selfWeight: flag("loadCases", r, "selfWeight"), nodalLoads: [] });
  }
  for (const r of loadRows) {
    const caseId = r.cells.loadCase ?? "";
    let loadCase = cases.get(caseId);
    if (!loadCase) {
      if (caseRows) {
        problems.push({ where: at("loads", r), message: `load names a missing load case "${caseId}"` });
        continue;
      }
      loadCase = { id: caseId, name: caseId, category: "other", selfWeight: false, nodalLoads: [] };
      cases.set(caseId, loadCase);
      caseOrder.push(caseId);
      caseWhere.push(`loads.csv load case ${caseId}`);
      loadLocations.push([]);
    }
    loadLocations[caseOrder.indexOf(caseId)].push(at("loads", r, r.cells.node));
    loadCase.nodalLoads.push({ node: r.cells.node ?? "", fx: number("loads", r, "fx"), fy: number("loads", r, "fy"), fz: number("loads", r, "fz") });
  }
  model.loadCases = caseOrder.map((id) => cases.get(id)!);
  locations.loadCases = caseWhere;

  const combos = new Map<string, Combination>();
  const comboWhere = new Map<string, string>();
  for (const r of comboRows) {
    const id = r.cells.id ?? "";
    const combo = combos.get(id) ?? { id, name: r.cells.name || id, factors: {} };
    if (!combos.has(id)) comboWhere.set(id, at("combinations", r, id));
    combos.set(id, combo);
    const caseId = r.cells.loadCase ?? "";
    if (caseId in combo.factors) problems.push({ where: at("combinations", r, id), message: `load case "${caseId}" listed twice` });
    combo.factors[caseId] = number("combinations", r, "factor");
  }
  model.combinations = [...combos.values()];
  locations.combinations = [...comboWhere.values()];

  const locate: Locator = (table, index, load) => (load === undefined ? locations[table][index] : loadLocations[index][load]);
  const checked = validateModel(model, locate);
  if (problems.length === 0) return checked;
  return { ok: false, problems: checked.ok ? problems : [...problems, ...checked.problems] };
}
