import type { Symbolic, UpperCsc } from "./ldl";

/**
 * Supernodal left-looking LDL^T (our own code: no npm package offers a fast sparse SPD factorisation; mathjs's
 * sparse LU takes ~30 s on the 60 x 60 benchmark grid and does not flag a singular matrix).
 *
 * Method (E. Ng and B. Peyton, "Block sparse Cholesky algorithms on advanced uniprocessor computers", SIAM J.
 * Sci. Comput. 14, 1993; T. A. Davis, "Direct Methods for Sparse Linear Systems", SIAM 2006): consecutive
 * columns of L with nested patterns (a chain in the elimination tree whose counts drop by one) form a
 * supernode stored as one dense column-major block, rows = the supernode's own columns then the rows below.
 * Each supernode gathers the updates of the earlier supernodes that touch it (a linked list per supernode,
 * advanced as in Ng-Peyton), computed as small dense products, then factors its dense diagonal block.
 */
export type SupernodalFactor = {
  n: number;
  superStart: Int32Array; // columns [superStart[s], superStart[s+1])
  rowStart: Int32Array; // rows of supernode s: rows[rowStart[s] .. rowStart[s+1])
  rows: Int32Array;
  valueStart: Float64Array; // offset of the dense block of s (column-major, height = its row count)
  values: Float64Array;
  /** 1 / pivot, 0 where the pivot was too small (that unknown is then held at zero). */
  inversePivot: Float64Array;
  /** Unknowns whose pivot was tiny relative to the scale given: the structure is a mechanism there. */
  tinyPivots: number[];
  nnzL: number;
};

export type SupernodeStructure = Omit<SupernodalFactor, "values" | "inversePivot" | "tinyPivots" | "nnzL"> & { superOf: Int32Array };

/** Finds the supernodes and the row structure of each from the elimination tree and column counts. */
export function supernodes(a: UpperCsc, s: Symbolic): SupernodeStructure {
  const n = a.n;
  const { parent, colPtr: lp } = s;
  const count = (j: number) => lp[j + 1] - lp[j];
  const superOf = new Int32Array(n);
  const starts: number[] = [];
  for (let j = 0; j < n; j++) {
    if (j === 0 || parent[j - 1] !== j || count(j - 1) !== count(j) + 1) starts.push(j);
    superOf[j] = starts.length - 1;
  }
  const ns = starts.length;
  const superStart = Int32Array.from([...starts, n]);
  const rowStart = new Int32Array(ns + 1);
  const valueStart = new Float64Array(ns + 1);
  for (let t = 0; t < ns; t++) {
    const w = superStart[t + 1] - superStart[t];
    const m = w + count(superStart[t + 1] - 1);
    rowStart[t + 1] = rowStart[t] + m;
    valueStart[t + 1] = valueStart[t] + m * w;
  }
  const rows = new Int32Array(rowStart[ns]);
  const fill = new Int32Array(ns);
  for (let t = 0; t < ns; t++) {
    for (let j = superStart[t]; j < superStart[t + 1]; j++) rows[rowStart[t] + fill[t]++] = j;
  }
  // Row k of L holds column i exactly on the tree path from each A(i,k) up towards k; the last column of a
  // supernode sees the rows below the supernode, in ascending k.
  const flag = new Int32Array(n).fill(-1);
  const { colPtr: ap, rowIdx: ai } = a;
  for (let k = 0; k < n; k++) {
    flag[k] = k;
    for (let p = ap[k]; p < ap[k + 1]; p++) {
      for (let i = ai[p]; flag[i] !== k; i = parent[i]) {
        flag[i] = k;
        const t = superOf[i];
        if (i === superStart[t + 1] - 1) rows[rowStart[t] + fill[t]++] = k;
      }
    }
  }
  return { n, superStart, rowStart, rows, valueStart, superOf };
}

/** Lower triangle by columns (the transpose of the upper CSC). */
function lowerColumns(a: UpperCsc) {
  const { n, colPtr, rowIdx, values } = a;
  const start = new Int32Array(n + 1);
  for (let p = 0; p < colPtr[n]; p++) start[rowIdx[p] + 1]++;
  for (let j = 0; j < n; j++) start[j + 1] += start[j];
  const next = start.slice(0, n);
  const rows = new Int32Array(colPtr[n]);
  const vals = new Float64Array(colPtr[n]);
  for (let k = 0; k < n; k++) {
    for (let p = colPtr[k]; p < colPtr[k + 1]; p++) {
      const q = next[rowIdx[p]]++;
      rows[q] = k;
      vals[q] = values[p];
    }
  }
  return { start, rows, vals };
}

/**
 * Numeric factorisation. A pivot d_k <= relTol * scale[k] marks unknown k as free (a mechanism): its column
 * of L is zeroed and 1/d_k set to 0, so the rest is factored as if k were restrained, and k is reported.
 */
export function factorSupernodal(a: UpperCsc, st: SupernodeStructure, scale: Float64Array, relTol: number): SupernodalFactor {
  const { n, superStart, rowStart, rows, valueStart, superOf } = st;
  const ns = superStart.length - 1;
  const values = new Float64Array(valueStart[ns]);
  const pivot = new Float64Array(n); // d_k, 0 where flagged
  const inversePivot = new Float64Array(n);
  const tinyPivots: number[] = [];
  const lower = lowerColumns(a);

  let maxW = 0;
  let maxM = 0;
  for (let t = 0; t < ns; t++) {
    maxW = Math.max(maxW, superStart[t + 1] - superStart[t]);
    maxM = Math.max(maxM, rowStart[t + 1] - rowStart[t]);
  }
  const map = new Int32Array(n);
  const head = new Int32Array(ns).fill(-1);
  const nextLink = new Int32Array(ns);
  const position = new Int32Array(ns); // next row (index into the supernode's rows) still to pass on
  const scaled = new Float64Array(maxW * maxW); // D_d L_d(c, k) for the target columns c
  const update = new Float64Array(maxM * maxW);

  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const l = superStart[s + 1];
    const w = l - f;
    const r0 = rowStart[s];
    const m = rowStart[s + 1] - r0;
    const x0 = valueStart[s];
    for (let t = 0; t < m; t++) map[rows[r0 + t]] = t;
    for (let j = f; j < l; j++) {
      const col = x0 + (j - f) * m;
      for (let p = lower.start[j]; p < lower.start[j + 1]; p++) values[col + map[lower.rows[p]]] += lower.vals[p];
    }

    // Updates from descendant supernodes d with rows in [f, l).
    for (let d = head[s]; d !== -1; ) {
      const following = nextLink[d];
      const dr0 = rowStart[d];
      const md = rowStart[d + 1] - dr0;
      const df = superStart[d];
      const wd = superStart[d + 1] - df;
      const dx0 = valueStart[d];
      const p1 = position[d];
      let p2 = p1;
      while (p2 < md && rows[dr0 + p2] < l) p2++;
      const nc = p2 - p1;
      const height = md - p1;
      for (let k = 0; k < wd; k++) {
        const dk = pivot[df + k];
        const colk = dx0 + k * md;
        for (let c = 0; c < nc; c++) scaled[k * nc + c] = dk * values[colk + p1 + c];
      }
      // update(r, c) = -sum_k L_d(p1 + r, k) * scaled(k, c), lower part r >= c, column-major by c
      update.fill(0, 0, height * nc);
      // Register blocking: two target columns c, c+1 and four columns of L_d per sweep, so each loaded L_d
      // value serves two multiply-adds and each update entry is loaded and stored once per four. Column c+1
      // also gets row c (above its diagonal); the scatter below skips it.
      let c = 0;
      for (; c + 1 < nc; c += 2) {
        const ua = c * height;
        const ub = ua + height;
        let k = 0;
        for (; k + 3 < wd; k += 4) {
          const s0 = k * nc + c;
          const a0 = scaled[s0];
          const b0 = scaled[s0 + 1];
          const a1 = scaled[s0 + nc];
          const b1 = scaled[s0 + nc + 1];
          const a2 = scaled[s0 + 2 * nc];
          const b2 = scaled[s0 + 2 * nc + 1];
          const a3 = scaled[s0 + 3 * nc];
          const b3 = scaled[s0 + 3 * nc + 1];
          const o0 = dx0 + k * md + p1;
          const o1 = o0 + md;
          const o2 = o1 + md;
          const o3 = o2 + md;
          for (let r = c; r < height; r++) {
            const v0 = values[o0 + r];
            const v1 = values[o1 + r];
            const v2 = values[o2 + r];
            const v3 = values[o3 + r];
            update[ua + r] -= v0 * a0 + v1 * a1 + v2 * a2 + v3 * a3;
            update[ub + r] -= v0 * b0 + v1 * b1 + v2 * b2 + v3 * b3;
          }
        }
        for (; k < wd; k++) {
          const ta = scaled[k * nc + c];
          const tb = scaled[k * nc + c + 1];
          const o = dx0 + k * md + p1;
          for (let r = c; r < height; r++) {
            const v = values[o + r];
            update[ua + r] -= v * ta;
            update[ub + r] -= v * tb;
          }
        }
      }
      for (; c < nc; c++) {
        const uc = c * height;
        for (let k = 0; k < wd; k++) {
          const t = scaled[k * nc + c];
          const colk = dx0 + k * md + p1;
          for (let r = c; r < height; r++) update[uc + r] -= values[colk + r] * t;
        }
      }
      for (let c = 0; c < nc; c++) {
        const target = x0 + (rows[dr0 + p1 + c] - f) * m;
        const uc = c * height;
        for (let r = c; r < height; r++) values[target + map[rows[dr0 + p1 + r]]] += update[uc + r];
      }
      position[d] = p2;
      if (p2 < md) {
        const t = superOf[rows[dr0 + p2]];
        nextLink[d] = head[t];
        head[t] = d;
      }
      d = following;
    }

    // Dense LDL^T of the supernode's block, column by column.
    for (let k = 0; k < w; k++) {
      const colk = x0 + k * m;
      let j = 0;
      for (; j + 3 < k; j += 4) {
        const c0 = x0 + j * m;
        const c1 = c0 + m;
        const c2 = c1 + m;
        const c3 = c2 + m;
        const t0 = values[c0 + k] * pivot[f + j];
        const t1 = values[c1 + k] * pivot[f + j + 1];
        const t2 = values[c2 + k] * pivot[f + j + 2];
        const t3 = values[c3 + k] * pivot[f + j + 3];
        for (let r = k; r < m; r++) values[colk + r] -= values[c0 + r] * t0 + values[c1 + r] * t1 + values[c2 + r] * t2 + values[c3 + r] * t3;
      }
      for (; j < k; j++) {
        const colj = x0 + j * m;
        const t = values[colj + k] * pivot[f + j];
        for (let r = k; r < m; r++) values[colk + r] -= values[colj + r] * t;
      }
      const dk = values[colk + k];
      if (dk > relTol * scale[f + k]) {
        pivot[f + k] = dk;
        inversePivot[f + k] = 1 / dk;
        const inv = 1 / dk;
        for (let r = k + 1; r < m; r++) values[colk + r] *= inv;
      } else {
        tinyPivots.push(f + k);
        for (let r = k + 1; r < m; r++) values[colk + r] = 0;
      }
      values[colk + k] = 1;
    }
    position[s] = w;
    if (m > w) {
      const t = superOf[rows[r0 + w]];
      nextLink[s] = head[t];
      head[t] = s;
    }
  }
  let nnzL = 0;
  for (let s = 0; s < ns; s++) {
    const w = superStart[s + 1] - superStart[s];
    const m = rowStart[s + 1] - rowStart[s];
    nnzL += w * m - (w * (w + 1)) / 2;
  }
  return { n, superStart, rowStart, rows, valueStart, values, inversePivot, tinyPivots, nnzL };
}

/** Solves L D L^T x = b in place. */
export function solveSupernodal(fct: SupernodalFactor, x: Float64Array): void {
  const { superStart, rowStart, rows, valueStart, values, inversePivot } = fct;
  const ns = superStart.length - 1;
  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const w = superStart[s + 1] - f;
    const r0 = rowStart[s];
    const m = rowStart[s + 1] - r0;
    for (let k = 0; k < w; k++) {
      const xj = x[f + k];
      if (xj === 0) continue;
      const col = valueStart[s] + k * m;
      for (let r = k + 1; r < m; r++) x[rows[r0 + r]] -= values[col + r] * xj;
    }
  }
  for (let j = 0; j < fct.n; j++) x[j] *= inversePivot[j];
  for (let s = ns - 1; s >= 0; s--) {
    const f = superStart[s];
    const w = superStart[s + 1] - f;
    const r0 = rowStart[s];
    const m = rowStart[s + 1] - r0;
    for (let k = w - 1; k >= 0; k--) {
      const col = valueStart[s] + k * m;
      let xj = x[f + k];
      for (let r = k + 1; r < m; r++) xj -= values[col + r] * x[rows[r0 + r]];
      x[f + k] = xj;
    }
  }
}
