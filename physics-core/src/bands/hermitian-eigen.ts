/**
 * All eigenpairs of a small dense complex Hermitian matrix by cyclic Jacobi rotations
 * (each rotation first removes the phase of the pivot, then applies the real Jacobi rotation of
 * Numerical Recipes §11.1). Meant for Bloch Hamiltonians (a handful of bands).
 * Input: row-major real and imaginary parts (n×n). Output: ascending eigenvalues and
 * eigenvectors as columns (row-major re/im, column j = eigenvector j).
 */
import { PhasewrightError } from '../errors.js';

export interface HermitianEigen {
  values: Float64Array;
  vectorsRe: Float64Array;
  vectorsIm: Float64Array;
  converged: boolean;
  sweeps: number;
}

export function hermitianEigen(re: Float64Array, im: Float64Array, n: number, maxSweeps = 60): HermitianEigen {
  const ar = Float64Array.from(re.subarray(0, n * n));
  const ai = Float64Array.from(im.subarray(0, n * n));
  for (let i = 0; i < n * n; i++) {
    if (!Number.isFinite(ar[i]) || !Number.isFinite(ai[i])) {
      throw new PhasewrightError('matrix has a non-finite entry', 'numeric', 'hermitianEigen');
    }
  }
  const vr = new Float64Array(n * n);
  const vi = new Float64Array(n * n);
  for (let i = 0; i < n; i++) vr[i * n + i] = 1;
  let norm = 0;
  for (let i = 0; i < n * n; i++) norm += ar[i] * ar[i] + ai[i] * ai[i];
  norm = Math.sqrt(norm);
  const tol = 1e-15 * Math.max(norm, 1e-300);
  let sweeps = 0;
  let converged = false;
  for (; sweeps < maxSweeps; sweeps++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += ar[p * n + q] ** 2 + ai[p * n + q] ** 2;
    if (Math.sqrt(off) <= tol) {
      converged = true;
      break;
    }
    for (let p = 0; p < n; p++) {
      for (let q = p + 1; q < n; q++) {
        const xr = ar[p * n + q];
        const xi = ai[p * n + q];
        const mag = Math.hypot(xr, xi);
        if (mag <= tol * 1e-3) continue;
        // e^{iφ} = a_pq/|a_pq|; V = D·R with D_qq = e^{−iφ}.
        const er = xr / mag;
        const ei = xi / mag;
        const app = ar[p * n + p];
        const aqq = ar[q * n + q];
        const zeta = (aqq - app) / (2 * mag);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t);
        const s = t * c;
        // Columns: (AV)[:,p] = c A[:,p] − s e^{−iφ} A[:,q]; (AV)[:,q] = s A[:,p] + c e^{−iφ} A[:,q]
        const rotateColumns = (mr: Float64Array, mi: Float64Array): void => {
          for (let k = 0; k < n; k++) {
            const pr = mr[k * n + p], pi = mi[k * n + p];
            const qr0 = mr[k * n + q], qi0 = mi[k * n + q];
            // e^{−iφ}·(qr0 + i qi0)
            const qr = er * qr0 + ei * qi0;
            const qi = er * qi0 - ei * qr0;
            mr[k * n + p] = c * pr - s * qr;
            mi[k * n + p] = c * pi - s * qi;
            mr[k * n + q] = s * pr + c * qr;
            mi[k * n + q] = s * pi + c * qi;
          }
        };
        rotateColumns(ar, ai);
        rotateColumns(vr, vi);
        // Rows: (V†M)[p,:] = c M[p,:] − s e^{iφ} M[q,:]; (V†M)[q,:] = s M[p,:] + c e^{iφ} M[q,:]
        for (let k = 0; k < n; k++) {
          const pr = ar[p * n + k], pi = ai[p * n + k];
          const qr0 = ar[q * n + k], qi0 = ai[q * n + k];
          const qr = er * qr0 - ei * qi0;
          const qi = er * qi0 + ei * qr0;
          ar[p * n + k] = c * pr - s * qr;
          ai[p * n + k] = c * pi - s * qi;
          ar[q * n + k] = s * pr + c * qr;
          ai[q * n + k] = s * pi + c * qi;
        }
        ar[p * n + q] = 0;
        ai[p * n + q] = 0;
        ar[q * n + p] = 0;
        ai[q * n + p] = 0;
        ai[p * n + p] = 0;
        ai[q * n + q] = 0;
      }
    }
  }
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => ar[a * n + a] - ar[b * n + b]);
  const values = new Float64Array(n);
  const vectorsRe = new Float64Array(n * n);
  const vectorsIm = new Float64Array(n * n);
  order.forEach((src, j) => {
    values[j] = ar[src * n + src];
    for (let k = 0; k < n; k++) {
      vectorsRe[k * n + j] = vr[k * n + src];
      vectorsIm[k * n + j] = vi[k * n + src];
    }
  });
  return { values, vectorsRe, vectorsIm, converged, sweeps };
}
