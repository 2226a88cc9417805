/**
 * Helpers on interleaved complex vectors (v[2r] = Re, v[2r+1] = Im) stored as Float64Array.
 */

/** ⟨a|b⟩ = Σ conj(a_r) b_r, written into out[0] (Re), out[1] (Im). */
export function dotc(a: Float64Array, b: Float64Array, out: Float64Array | number[]): void {
  let re0 = 0;
  let im0 = 0;
  let re1 = 0;
  let im1 = 0;
  const n = a.length;
  let q = 0;
  for (; q + 3 < n; q += 4) {
    re0 += a[q] * b[q] + a[q + 1] * b[q + 1];
    im0 += a[q] * b[q + 1] - a[q + 1] * b[q];
    re1 += a[q + 2] * b[q + 2] + a[q + 3] * b[q + 3];
    im1 += a[q + 2] * b[q + 3] - a[q + 3] * b[q + 2];
  }
  for (; q < n; q += 2) {
    re0 += a[q] * b[q] + a[q + 1] * b[q + 1];
    im0 += a[q] * b[q + 1] - a[q + 1] * b[q];
  }
  out[0] = re0 + re1;
  out[1] = im0 + im1;
}

export function norm2(a: Float64Array): number {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  const n = a.length;
  let q = 0;
  for (; q + 3 < n; q += 4) {
    s0 += a[q] * a[q];
    s1 += a[q + 1] * a[q + 1];
    s2 += a[q + 2] * a[q + 2];
    s3 += a[q + 3] * a[q + 3];
  }
  for (; q < n; q++) s0 += a[q] * a[q];
  return Math.sqrt(s0 + s1 + s2 + s3);
}

/** y ← y − (cr + i ci)·x */
export function subtractScaled(y: Float64Array, x: Float64Array, cr: number, ci: number): void {
  const n = y.length;
  for (let q = 0; q < n; q += 2) {
    const xr = x[q];
    const xi = x[q + 1];
    y[q] -= cr * xr - ci * xi;
    y[q + 1] -= cr * xi + ci * xr;
  }
}

export function scale(y: Float64Array, s: number): void {
  for (let q = 0; q < y.length; q++) y[q] *= s;
}

const BLOCK = 1024;

/**
 * One classical Gram–Schmidt pass of w against basis[0..count−1], fused over blocks of
 * components so that w stays in cache: h_i = ⟨basis_i|w⟩ for all i first, then w ← w − Σ h_i basis_i.
 * `hRe`, `hIm` (length ≥ count) receive the coefficients.
 */
export function projectOut(
  w: Float64Array,
  basis: Float64Array[],
  count: number,
  hRe: Float64Array,
  hIm: Float64Array,
): void {
  const n = w.length;
  hRe.fill(0, 0, count);
  hIm.fill(0, 0, count);
  for (let start = 0; start < n; start += BLOCK) {
    const end = Math.min(n, start + BLOCK);
    for (let i = 0; i < count; i++) {
      const v = basis[i];
      let re0 = 0;
      let im0 = 0;
      let re1 = 0;
      let im1 = 0;
      let q = start;
      for (; q + 3 < end; q += 4) {
        const ar = v[q];
        const ai = v[q + 1];
        const br = w[q];
        const bi = w[q + 1];
        re0 += ar * br + ai * bi;
        im0 += ar * bi - ai * br;
        const cr = v[q + 2];
        const ci = v[q + 3];
        const dr = w[q + 2];
        const di = w[q + 3];
        re1 += cr * dr + ci * di;
        im1 += cr * di - ci * dr;
      }
      for (; q < end; q += 2) {
        re0 += v[q] * w[q] + v[q + 1] * w[q + 1];
        im0 += v[q] * w[q + 1] - v[q + 1] * w[q];
      }
      hRe[i] += re0 + re1;
      hIm[i] += im0 + im1;
    }
  }
  for (let start = 0; start < n; start += BLOCK) {
    const end = Math.min(n, start + BLOCK);
    for (let i = 0; i < count; i++) {
      const v = basis[i];
      const cr = hRe[i];
      const ci = hIm[i];
      for (let q = start; q < end; q += 2) {
        const xr = v[q];
        const xi = v[q + 1];
        w[q] -= cr * xr - ci * xi;
        w[q + 1] -= cr * xi + ci * xr;
      }
    }
  }
}
