/**
 * IFC on the command line: `npm run -s ifc -- runs FILE.ifc` prints the duct, pipe and cable-tray runs in our
 * mep-runs/1 format; `npm run -s ifc -- model FILE.ifc` prints the roof as a truss-model/1 model. Exit codes: 0 read
 * (notes such as skipped fittings on stderr), 1 usage or read error, 2 problems (each on its own stderr line).
 */
import { readFileSync } from "node:fs";
import { readIfcRoof, readIfcRuns } from "@/lib/ifc";

const usage = "usage: npm run -s ifc -- runs FILE.ifc | model FILE.ifc";

async function main([command, file, ...rest]: string[]): Promise<number> {
  if ((command !== "runs" && command !== "model") || file === undefined || rest.length > 0) {
    process.stderr.write(`${usage}\n`);
    return 1;
  }
  let bytes: Uint8Array;
  try {
    bytes = new Uint8Array(readFileSync(file));
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n`);
    return 1;
  }
  const result = command === "runs" ? await readIfcRuns(bytes) : await readIfcRoof(bytes);
  if ("message" in result) {
    process.stderr.write(`${result.where}: ${result.message}\n`);
    return 2;
  }
  for (const problem of result.problems) process.stderr.write(`${problem.where}: ${problem.message}\n`);
  if (result.problems.length > 0) return 2;
  if ("runs" in result) {
    if (result.skipped.fittings > 0) process.stderr.write(`note: ${result.skipped.fittings} fittings skipped (runs are joined across them)\n`);
    process.stdout.write(`${JSON.stringify({ format: "mep-runs/1", runs: result.runs }, null, 2)}\n`);
    return 0;
  }
  for (const note of result.notes) process.stderr.write(`note: ${note}\n`);
  process.stdout.write(`${JSON.stringify(result.model, null, 2)}\n`);
  return 0;
}

process.exitCode = await main(process.argv.slice(2));
