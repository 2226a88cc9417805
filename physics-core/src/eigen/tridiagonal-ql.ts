/**
 * Eigenvalues and eigenvectors of a real symmetric tridiagonal matrix by the QL algorithm with
 * implicit Wilkinson-type shifts (Bowdler, Martin, Reinsch & Wilkinson, Numer. Math. 1968; the
 * textbook form is in Golub & Van Loan, "Matrix Computations", §8.3).
 *
 * `diagonal` (length n) and `offDiagonal` (length n; offDiagonal[i] couples i and i+1, the last
 * entry is ignored) are overwritten. `vectors` is an n×n row-major matrix that is multiplied from
 * the right by the accumulated rotations: pass the identity to get the eigenvectors of T, or an
 * orthogonal Q to get Q·(eigenvectors of T). On return column j of `vectors` belongs to
 * `diagonal[j]`, sorted ascending.
 */
export interface TridiagonalQlOptions {
  /** Iterations allowed per eigenvalue before giving up. @default 60 */
  maxIterationsPerValue?: number;
}

export function checkTridiagonalQlOptions(options: TridiagonalQlOptions = {}): Required<TridiagonalQlOptions> {
  const maxIterationsPerValue = options.maxIterationsPerValue ?? 60;
  if (!(maxIterationsPerValue >= 1)) throw new RangeError('maxIterationsPerValue must be ≥ 1');
  return { maxIterationsPerValue };
}

export function tridiagonalQl(
  diagonal: Float64Array,
  offDiagonal: Float64Array,
  vectors: Float64Array,
  options: TridiagonalQlOptions = {},
): void {
  const { maxIterationsPerValue } = checkTridiagonalQlOptions(options);
  const n = diagonal.length;
  const d = diagonal;
  const e = offDiagonal;
  const z = vectors;
  if (e.length < n || z.length < n * n) throw new RangeError('tridiagonalQl: array sizes do not match');
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(d[i]) || (i < n - 1 && !Number.isFinite(e[i]))) {
      throw new RangeError(`tridiagonalQl: non-finite matrix element at ${i}`);
    }
  }
  if (n > 0) e[n - 1] = 0;
  for (let l = 0; l < n; l++) {
    let iterations = 0;
    for (;;) {
      let m = l;
      for (; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) <= Number.EPSILON * dd) break;
      }
      if (m === l) break;
      if (++iterations > maxIterationsPerValue) {
        throw new Error(`tridiagonalQl: no convergence after ${maxIterationsPerValue} iterations`);
      }
      // Shift from the trailing 2×2 block at l.
      let g = (d[l + 1] - d[l]) / (2 * e[l]);
      let r = Math.hypot(g, 1);
      g = d[m] - d[l] + e[l] / (g + (g >= 0 ? r : -r));
      let s = 1;
      let c = 1;
      let p = 0;
      let deflated = false;
      for (let i = m - 1; i >= l; i--) {
        const f = s * e[i];
        const b = c * e[i];
        r = Math.hypot(f, g);
        e[i + 1] = r;
        if (r === 0) {
          d[i + 1] -= p;
          e[m] = 0;
          deflated = true;
          break;
        }
        s = f / r;
        c = g / r;
        g = d[i + 1] - p;
        r = (d[i] - g) * s + 2 * c * b;
        p = s * r;
        d[i + 1] = g + p;
        g = c * r - b;
        for (let k = 0; k < n; k++) {
          const row = k * n;
          const zf = z[row + i + 1];
          z[row + i + 1] = s * z[row + i] + c * zf;
          z[row + i] = c * z[row + i] - s * zf;
        }
      }
      if (deflated) continue;
      d[l] -= p;
      e[l] = g;
      e[m] = 0;
    }
  }
  sortEigenpairs(d, z, n);
}

/** Sorts eigenvalues ascending and permutes the columns of the n×n row-major `z` alike. */
export function sortEigenpairs(d: Float64Array, z: Float64Array, n: number): void {
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    for (let j = i + 1; j < n; j++) if (d[j] < d[k]) k = j;
    if (k !== i) {
      const t = d[i];
      d[i] = d[k];
      d[k] = t;
      for (let row = 0; row < n; row++) {
        const a = z[row * n + i];
        z[row * n + i] = z[row * n + k];
        z[row * n + k] = a;
      }
    }
  }
}
