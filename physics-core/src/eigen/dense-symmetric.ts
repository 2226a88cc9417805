import { tridiagonalQl } from './tridiagonal-ql.js';

/**
 * All eigenpairs of a small dense real symmetric matrix (n×n row-major): Householder reduction
 * to tridiagonal form, then implicit QL (tridiagonal-ql.ts). Used for the Lanczos projected
 * matrix, which after a thick restart is an arrowhead plus tridiagonal block.
 * Returns ascending values and the eigenvectors as the columns of an n×n row-major matrix.
 */
export function denseSymmetricEigen(matrix: Float64Array, n: number): { values: Float64Array; vectors: Float64Array } {
  const a = Float64Array.from(matrix.subarray(0, n * n));
  const q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) q[i * n + i] = 1;
  const v = new Float64Array(n);
  const p = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    // Householder vector zeroing a[k+2.., k].
    let norm = 0;
    for (let i = k + 1; i < n; i++) norm += a[i * n + k] * a[i * n + k];
    norm = Math.sqrt(norm);
    if (norm === 0) continue;
    const x0 = a[(k + 1) * n + k];
    const alpha = x0 >= 0 ? -norm : norm;
    v.fill(0);
    v[k + 1] = x0 - alpha;
    for (let i = k + 2; i < n; i++) v[i] = a[i * n + k];
    let vn = 0;
    for (let i = k + 1; i < n; i++) vn += v[i] * v[i];
    vn = Math.sqrt(vn);
    if (vn === 0) continue;
    for (let i = k + 1; i < n; i++) v[i] /= vn;
    // A ← H A H = A − 2 v wᵀ − 2 w vᵀ with p = A v, K = vᵀp, w = p − K v.
    let kk = 0;
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = k + 1; j < n; j++) s += a[i * n + j] * v[j];
      p[i] = s;
      kk += v[i] * s;
    }
    for (let i = 0; i < n; i++) p[i] -= kk * v[i];
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) a[i * n + j] -= 2 * (v[i] * p[j] + p[i] * v[j]);
    }
    // Q ← Q H
    for (let i = 0; i < n; i++) {
      let s = 0;
      for (let j = k + 1; j < n; j++) s += q[i * n + j] * v[j];
      for (let j = k + 1; j < n; j++) q[i * n + j] -= 2 * s * v[j];
    }
  }
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    d[i] = a[i * n + i];
    if (i < n - 1) e[i] = 0.5 * (a[i * n + i + 1] + a[(i + 1) * n + i]);
  }
  tridiagonalQl(d, e, q);
  return { values: d, vectors: q };
}
