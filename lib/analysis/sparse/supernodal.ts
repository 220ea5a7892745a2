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

/**
 * Puts A's entries into the supernodal blocks: A(i, k) (upper CSC, i <= k) is L's column i, row k, found in
 * the rows of i's supernode by binary search past its own columns. Done in place, so that no transposed copy
 * of K_ff is made (that copy was garbage of the size of K after every factorisation).
 */
function scatterMatrix(a: UpperCsc, st: SupernodeStructure, values: Float64Array): void {
  const { superStart, rowStart, rows, valueStart, superOf } = st;
  const { n, colPtr, rowIdx } = a;
  for (let k = 0; k < n; k++) {
    for (let p = colPtr[k]; p < colPtr[k + 1]; p++) {
      const i = rowIdx[p];
      const t = superOf[i];
      const f = superStart[t];
      const end = superStart[t + 1];
      const r0 = rowStart[t];
      const m = rowStart[t + 1] - r0;
      let position = k - f;
      if (k >= end) {
        let low = r0 + end - f;
        let high = r0 + m;
        while (low < high) {
          const mid = (low + high) >>> 1;
          if (rows[mid] < k) low = mid + 1;
          else high = mid;
        }
        position = low - r0;
      }
      values[valueStart[t] + (i - f) * m + position] += a.values[p];
    }
  }
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
  scatterMatrix(a, st, values);

  let maxW = 0;
  for (let t = 0; t < ns; t++) {
    maxW = Math.max(maxW, superStart[t + 1] - superStart[t]);
  }
  const map = new Int32Array(n);
  const head = new Int32Array(ns).fill(-1);
  const nextLink = new Int32Array(ns);
  const position = new Int32Array(ns); // next row (index into the supernode's rows) still to pass on
  const scaled = new Float64Array(maxW * maxW); // D_d L_d(c, k) for the target columns c

  for (let s = 0; s < ns; s++) {
    const f = superStart[s];
    const l = superStart[s + 1];
    const w = l - f;
    const r0 = rowStart[s];
    const m = rowStart[s + 1] - r0;
    const x0 = valueStart[s];
    for (let t = 0; t < m; t++) map[rows[r0 + t]] = t;

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
      updateFromDescendant(values, rows, map, dx0, dr0, md, wd, p1, nc, height, scaled, x0, m, f);
      position[d] = p2;
      if (p2 < md) {
        const t = superOf[rows[dr0 + p2]];
        nextLink[d] = head[t];
        head[t] = d;
      }
      d = following;
    }

    // Dense LDL^T of the supernode's block, four columns at a time: the columns before the block update it
    // through the same register-blocked kernel as a descendant (the supernode's map is already set), then
    // the block's own columns are factored one by one.
    for (let kb = 0; kb < w; kb += 4) {
      const bw = Math.min(4, w - kb);
      if (kb > 0) {
        for (let j = 0; j < kb; j++) {
          const dj = pivot[f + j];
          const colj = x0 + j * m + kb;
          for (let i = 0; i < bw; i++) scaled[j * bw + i] = dj * values[colj + i];
        }
        updateFromDescendant(values, rows, map, x0, r0, m, kb, kb, bw, m - kb, scaled, x0, m, f);
      }
      for (let k = kb; k < kb + bw; k++) factorColumn(values, x0, m, f, kb, k, pivot, inversePivot, tinyPivots, relTol, scale);
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

/**
 * Finishes column k of a supernode's block (columns before kb already applied): subtracts the block's
 * columns kb .. k-1, then divides by the pivot, or flags it as tiny and zeroes the column.
 */
function factorColumn(
  values: Float64Array,
  x0: number,
  m: number,
  f: number,
  kb: number,
  k: number,
  pivot: Float64Array,
  inversePivot: Float64Array,
  tinyPivots: number[],
  relTol: number,
  scale: Float64Array,
): void {
  const colk = x0 + k * m;
  for (let j = kb; j < k; j++) {
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

/**
 * Subtracts descendant d's contribution L_d(rows p1.., k) D_d L_d(rows p1 .. p1+nc, k)^T, summed over d's
 * columns k, from the target supernode (block at x0, height m, first column f), lower part only. Register
 * blocks of four rows by four target columns summed over k, added straight into the target through `map`
 * (row -> position in the target): each loaded value serves four multiply-adds and no intermediate update
 * block is written and read back.
 */
function updateFromDescendant(
  values: Float64Array,
  rows: Int32Array,
  map: Int32Array,
  dx0: number,
  dr0: number,
  md: number,
  wd: number,
  p1: number,
  nc: number,
  height: number,
  scaled: Float64Array,
  x0: number,
  m: number,
  f: number,
): void {
  const lo = dx0 + p1; // L_d(p1 + r, k) = values[lo + k * md + r]
  const rowAt = dr0 + p1;
  let c = 0;
  for (; c + 4 <= nc; c += 4) {
    const tc0 = x0 + (rows[rowAt + c] - f) * m;
    const tc1 = x0 + (rows[rowAt + c + 1] - f) * m;
    const tc2 = x0 + (rows[rowAt + c + 2] - f) * m;
    const tc3 = x0 + (rows[rowAt + c + 3] - f) * m;
    let r = c;
    for (; r + 4 <= height; r += 4) {
      let a00 = 0, a01 = 0, a02 = 0, a03 = 0;
      let a10 = 0, a11 = 0, a12 = 0, a13 = 0;
      let a20 = 0, a21 = 0, a22 = 0, a23 = 0;
      let a30 = 0, a31 = 0, a32 = 0, a33 = 0;
      for (let k = 0; k < wd; k++) {
        const o = lo + k * md + r;
        const l0 = values[o], l1 = values[o + 1], l2 = values[o + 2], l3 = values[o + 3];
        const q = k * nc + c;
        const s0 = scaled[q], s1 = scaled[q + 1], s2 = scaled[q + 2], s3 = scaled[q + 3];
        a00 += l0 * s0; a01 += l0 * s1; a02 += l0 * s2; a03 += l0 * s3;
        a10 += l1 * s0; a11 += l1 * s1; a12 += l1 * s2; a13 += l1 * s3;
        a20 += l2 * s0; a21 += l2 * s1; a22 += l2 * s2; a23 += l2 * s3;
        a30 += l3 * s0; a31 += l3 * s1; a32 += l3 * s2; a33 += l3 * s3;
      }
      const m0 = map[rows[rowAt + r]], m1 = map[rows[rowAt + r + 1]], m2 = map[rows[rowAt + r + 2]], m3 = map[rows[rowAt + r + 3]];
      // a_ij: row r + i, target column c + j; on the diagonal block only i >= j lies in the lower part.
      values[tc0 + m0] -= a00; values[tc0 + m1] -= a10; values[tc0 + m2] -= a20; values[tc0 + m3] -= a30;
      values[tc1 + m1] -= a11; values[tc1 + m2] -= a21; values[tc1 + m3] -= a31;
      values[tc2 + m2] -= a22; values[tc2 + m3] -= a32;
      values[tc3 + m3] -= a33;
      if (r === c) continue;
      values[tc1 + m0] -= a01;
      values[tc2 + m0] -= a02; values[tc2 + m1] -= a12;
      values[tc3 + m0] -= a03; values[tc3 + m1] -= a13; values[tc3 + m2] -= a23;
    }
    // Rows left over (fewer than four; below the diagonal block, since height >= nc >= c + 4).
    for (; r < height; r++) {
      let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
      for (let k = 0; k < wd; k++) {
        const l = values[lo + k * md + r];
        const q = k * nc + c;
        a0 += l * scaled[q]; a1 += l * scaled[q + 1]; a2 += l * scaled[q + 2]; a3 += l * scaled[q + 3];
      }
      const t = map[rows[rowAt + r]];
      values[tc0 + t] -= a0; values[tc1 + t] -= a1; values[tc2 + t] -= a2; values[tc3 + t] -= a3;
    }
  }
  // Target columns left over (fewer than four), one at a time, four rows per sweep.
  for (; c < nc; c++) {
    const tc = x0 + (rows[rowAt + c] - f) * m;
    let r = c;
    for (; r + 4 <= height; r += 4) {
      let a0 = 0, a1 = 0, a2 = 0, a3 = 0;
      for (let k = 0; k < wd; k++) {
        const o = lo + k * md + r;
        const t = scaled[k * nc + c];
        a0 += values[o] * t; a1 += values[o + 1] * t; a2 += values[o + 2] * t; a3 += values[o + 3] * t;
      }
      values[tc + map[rows[rowAt + r]]] -= a0;
      values[tc + map[rows[rowAt + r + 1]]] -= a1;
      values[tc + map[rows[rowAt + r + 2]]] -= a2;
      values[tc + map[rows[rowAt + r + 3]]] -= a3;
    }
    for (; r < height; r++) {
      let a = 0;
      for (let k = 0; k < wd; k++) a += values[lo + k * md + r] * scaled[k * nc + c];
      values[tc + map[rows[rowAt + r]]] -= a;
    }
  }
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
