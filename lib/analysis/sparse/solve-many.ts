import type { SupernodalFactor } from "./supernodal";

/**
 * Solves L D L^T X = B in place for several right-hand sides stored interleaved (x[j * count + c] is row j of
 * column c). Our own code, like the factor it uses (supernodal.ts).
 *
 * Dense kernel: X is worked on in register blocks of four rows by four columns, summed over the columns of L
 * (forward: rows of L times the supernode's own rows of X) or the rows of L (backward: columns of L times the
 * rows of X they touch), so that each value loaded from L or X serves four multiply-adds and each entry of X
 * is loaded and stored once per block rather than once per column of L (the blocking of a BLAS-3 triangular
 * solve, e.g. K. Goto and R. van de Geijn, "High-performance implementation of the level-3 BLAS", ACM TOMS
 * 35(1), 2008, scaled down to what V8 keeps in registers). Columns beyond a multiple of four take a plain
 * column-by-column path. A supernode whose own rows of X are all zero in the forward pass is skipped (unit
 * loads: the forward solve then follows only the elimination-tree paths of the loaded equations).
 */
export function solveSupernodalMany(fct: SupernodalFactor, x: Float64Array, count: number): void {
  const { superStart, inversePivot } = fct;
  const ns = superStart.length - 1;
  const blocked = count - (count % 4);
  for (let s = 0; s < ns; s++) {
    const own = superStart[s] * count;
    const end = superStart[s + 1] * count;
    let zero = true;
    for (let q = own; q < end; q++) {
      if (x[q] !== 0) {
        zero = false;
        break;
      }
    }
    if (zero) continue;
    if (blocked > 0) forwardBlocks(fct, s, x, count, blocked);
    for (let c = blocked; c < count; c++) forwardColumn(fct, s, x, count, c);
  }
  for (let j = 0; j < fct.n; j++) {
    const d = inversePivot[j];
    for (let c = 0; c < count; c++) x[j * count + c] *= d;
  }
  for (let s = ns - 1; s >= 0; s--) {
    if (blocked > 0) backwardBlocks(fct, s, x, count, blocked);
    for (let c = blocked; c < count; c++) backwardColumn(fct, s, x, count, c);
  }
}

/**
 * Forward step of supernode s for columns 0 .. blocked - 1: row r of the supernode (own rows first, then the
 * rows below) loses sum_k L(r, k) X(own k) over the own columns k before r. Four rows of L stay in cache while
 * every block of four columns of X passes them.
 */
function forwardBlocks(fct: SupernodalFactor, s: number, x: Float64Array, count: number, blocked: number): void {
  const { superStart, rowStart, rows, valueStart, values } = fct;
  const w = superStart[s + 1] - superStart[s];
  const r0 = rowStart[s];
  const m = rowStart[s + 1] - r0;
  const x0 = valueStart[s];
  const base = superStart[s] * count; // X(own k, c) = x[base + k * count + c]
  let r = 0;
  // Own rows, four at a time: the sum over the columns before the block, then the block's own triangle.
  for (; r + 4 <= w; r += 4) for (let c = 0; c < blocked; c += 4) {
    const own = base + c;
    const t0 = own + r * count;
    const t1 = t0 + count;
    const t2 = t1 + count;
    const t3 = t2 + count;
    let a00 = x[t0], a01 = x[t0 + 1], a02 = x[t0 + 2], a03 = x[t0 + 3];
    let a10 = x[t1], a11 = x[t1 + 1], a12 = x[t1 + 2], a13 = x[t1 + 3];
    let a20 = x[t2], a21 = x[t2 + 1], a22 = x[t2 + 2], a23 = x[t2 + 3];
    let a30 = x[t3], a31 = x[t3 + 1], a32 = x[t3 + 2], a33 = x[t3 + 3];
    for (let k = 0; k < r; k++) {
      const o = x0 + k * m + r;
      const l0 = values[o], l1 = values[o + 1], l2 = values[o + 2], l3 = values[o + 3];
      const b = own + k * count;
      const y0 = x[b], y1 = x[b + 1], y2 = x[b + 2], y3 = x[b + 3];
      a00 -= l0 * y0; a01 -= l0 * y1; a02 -= l0 * y2; a03 -= l0 * y3;
      a10 -= l1 * y0; a11 -= l1 * y1; a12 -= l1 * y2; a13 -= l1 * y3;
      a20 -= l2 * y0; a21 -= l2 * y1; a22 -= l2 * y2; a23 -= l2 * y3;
      a30 -= l3 * y0; a31 -= l3 * y1; a32 -= l3 * y2; a33 -= l3 * y3;
    }
    const d = x0 + r * m + r; // L(r, r) of this block; L(r + i, r + j) = values[d + j * m + i]
    let l = values[d + 1];
    a10 -= l * a00; a11 -= l * a01; a12 -= l * a02; a13 -= l * a03;
    l = values[d + 2];
    a20 -= l * a00; a21 -= l * a01; a22 -= l * a02; a23 -= l * a03;
    l = values[d + m + 2];
    a20 -= l * a10; a21 -= l * a11; a22 -= l * a12; a23 -= l * a13;
    l = values[d + 3];
    a30 -= l * a00; a31 -= l * a01; a32 -= l * a02; a33 -= l * a03;
    l = values[d + m + 3];
    a30 -= l * a10; a31 -= l * a11; a32 -= l * a12; a33 -= l * a13;
    l = values[d + 2 * m + 3];
    a30 -= l * a20; a31 -= l * a21; a32 -= l * a22; a33 -= l * a23;
    x[t0] = a00; x[t0 + 1] = a01; x[t0 + 2] = a02; x[t0 + 3] = a03;
    x[t1] = a10; x[t1 + 1] = a11; x[t1 + 2] = a12; x[t1 + 3] = a13;
    x[t2] = a20; x[t2 + 1] = a21; x[t2 + 2] = a22; x[t2 + 3] = a23;
    x[t3] = a30; x[t3 + 1] = a31; x[t3 + 2] = a32; x[t3 + 3] = a33;
  }
  for (; r < w; r++) for (let c = 0; c < blocked; c += 4) forwardRow(values, x0 + r, m, r, base + c, base + c + r * count, x, count);
  // Rows below the supernode, four at a time, over all of its columns.
  for (; r + 4 <= m; r += 4) for (let c = 0; c < blocked; c += 4) {
    const own = base + c;
    const t0 = rows[r0 + r] * count + c;
    const t1 = rows[r0 + r + 1] * count + c;
    const t2 = rows[r0 + r + 2] * count + c;
    const t3 = rows[r0 + r + 3] * count + c;
    let a00 = x[t0], a01 = x[t0 + 1], a02 = x[t0 + 2], a03 = x[t0 + 3];
    let a10 = x[t1], a11 = x[t1 + 1], a12 = x[t1 + 2], a13 = x[t1 + 3];
    let a20 = x[t2], a21 = x[t2 + 1], a22 = x[t2 + 2], a23 = x[t2 + 3];
    let a30 = x[t3], a31 = x[t3 + 1], a32 = x[t3 + 2], a33 = x[t3 + 3];
    for (let k = 0; k < w; k++) {
      const o = x0 + k * m + r;
      const l0 = values[o], l1 = values[o + 1], l2 = values[o + 2], l3 = values[o + 3];
      const b = own + k * count;
      const y0 = x[b], y1 = x[b + 1], y2 = x[b + 2], y3 = x[b + 3];
      a00 -= l0 * y0; a01 -= l0 * y1; a02 -= l0 * y2; a03 -= l0 * y3;
      a10 -= l1 * y0; a11 -= l1 * y1; a12 -= l1 * y2; a13 -= l1 * y3;
      a20 -= l2 * y0; a21 -= l2 * y1; a22 -= l2 * y2; a23 -= l2 * y3;
      a30 -= l3 * y0; a31 -= l3 * y1; a32 -= l3 * y2; a33 -= l3 * y3;
    }
    x[t0] = a00; x[t0 + 1] = a01; x[t0 + 2] = a02; x[t0 + 3] = a03;
    x[t1] = a10; x[t1 + 1] = a11; x[t1 + 2] = a12; x[t1 + 3] = a13;
    x[t2] = a20; x[t2 + 1] = a21; x[t2 + 2] = a22; x[t2 + 3] = a23;
    x[t3] = a30; x[t3 + 1] = a31; x[t3 + 2] = a32; x[t3 + 3] = a33;
  }
  for (; r < m; r++) for (let c = 0; c < blocked; c += 4) forwardRow(values, x0 + r, m, w, base + c, rows[r0 + r] * count + c, x, count);
}

/** X(target, c .. c+3) -= sum over k < kEnd of L(r, k) X(own k, c .. c+3); L(r, k) = values[at + k * m]. */
function forwardRow(values: Float64Array, at: number, m: number, kEnd: number, own: number, target: number, x: Float64Array, count: number): void {
  let a0 = x[target], a1 = x[target + 1], a2 = x[target + 2], a3 = x[target + 3];
  for (let k = 0; k < kEnd; k++) {
    const l = values[at + k * m];
    const b = own + k * count;
    a0 -= l * x[b]; a1 -= l * x[b + 1]; a2 -= l * x[b + 2]; a3 -= l * x[b + 3];
  }
  x[target] = a0; x[target + 1] = a1; x[target + 2] = a2; x[target + 3] = a3;
}

/**
 * Backward step of supernode s for columns 0 .. blocked - 1: own row k loses sum_r L(r, k) X(row r) over the
 * rows after k (own rows already final, then the rows below), from the last own row to the first. Four
 * columns of L stay in cache while every block of four columns of X passes them.
 */
function backwardBlocks(fct: SupernodalFactor, s: number, x: Float64Array, count: number, blocked: number): void {
  const { superStart, rowStart, rows, valueStart, values } = fct;
  const w = superStart[s + 1] - superStart[s];
  const r0 = rowStart[s];
  const m = rowStart[s + 1] - r0;
  const x0 = valueStart[s];
  const base = superStart[s] * count;
  let k = w;
  // Own rows four at a time from the last: rows k - 4 .. k - 1, summed over the rows from k on.
  for (; k >= 4; k -= 4) for (let c = 0; c < blocked; c += 4) {
    const own = base + c;
    const kb = k - 4;
    const t0 = own + kb * count;
    const t1 = t0 + count;
    const t2 = t1 + count;
    const t3 = t2 + count;
    let a00 = x[t0], a01 = x[t0 + 1], a02 = x[t0 + 2], a03 = x[t0 + 3];
    let a10 = x[t1], a11 = x[t1 + 1], a12 = x[t1 + 2], a13 = x[t1 + 3];
    let a20 = x[t2], a21 = x[t2 + 1], a22 = x[t2 + 2], a23 = x[t2 + 3];
    let a30 = x[t3], a31 = x[t3 + 1], a32 = x[t3 + 2], a33 = x[t3 + 3];
    const o0 = x0 + kb * m;
    const o1 = o0 + m;
    const o2 = o1 + m;
    const o3 = o2 + m;
    for (let r = k; r < m; r++) {
      const l0 = values[o0 + r], l1 = values[o1 + r], l2 = values[o2 + r], l3 = values[o3 + r];
      const b = rows[r0 + r] * count + c;
      const y0 = x[b], y1 = x[b + 1], y2 = x[b + 2], y3 = x[b + 3];
      a00 -= l0 * y0; a01 -= l0 * y1; a02 -= l0 * y2; a03 -= l0 * y3;
      a10 -= l1 * y0; a11 -= l1 * y1; a12 -= l1 * y2; a13 -= l1 * y3;
      a20 -= l2 * y0; a21 -= l2 * y1; a22 -= l2 * y2; a23 -= l2 * y3;
      a30 -= l3 * y0; a31 -= l3 * y1; a32 -= l3 * y2; a33 -= l3 * y3;
    }
    // The block's own triangle, last row first: L(kb + i, kb + j) = values[o_j + kb + i].
    let l = values[o2 + kb + 3];
    a20 -= l * a30; a21 -= l * a31; a22 -= l * a32; a23 -= l * a33;
    l = values[o1 + kb + 3];
    a10 -= l * a30; a11 -= l * a31; a12 -= l * a32; a13 -= l * a33;
    l = values[o1 + kb + 2];
    a10 -= l * a20; a11 -= l * a21; a12 -= l * a22; a13 -= l * a23;
    l = values[o0 + kb + 3];
    a00 -= l * a30; a01 -= l * a31; a02 -= l * a32; a03 -= l * a33;
    l = values[o0 + kb + 2];
    a00 -= l * a20; a01 -= l * a21; a02 -= l * a22; a03 -= l * a23;
    l = values[o0 + kb + 1];
    a00 -= l * a10; a01 -= l * a11; a02 -= l * a12; a03 -= l * a13;
    x[t0] = a00; x[t0 + 1] = a01; x[t0 + 2] = a02; x[t0 + 3] = a03;
    x[t1] = a10; x[t1 + 1] = a11; x[t1 + 2] = a12; x[t1 + 3] = a13;
    x[t2] = a20; x[t2 + 1] = a21; x[t2 + 2] = a22; x[t2 + 3] = a23;
    x[t3] = a30; x[t3 + 1] = a31; x[t3 + 2] = a32; x[t3 + 3] = a33;
  }
  // The first (w mod 4) own rows, one at a time, last first.
  for (k--; k >= 0; k--) for (let c = 0; c < blocked; c += 4) {
    const t = base + c + k * count;
    const o = x0 + k * m;
    let a0 = x[t], a1 = x[t + 1], a2 = x[t + 2], a3 = x[t + 3];
    for (let r = k + 1; r < m; r++) {
      const l = values[o + r];
      const b = rows[r0 + r] * count + c;
      a0 -= l * x[b]; a1 -= l * x[b + 1]; a2 -= l * x[b + 2]; a3 -= l * x[b + 3];
    }
    x[t] = a0; x[t + 1] = a1; x[t + 2] = a2; x[t + 3] = a3;
  }
}

/** Forward step of supernode s for the single column c. */
function forwardColumn(fct: SupernodalFactor, s: number, x: Float64Array, count: number, c: number): void {
  const { superStart, rowStart, rows, valueStart, values } = fct;
  const f = superStart[s];
  const w = superStart[s + 1] - f;
  const r0 = rowStart[s];
  const m = rowStart[s + 1] - r0;
  for (let k = 0; k < w; k++) {
    const xk = x[(f + k) * count + c];
    if (xk === 0) continue;
    const col = valueStart[s] + k * m;
    for (let r = k + 1; r < m; r++) x[rows[r0 + r] * count + c] -= values[col + r] * xk;
  }
}

/** Backward step of supernode s for the single column c. */
function backwardColumn(fct: SupernodalFactor, s: number, x: Float64Array, count: number, c: number): void {
  const { superStart, rowStart, rows, valueStart, values } = fct;
  const f = superStart[s];
  const w = superStart[s + 1] - f;
  const r0 = rowStart[s];
  const m = rowStart[s + 1] - r0;
  for (let k = w - 1; k >= 0; k--) {
    const col = valueStart[s] + k * m;
    let xk = x[(f + k) * count + c];
    for (let r = k + 1; r < m; r++) xk -= values[col + r] * x[rows[r0 + r] * count + c];
    x[(f + k) * count + c] = xk;
  }
}
