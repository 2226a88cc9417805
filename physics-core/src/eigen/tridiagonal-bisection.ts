/**
 * Selected eigenvalues and eigenvectors of a real symmetric tridiagonal matrix T (diagonal
 * `a[0..m−1]`, off-diagonal `b[0..m−2]`, b[i] couples i and i+1) without forming T:
 *
 * - `sturmCount`: number of eigenvalues below x from the signs of the LDLᵀ pivots of T − x
 *   (Sturm sequence; Wilkinson, "The Algebraic Eigenvalue Problem", 1965, §5.37; Golub & Van
 *   Loan, "Matrix Computations", §8.4.1). `first` = 1 counts for T with its first row and column
 *   removed, which the spurious-value test of Lanczos without reorthogonalization needs.
 * - `tridiagonalEigenvalue`: the i-th smallest eigenvalue by bisection on the count.
 * - `tridiagonalEigenvector`: inverse iteration with a tridiagonal LU with partial pivoting
 *   (the elimination of LAPACK's dgttrf/dgttrs, Anderson et al., "LAPACK Users' Guide", 1999).
 * Each call costs O(m) per bisection step or solve: cheap enough to run after every Lanczos step.
 */

/** Number of eigenvalues of T[first.., first..] strictly below x. */
export function sturmCount(a: Float64Array, b: Float64Array, m: number, x: number, first = 0): number {
  let count = 0;
  let q = 1;
  for (let i = first; i < m; i++) {
    const off = i > first ? b[i - 1] : 0;
    q = a[i] - x - (i > first ? (off * off) / q : 0);
    // A zero pivot counts as negative (LAPACK's dstebz does the same with a tiny pivot).
    if (q === 0) q = -Math.max(Number.EPSILON * (Math.abs(a[i]) + Math.abs(x) + Math.abs(off)), 1e-300);
    if (q < 0) count++;
  }
  return count;
}

/** Gershgorin interval [lo, hi] containing every eigenvalue of T[first.., first..]. */
export function gershgorinBounds(a: Float64Array, b: Float64Array, m: number, first = 0): [number, number] {
  let lo = Number.POSITIVE_INFINITY;
  let hi = Number.NEGATIVE_INFINITY;
  for (let i = first; i < m; i++) {
    const r = (i > first ? Math.abs(b[i - 1]) : 0) + (i < m - 1 ? Math.abs(b[i]) : 0);
    lo = Math.min(lo, a[i] - r);
    hi = Math.max(hi, a[i] + r);
  }
  return [lo, hi];
}

/** The `index`-th smallest eigenvalue (0-based) of T[first.., first..], to about machine precision. */
export function tridiagonalEigenvalue(
  a: Float64Array,
  b: Float64Array,
  m: number,
  index: number,
  bounds: [number, number] = gershgorinBounds(a, b, m),
  first = 0,
): number {
  let [lo, hi] = bounds;
  const size = Math.max(Math.abs(lo), Math.abs(hi), Number.MIN_VALUE);
  for (let it = 0; it < 200 && hi - lo > 2 * Number.EPSILON * size; it++) {
    const mid = 0.5 * (lo + hi);
    if (mid <= lo || mid >= hi) break;
    if (sturmCount(a, b, m, mid, first) > index) hi = mid;
    else lo = mid;
  }
  return 0.5 * (lo + hi);
}

/**
 * Unit eigenvector of T for an eigenvalue estimate `theta` by inverse iteration (three solves),
 * kept orthogonal to the columns in `against` (vectors of the same cluster already found).
 * `out` (length ≥ m) receives it.
 */
export function tridiagonalEigenvector(
  a: Float64Array,
  b: Float64Array,
  m: number,
  theta: number,
  out: Float64Array,
  against: readonly Float64Array[] = [],
): void {
  const scale = Math.max(Math.abs(theta), ...[0, m - 1].map((i) => Math.abs(a[i])), Number.MIN_VALUE);
  const tiny = Number.EPSILON * scale;
  const dl = new Float64Array(m);
  const d = new Float64Array(m);
  const du = new Float64Array(m);
  const du2 = new Float64Array(m);
  const swapped = new Uint8Array(m);
  for (let i = 0; i < m; i++) {
    d[i] = a[i] - theta;
    if (i < m - 1) {
      dl[i] = b[i];
      du[i] = b[i];
    }
  }
  for (let i = 0; i < m - 1; i++) {
    if (Math.abs(d[i]) >= Math.abs(dl[i])) {
      if (d[i] === 0) d[i] = tiny;
      const f = dl[i] / d[i];
      dl[i] = f;
      d[i + 1] -= f * du[i];
    } else {
      const f = d[i] / dl[i];
      d[i] = dl[i];
      dl[i] = f;
      const t = du[i];
      du[i] = d[i + 1];
      d[i + 1] = t - f * d[i + 1];
      if (i < m - 2) {
        du2[i] = du[i + 1];
        du[i + 1] = -f * du[i + 1];
      }
      swapped[i] = 1;
    }
  }
  if (d[m - 1] === 0) d[m - 1] = tiny;
  // Start: a fixed, non-special vector (deterministic).
  for (let i = 0; i < m; i++) out[i] = 1 + 0.1 * Math.sin(1.7 * i + 0.3);
  for (let pass = 0; pass < 3; pass++) {
    for (const u of against) {
      let p = 0;
      for (let i = 0; i < m; i++) p += u[i] * out[i];
      for (let i = 0; i < m; i++) out[i] -= p * u[i];
    }
    for (let i = 0; i < m - 1; i++) {
      if (swapped[i]) {
        const t = out[i];
        out[i] = out[i + 1];
        out[i + 1] = t - dl[i] * out[i];
      } else out[i + 1] -= dl[i] * out[i];
    }
    out[m - 1] /= d[m - 1];
    if (m > 1) out[m - 2] = (out[m - 2] - du[m - 2] * out[m - 1]) / d[m - 2];
    for (let i = m - 3; i >= 0; i--) out[i] = (out[i] - du[i] * out[i + 1] - du2[i] * out[i + 2]) / d[i];
    let norm = 0;
    for (let i = 0; i < m; i++) norm += out[i] * out[i];
    norm = Math.sqrt(norm);
    if (!(norm > 0) || !Number.isFinite(norm)) throw new Error('tridiagonal inverse iteration failed');
    for (let i = 0; i < m; i++) out[i] /= norm;
  }
  for (const u of against) {
    let p = 0;
    for (let i = 0; i < m; i++) p += u[i] * out[i];
    for (let i = 0; i < m; i++) out[i] -= p * u[i];
  }
  let norm = 0;
  for (let i = 0; i < m; i++) norm += out[i] * out[i];
  norm = Math.sqrt(norm);
  for (let i = 0; i < m; i++) out[i] /= norm;
}
