/**
 * Symbolic analysis for a sparse LDL^T factorisation (T. A. Davis, "Direct Methods for Sparse Linear Systems",
 * SIAM 2006, ch. 4): the elimination tree gives each row's pattern of L as a union of tree paths, from which
 * the column counts follow. The numeric factorisation is supernodal.ts.
 *
 * The input is the upper triangle of the (already permuted) matrix in compressed sparse column form.
 */
export type UpperCsc = { n: number; colPtr: Int32Array; rowIdx: Int32Array; values: Float64Array };

export type Symbolic = { parent: Int32Array; colPtr: Int32Array; nnzL: number };

/** Elimination tree and column counts of L for an upper-CSC matrix. */
export function symbolicLdl(a: UpperCsc): Symbolic {
  const { n, colPtr: ap, rowIdx: ai } = a;
  const parent = new Int32Array(n);
  const flag = new Int32Array(n);
  const count = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    parent[k] = -1;
    flag[k] = k;
    for (let p = ap[k]; p < ap[k + 1]; p++) {
      let i = ai[p];
      if (i >= k) continue;
      for (; flag[i] !== k; i = parent[i]) {
        if (parent[i] === -1) parent[i] = k;
        count[i]++;
        flag[i] = k;
      }
    }
  }
  const lp = new Int32Array(n + 1);
  for (let k = 0; k < n; k++) lp[k + 1] = lp[k] + count[k];
  return { parent, colPtr: lp, nnzL: lp[n] };
}
