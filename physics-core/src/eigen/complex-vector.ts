/**
 * Helpers on interleaved complex vectors (v[2r] = Re, v[2r+1] = Im) stored as Float64Array.
 */

/** ⟨a|b⟩ = Σ conj(a_r) b_r, written into out[0] (Re), out[1] (Im). */
export function dotc(a: Float64Array, b: Float64Array, out: Float64Array | number[]): void {
  let re = 0;
  let im = 0;
  const n = a.length;
  for (let q = 0; q < n; q += 2) {
    const ar = a[q];
    const ai = a[q + 1];
    const br = b[q];
    const bi = b[q + 1];
    re += ar * br + ai * bi;
    im += ar * bi - ai * br;
  }
  out[0] = re;
  out[1] = im;
}

export function norm2(a: Float64Array): number {
  let s = 0;
  for (let q = 0; q < a.length; q++) s += a[q] * a[q];
  return Math.sqrt(s);
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
