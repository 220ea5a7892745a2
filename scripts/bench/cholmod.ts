/**
 * The CHOLMOD comparison for `bench:solver`: builds cholmod-timer.c when libsuitesparse-dev is installed
 * (never needed by CI or tests) and runs it on the same K_ff the solver factors, written as Matrix Market.
 */
import { execFileSync } from "node:child_process";
import { existsSync, mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { UpperCsc } from "@/lib/analysis/sparse/ldl";

export type CholmodFigures = { nnzL: number; ordering: string; analyze: number; factor: number; solve: number };

const header = "/usr/include/suitesparse/cholmod.h";

/** Compiles the timer once; undefined when CHOLMOD's headers or a C compiler are missing. */
export function buildCholmodTimer(): ((matrix: UpperCsc, rightHandSides: number, runs: number) => CholmodFigures) | undefined {
  if (!existsSync(header)) return undefined;
  const dir = mkdtempSync(join(tmpdir(), "cholmod-timer-"));
  const binary = join(dir, "cholmod-timer");
  try {
    execFileSync("cc", ["-O2", "-I/usr/include/suitesparse", "-o", binary, join(import.meta.dirname, "cholmod-timer.c"), "-lcholmod", "-lsuitesparseconfig", "-lm"], { stdio: "pipe" });
  } catch {
    return undefined;
  }
  // Best of `runs` runs (the smallest analyse + factor + solve), as our own steps are timed best of --repeat.
  return (matrix, rightHandSides, runs) => {
    const file = join(dir, "k.mtx");
    writeFileSync(file, matrixMarket(matrix));
    let best: CholmodFigures | undefined;
    for (let run = 0; run < runs; run++) {
      const figures = JSON.parse(execFileSync(binary, [file, String(rightHandSides)], { encoding: "utf8" })) as CholmodFigures;
      if (!best || figures.analyze + figures.factor + figures.solve < best.analyze + best.factor + best.solve) best = figures;
    }
    return best!;
  };
}

/** The lower triangle (the transpose of our upper CSC) as a symmetric Matrix Market coordinate file. */
function matrixMarket({ n, colPtr, rowIdx, values }: UpperCsc): string {
  const lines = ["%%MatrixMarket matrix coordinate real symmetric", `${n} ${n} ${colPtr[n]}`];
  for (let j = 0; j < n; j++) for (let p = colPtr[j]; p < colPtr[j + 1]; p++) lines.push(`${j + 1} ${rowIdx[p] + 1} ${values[p].toExponential(17)}`);
  return `${lines.join("\n")}\n`;
}
