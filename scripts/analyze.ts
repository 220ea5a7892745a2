/**
 * Command line analysis: `npm run analyze -- model.json`, `npm run analyze -- --csv DIR` or
 * `npm run analyze -- --generate roof.json` (the roof generator's parameters).
 * Prints the analysis result JSON (design.md) to stdout. Exit codes: 0 analysed, 1 usage or read error,
 * 2 invalid model (each problem on its own stderr line), 3 unstable (the result JSON is still printed).
 */
import { readdirSync, readFileSync } from "node:fs";
import { basename, join } from "node:path";
import { parseArgs } from "node:util";
import { analyzeModel, generateRoof, modelFromCsv, roofParamsSchema, validateModel, type ValidationResult } from "@/lib/analysis";
import { wholeRoofCheckMembers } from "@/lib/limits";
import { createReviewContext, idleForAnyLoad, reviewModel, type AnyLoadCertificate, type DesignMethod, type DesignStandard, type ModelReview } from "@/lib/review";

// Further flags (e.g. --review) are added to this table; values arrive typed in `args.values`.
const options = {
  csv: { type: "string", description: "read CSV tables (nodes.csv, members.csv, ...) from this folder" },
  generate: {
    type: "string",
    description: "generate the roof from the roof generator's parameters in this JSON file (spans, module, depth, loads: unbalancedSnow, snowDriftEdge/stepHeight/upperRoofWidth, windZones/windPeakPressure/roofHeight, ...)",
  },
  threshold: { type: "string", description: "report members below this axial force (kN) as low-force" },
  pretty: { type: "boolean", description: "indent the JSON output" },
  review: {
    type: "boolean",
    description: "add under \"review\" the design checks, member verdicts, why-zero explanations, deflections, reaction balance, overall stability and, up to 10,000 members, \"idle for any roof load\"",
  },
  standard: { type: "string", description: "design standard for --review: EN1993-1-1 (default) or AISC360-22" },
  "deflection-limit": { type: "string", description: "serviceability deflection limit for --review: span / VALUE (default 250)" },
  method: { type: "string", description: "AISC360-22 design basis for --review: LRFD (default) or ASD" },
  "any-load": { type: "boolean", description: "whether any load at any top-layer node (x, y, z) can make each member work, under \"review.anyLoad\", at any roof size" },
  "loadable-nodes": { type: "string", description: "with --any-load: comma-separated loadable node ids instead of the top layer" },
  help: { type: "boolean", short: "h", description: "show this help" },
} as const;

const usage = () =>
  [
    "usage: npm run analyze -- [options] [model.json]",
    ...Object.entries(options).map(([name, o]) => `  --${name}${o.type === "string" ? " VALUE" : ""}  ${o.description}`),
  ].join("\n");

class UsageError extends Error {}

function readModel(file: string | undefined, csvDir: string | undefined, generateFrom: string | undefined): ValidationResult {
  if (generateFrom !== undefined) {
    let input: unknown;
    try {
      input = JSON.parse(readFileSync(generateFrom, "utf8"));
    } catch (error) {
      if (error instanceof SyntaxError) return { ok: false, problems: [{ where: generateFrom, message: `not valid JSON: ${error.message}` }] };
      throw error;
    }
    const params = roofParamsSchema.safeParse(input);
    if (!params.success) return { ok: false, problems: params.error.issues.map((i) => ({ where: `${generateFrom}: ${i.path.join(".") || "(parameters)"}`, message: i.message })) };
    return validateModel(generateRoof(params.data));
  }
  if (csvDir !== undefined) {
    const tables: Record<string, string> = {};
    for (const name of readdirSync(csvDir)) if (name.toLowerCase().endsWith(".csv")) tables[basename(name)] = readFileSync(join(csvDir, name), "utf8");
    return modelFromCsv(tables, { name: basename(csvDir) });
  }
  if (file === undefined) throw new UsageError("give a model JSON file or --csv DIR");
  let input: unknown;
  try {
    input = JSON.parse(readFileSync(file, "utf8"));
  } catch (error) {
    if (error instanceof SyntaxError) return { ok: false, problems: [{ where: file, message: `not valid JSON: ${error.message}` }] };
    throw error;
  }
  return validateModel(input);
}

function main(argv: string[]): number {
  let args;
  try {
    args = parseArgs({ args: argv, options, allowPositionals: true, strict: true });
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n${usage()}\n`);
    return 1;
  }
  if (args.values.help) {
    process.stdout.write(`${usage()}\n`);
    return 0;
  }
  const threshold = args.values.threshold === undefined ? undefined : Number(args.values.threshold);
  if (threshold !== undefined && !(threshold >= 0)) {
    process.stderr.write(`--threshold must be a non-negative number of kN (got "${args.values.threshold}")\n`);
    return 1;
  }
  const standards: DesignStandard[] = ["EN1993-1-1", "AISC360-22"];
  const standard = (args.values.standard ?? "EN1993-1-1") as DesignStandard;
  if (!standards.includes(standard)) {
    process.stderr.write(`--standard must be one of ${standards.join(", ")} (got "${args.values.standard}")\n`);
    return 1;
  }
  const method = (args.values.method ?? "LRFD") as DesignMethod;
  if (method !== "LRFD" && method !== "ASD") {
    process.stderr.write(`--method must be LRFD or ASD (got "${args.values.method}")\n`);
    return 1;
  }
  const deflectionLimit = args.values["deflection-limit"] === undefined ? undefined : Number(args.values["deflection-limit"]);
  if (deflectionLimit !== undefined && !(deflectionLimit > 0)) {
    process.stderr.write(`--deflection-limit must be a positive number (got "${args.values["deflection-limit"]}")\n`);
    return 1;
  }
  let checked: ValidationResult;
  try {
    checked = readModel(args.positionals[0], args.values.csv, args.values.generate);
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n${error instanceof UsageError ? `${usage()}\n` : ""}`);
    return 1;
  }
  if (!checked.ok) {
    for (const problem of checked.problems) process.stderr.write(`${problem.where}: ${problem.message}\n`);
    return 2;
  }
  const result = analyzeModel(checked.model, { lowForceThreshold: threshold });
  const loadable = args.values["loadable-nodes"]?.split(",").map((id) => id.trim()).filter(Boolean);
  if (loadable) {
    const known = new Set(checked.model.nodes.map((n) => n.id));
    const unknown = loadable.filter((id) => !known.has(id));
    if (unknown.length > 0 || loadable.length === 0) {
      process.stderr.write(`--loadable-nodes: ${unknown.length > 0 ? `no node ${unknown.map((id) => `"${id}"`).join(", ")} in the model` : "give at least one node id"}\n`);
      return 1;
    }
  }
  let review: (ModelReview & { anyLoad?: AnyLoadCertificate; anyLoadLeftOut?: string }) | undefined;
  if ((args.values.review || args.values["any-load"]) && result.status === "ok") {
    const reviewOptions = { standard, method, deflectionLimit, lowForceThreshold: threshold };
    const context = createReviewContext(checked.model, result, reviewOptions);
    review = reviewModel(checked.model, result, reviewOptions, context);
    // as the stored review: the certificate comes with --review up to the size it takes seconds, at any size when asked
    const members = checked.model.members.length;
    if (args.values["any-load"] || members <= wholeRoofCheckMembers) review = { ...review, anyLoad: idleForAnyLoad(context, loadable ? { nodes: loadable } : {}) };
    else review = { ...review, anyLoadLeftOut: `"Idle for any roof load" comes with --review for roofs of up to ${wholeRoofCheckMembers} members; this one has ${members}: add --any-load to run it.` };
  }
  process.stdout.write(`${JSON.stringify(review ? { ...result, review } : result, null, args.values.pretty ? 2 : undefined)}\n`);
  if (result.status === "unstable") {
    for (const line of result.info.instabilityText ?? []) process.stderr.write(`${line}\n`);
    return 3;
  }
  return 0;
}

process.exitCode = main(process.argv.slice(2));
