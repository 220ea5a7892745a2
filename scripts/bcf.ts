/**
 * BCF on the command line: `npm run -s bcf -- inspect FILE.bcf` prints
 * `{ "version", "topics": [{ "guid", "title", "status", "type", "comments", "viewpoints" }] }`. Exit codes: 0 read,
 * 1 usage or read error, 2 problems in the archive (each on its own stderr line).
 */
import { readFileSync } from "node:fs";
import { inspectBcf, readBcf } from "@/lib/bcf";

function main([command, file, ...rest]: string[]): number {
  if (command !== "inspect" || file === undefined || rest.length > 0) {
    process.stderr.write("usage: npm run -s bcf -- inspect FILE.bcf\n");
    return 1;
  }
  let bytes: Uint8Array;
  try {
    bytes = new Uint8Array(readFileSync(file));
  } catch (error) {
    process.stderr.write(`${(error as Error).message}\n`);
    return 1;
  }
  const { file: bcf, problems } = readBcf(bytes);
  for (const problem of problems) process.stderr.write(`${problem.where}: ${problem.message}\n`);
  if (problems.length > 0 || !bcf) return 2;
  process.stdout.write(`${JSON.stringify(inspectBcf(bcf), null, 2)}\n`);
  return 0;
}

process.exitCode = main(process.argv.slice(2));
