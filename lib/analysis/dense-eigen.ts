// Small dense symmetric eigenproblems (the Rayleigh–Ritz step of the buckling iteration, at most ~16 × 16).
// Our own on purpose: the general-purpose libraries that do this (mathjs) weigh hundreds of kB in the browser
// bundle for a 16 × 16 problem; the tests check these routines against mathjs on the same matrices.

/** Cyclic Jacobi rotations: eigenvalues and orthonormal eigenvectors (column k of `vectors`, row-major n × n). */
export function symmetricEigen(matrix: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const a = Float64Array.from(matrix);
  const v = new Float64Array(n * n);
  for (let i = 0; i < n; i++) v[i * n + i] = 1;
  for (let sweep = 0; sweep < 100; sweep++) {
    let off = 0;
    let scale = 0;
    for (let i = 0; i < n; i++) {
      scale += a[i * n + i] * a[i * n + i];
      for (let j = i + 1; j < n; j++) off += a[i * n + j] * a[i * n + j];
    }
    if (off <= 1e-30 * scale || off === 0) break;
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = a[p * n + q];
        if (apq === 0) continue;
        const theta = (a[q * n + q] - a[p * n + p]) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = a[k * n + p];
          const akq = a[k * n + q];
          a[k * n + p] = c * akp - s * akq;
          a[k * n + q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = a[p * n + k];
          const aqk = a[q * n + k];
          a[p * n + k] = c * apk - s * aqk;
          a[q * n + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = v[k * n + p];
          const vkq = v[k * n + q];
          v[k * n + p] = c * vkp - s * vkq;
          v[k * n + q] = s * vkp + c * vkq;
        }
      }
    }
  }
  const values = new Float64Array(n);
  for (let i = 0; i < n; i++) values[i] = a[i * n + i];
  return { values, vectors: v };
}

/**
 * The generalized problem A q = μ B q with A symmetric and B symmetric positive definite (row-major n × n):
 * B = L Lᵀ, C = L⁻¹ A L⁻ᵀ, C y = μ y, q = L⁻ᵀ y, so the q are B-orthonormal. Throws when B is not positive definite.
 */
export function generalizedSymmetricEigen(A: Float64Array, B: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const L = new Float64Array(n * n);
  for (let j = 0; j < n; j++) {
    let d = B[j * n + j];
    for (let k = 0; k < j; k++) d -= L[j * n + k] * L[j * n + k];
    if (!(d > 0)) throw new Error("generalizedSymmetricEigen: B is not positive definite");
    const ljj = Math.sqrt(d);
    L[j * n + j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let s = B[i * n + j];
      for (let k = 0; k < j; k++) s -= L[i * n + k] * L[j * n + k];
      L[i * n + j] = s / ljj;
    }
  }
  // W = L⁻¹ A (forward substitution per column), then C = L⁻¹ Wᵀ (A symmetric, so C = L⁻¹ A L⁻ᵀ)
  const forward = (M: Float64Array) => {
    const out = new Float64Array(n * n);
    for (let col = 0; col < n; col++) {
      for (let i = 0; i < n; i++) {
        let s = M[i * n + col];
        for (let k = 0; k < i; k++) s -= L[i * n + k] * out[k * n + col];
        out[i * n + col] = s / L[i * n + i];
      }
    }
    return out;
  };
  const W = forward(A);
  const Wt = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Wt[i * n + j] = W[j * n + i];
  const C = forward(Wt);
  for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) C[i * n + j] = C[j * n + i] = 0.5 * (C[i * n + j] + C[j * n + i]);
  const { values, vectors: Y } = symmetricEigen(C, n);
  // q = L⁻ᵀ y: back substitution per column
  const Q = new Float64Array(n * n);
  for (let col = 0; col < n; col++) {
    for (let i = n - 1; i >= 0; i--) {
      let s = Y[i * n + col];
      for (let k = i + 1; k < n; k++) s -= L[k * n + i] * Q[k * n + col];
      Q[i * n + col] = s / L[i * n + i];
    }
  }
  return { values, vectors: Q };
}
