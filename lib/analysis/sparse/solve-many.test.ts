import { describe, expect, it } from "vitest";
import { generateRoof } from "../generator";
import { PIVOT_TOLERANCE } from "../prepare";
import { analyzePattern } from "../symbolic";
import { buildTopology } from "../topology";
import { solveSupernodalMany } from "./solve-many";
import { factorSupernodal, solveSupernodal } from "./supernodal";

describe("blocked multi-right-hand-side solve", () => {
  // Supernodes of every width mod 4 and right-hand-side counts on both sides of the four-column blocks.
  const topology = buildTopology(generateRoof({ spanX: 30, spanY: 24, module: 3, depth: 2 }));
  const { symbolic, assembled } = analyzePattern(topology);
  const factor = factorSupernodal(assembled.matrix, symbolic.structure, assembled.pivotScale, PIVOT_TOLERANCE);
  const n = factor.n;
  const { colPtr, rowIdx, values } = assembled.matrix;

  /** K x for the symmetric K_ff stored as its upper triangle. */
  const multiply = (x: Float64Array) => {
    const y = new Float64Array(n);
    for (let j = 0; j < n; j++) {
      for (let p = colPtr[j]; p < colPtr[j + 1]; p++) {
        const i = rowIdx[p];
        y[i] += values[p] * x[j];
        if (i !== j) y[j] += values[p] * x[i];
      }
    }
    return y;
  };

  it("has supernodes of every width modulo 4", () => {
    const widths = new Set<number>();
    for (let s = 0; s + 1 < factor.superStart.length; s++) widths.add((factor.superStart[s + 1] - factor.superStart[s]) % 4);
    expect([...widths].sort()).toEqual([0, 1, 2, 3]);
  });

  for (const count of [1, 3, 4, 5, 8, 11]) {
    it(`matches the one-vector solve and leaves K x - b at rounding, ${count} right-hand side(s)`, () => {
      const b = new Float64Array(n * count);
      for (let c = 0; c < count; c++) {
        // a dense column, a unit load (the certificate's case: the forward pass skips untouched supernodes)
        if (c % 2 === 0) for (let q = 0; q < n; q++) b[q * count + c] = Math.sin(0.37 * q + c);
        else b[((c * 7919) % n) * count + c] = 1;
      }
      const x = b.slice();
      solveSupernodalMany(factor, x, count);
      for (let c = 0; c < count; c++) {
        const column = Float64Array.from({ length: n }, (_, q) => b[q * count + c]);
        const one = column.slice();
        solveSupernodal(factor, one);
        const scale = Math.max(...one.map(Math.abs));
        one.forEach((v, q) => expect(Math.abs(x[q * count + c] - v)).toBeLessThanOrEqual(1e-12 * scale));
        const got = Float64Array.from({ length: n }, (_, q) => x[q * count + c]);
        const residual = multiply(got).map((v, q) => v - column[q]);
        const bScale = Math.max(...column.map(Math.abs));
        expect(Math.max(...residual.map(Math.abs))).toBeLessThanOrEqual(1e-9 * bScale);
      }
    });
  }
});
