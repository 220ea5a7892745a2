import Papa from "papaparse";
import { locateJsonError } from "../json-errors";
import { runSchema, runsFileSchema, type Run } from "./schemas";

/** One problem found in an import file; `row` is the file line (CSV) or the run's position (JSON), 1-based. */
export interface ImportProblem {
  row: number | null;
  field: string;
  message: string;
}

export interface ImportResult {
  runs: Run[];
  problems: ImportProblem[];
}

/** CSV columns: one row per point; a run's properties sit on its first row and may be repeated or left blank. */
export const RUN_CSV_COLUMNS = [
  "run",
  "system",
  "shape",
  "diameter",
  "width",
  "height",
  "rotation",
  "insulation",
  "clearance",
  "weight_per_metre",
  "x",
  "y",
  "z",
] as const;
const OPTIONAL_COLUMNS = ["name", "width", "height", "rotation", "diameter", "insulation", "clearance"] as const;
const RUN_PROPERTY_COLUMNS = ["name", "system", "shape", "diameter", "width", "height", "rotation", "insulation", "clearance", "weight_per_metre"] as const;

type CsvRow = Record<string, string | undefined>;

function numberOrProblem(raw: string | undefined, field: string, row: number, problems: ImportProblem[]): number | undefined {
  if (raw === undefined || raw.trim() === "") return undefined;
  const value = Number(raw.trim());
  if (!Number.isFinite(value)) {
    problems.push({ row, field, message: `"${raw}" is not a number.` });
    return undefined;
  }
  return value;
}

function zodPathToField(path: PropertyKey[]): string {
  return path.map(String).join(".") || "run";
}

// Run-level zod paths named as the CSV column the user typed them in.
function csvColumn(path: PropertyKey[]): string {
  if (path[0] === "profile") return String(path[1] ?? "shape");
  if (path[0] === "weightPerMetre") return "weight_per_metre";
  if (path[0] === "id") return "run";
  return zodPathToField(path);
}

/** Parses the CSV run format; every problem is listed with its line, nothing is silently dropped. */
export function parseRunsCsv(text: string): ImportResult {
  const problems: ImportProblem[] = [];
  const parsed = Papa.parse<CsvRow>(text.replace(/^\uFEFF/, ""), {
    header: true,
    skipEmptyLines: "greedy",
    transformHeader: (h) => h.trim().toLowerCase().replace(/[\s-]+/g, "_"),
  });
  // Line numbers: the header is line 1, so data row k (0-based) is line k + 2.
  for (const error of parsed.errors) {
    problems.push({ row: error.row === undefined ? null : error.row + 2, field: "csv", message: error.message });
  }
  const header = parsed.meta.fields ?? [];
  const missing = RUN_CSV_COLUMNS.filter((c) => !header.includes(c) && !(OPTIONAL_COLUMNS as readonly string[]).includes(c));
  if (missing.length > 0) {
    problems.push({ row: 1, field: "header", message: `Missing column(s): ${missing.join(", ")}.` });
    // Without the run column rows cannot be grouped; otherwise the rows are still read, so a missing column does not
    // hide bad numbers elsewhere (issue 17 item 13), and no row is blamed for the column that is missing.
    if (missing.includes("run")) return { runs: [], problems };
  }
  const missingColumns = new Set<string>(missing);

  // Group point rows by run, keeping the file order of runs and of points.
  const groups = new Map<string, { firstLine: number; rows: { line: number; row: CsvRow }[] }>();
  parsed.data.forEach((row, index) => {
    const line = index + 2;
    const id = (row.run ?? "").trim();
    if (id === "") {
      problems.push({ row: line, field: "run", message: "The run column is empty." });
      return;
    }
    const group = groups.get(id) ?? { firstLine: line, rows: [] };
    group.rows.push({ line, row });
    groups.set(id, group);
  });

  const runs: Run[] = [];
  for (const [id, group] of groups) {
    const first = group.rows[0].row;
    const lineProblems: ImportProblem[] = [];
    // Later rows may repeat a property or leave it blank, but must not contradict the first row.
    for (const { line, row } of group.rows.slice(1)) {
      for (const column of RUN_PROPERTY_COLUMNS) {
        const value = row[column]?.trim() ?? "";
        const firstValue = first[column]?.trim() ?? "";
        if (value !== "" && value !== firstValue) {
          lineProblems.push({ row: line, field: column, message: `Run ${id} has ${column} "${firstValue}" on line ${group.firstLine}; this row says "${value}".` });
        }
      }
    }
    const points = group.rows.map(({ line, row }) => ({
      x: numberOrProblem(row.x, "x", line, lineProblems),
      y: numberOrProblem(row.y, "y", line, lineProblems),
      z: numberOrProblem(row.z, "z", line, lineProblems),
    }));
    const shape = (first.shape ?? "").trim().toLowerCase();
    const candidate = {
      id,
      name: first.name?.trim() || undefined,
      system: first.system?.trim() ?? "",
      profile:
        shape === "round"
          ? { shape, diameter: numberOrProblem(first.diameter, "diameter", group.firstLine, lineProblems) }
          : { shape, width: numberOrProblem(first.width, "width", group.firstLine, lineProblems), height: numberOrProblem(first.height, "height", group.firstLine, lineProblems), rotation: numberOrProblem(first.rotation, "rotation", group.firstLine, lineProblems) },
      insulation: numberOrProblem(first.insulation, "insulation", group.firstLine, lineProblems),
      clearance: numberOrProblem(first.clearance, "clearance", group.firstLine, lineProblems),
      weightPerMetre: numberOrProblem(first.weight_per_metre, "weight_per_metre", group.firstLine, lineProblems),
      points,
    };
    const result = runSchema.safeParse(candidate);
    if (!result.success) {
      for (const issue of result.error.issues) {
        // Point issues belong to the point's own line; run issues to the run's first line.
        const pointIndex = issue.path[0] === "points" && typeof issue.path[1] === "number" ? issue.path[1] : null;
        const line = pointIndex === null ? group.firstLine : group.rows[pointIndex].line;
        const field = pointIndex === null ? csvColumn(issue.path) : String(issue.path[2] ?? "point");
        // A number we already reported as unreadable shows up again as "expected number": keep one problem.
        if (lineProblems.some((p) => p.row === line && p.field === field)) continue;
        lineProblems.push({ row: line, field, message: `Run ${id}: ${issue.message}` });
      }
    }
    problems.push(...lineProblems.filter((p) => !missingColumns.has(p.field)));
    if (result.success && lineProblems.length === 0 && missingColumns.size === 0) runs.push(result.data);
  }
  problems.sort((a, b) => (a.row ?? 0) - (b.row ?? 0));
  return { runs, problems };
}

/** Parses the JSON run format `{ "format": "mep-runs/1", "runs": [...] }`; `row` is the run's 1-based position. */
export function parseRunsJson(text: string): ImportResult {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch (error) {
    const place = locateJsonError(text);
    return { runs: [], problems: [{ row: place?.line ?? null, field: "json", message: `Not valid JSON: ${place?.message ?? (error as Error).message}` }] };
  }
  const file = runsFileSchema.safeParse(data);
  if (!file.success) {
    return { runs: [], problems: file.error.issues.map((i) => ({ row: null, field: zodPathToField(i.path), message: i.message })) };
  }
  const runs: Run[] = [];
  const problems: ImportProblem[] = [];
  const seen = new Map<string, number>();
  file.data.runs.forEach((raw, index) => {
    const result = runSchema.safeParse(raw);
    if (!result.success) {
      for (const issue of result.error.issues) problems.push({ row: index + 1, field: zodPathToField(issue.path), message: issue.message });
      return;
    }
    const earlier = seen.get(result.data.id);
    if (earlier !== undefined) {
      problems.push({ row: index + 1, field: "id", message: `Run id ${result.data.id} is already used by run ${earlier}.` });
      return;
    }
    seen.set(result.data.id, index + 1);
    runs.push(result.data);
  });
  return { runs, problems };
}

/** Picks the parser from the file name or content type. */
export function parseRunsFile(text: string, fileName: string): ImportResult {
  return /\.json$/i.test(fileName) || text.trimStart().startsWith("{") ? parseRunsJson(text) : parseRunsCsv(text);
}
