/**
 * Berry curvature and Chern numbers of isolated bands (or groups of bands touching each other)
 * by the lattice method of Fukui, Hatsugai & Suzuki, J. Phys. Soc. Jpn. 74, 1674 (2005):
 * link variables U_μ(k) = det⟨u_m(k)|u_n(k+δ_μ)⟩/|det| over the bands of the group, field
 * strength F(k) = arg[U₁(k) U₂(k+δ₁) U₁(k+δ₂)⁻¹ U₂(k)⁻¹] ∈ (−π, π], and C = (1/2π) Σ_k F(k),
 * an integer on any mesh. The mesh spans the Brillouin zone as k = (i/N) G₁ + (j/N) G₂; since
 * H(k+G) = H(k) (bloch.ts), the eigenvectors at the mesh edge are reused.
 * Sign convention: C = (1/2π) ∫ d²k Ω with Berry curvature Ω = ∂ₓA_y − ∂_yA_x and
 * A = i⟨u|∇u⟩ (as in Xiao, Chang & Niu, Rev. Mod. Phys. 2010). For small steps
 * arg U_μ ≈ −A_μ δ, so Ω δ² = −F: FHS's own c = (1/2πi)∫F with A = ⟨u|∂u⟩ is the same integer with
 * the opposite sign. The sign is tested against the winding of d̂(k) of two-band models.
 */
import { PhasewrightError } from '../errors.js';
import { blochHamiltonian, type BlochModel } from './bloch.js';
import { hermitianEigen } from './hermitian-eigen.js';
import { reciprocal } from '../meanfield/supercell.js';

export interface ChernOptions {
  /** k points per reciprocal axis. @default 24 */
  mesh?: number;
  /** Bands closer than this (direct gap at some mesh point) form one group. @default 1e-6 */
  gapTolerance?: number;
  /** Keep the Berry curvature per group on the mesh. @default false */
  curvature?: boolean;
}

export interface BandGroup {
  /** Indices of the bands in the group (ascending energy). */
  bands: number[];
  /** Chern number (integer). */
  chern: number;
  /** Smallest direct gap to the next band above over the mesh (null for the top group). */
  directGapAbove: number | null;
  /** Berry curvature Ω(k) (per unit k-area) on the mesh plaquettes, row-major [i][j], when requested. */
  curvature?: number[];
}

export interface ChernResult {
  mesh: number;
  groups: BandGroup[];
  /** Σ of all Chern numbers (0 for any lattice model). */
  total: number;
  /** Reciprocal vectors G_a (G_a · t_b = 2π δ_ab) spanning the k mesh: k = (i/mesh) G_1 + (j/mesh) G_2. */
  reciprocal: number[][];
}

export function checkChernOptions(options: ChernOptions = {}): Required<ChernOptions> {
  const o = { mesh: options.mesh ?? 24, gapTolerance: options.gapTolerance ?? 1e-6, curvature: options.curvature ?? false };
  if (!Number.isInteger(o.mesh) || o.mesh < 3 || o.mesh > 400) {
    throw new PhasewrightError(`must be an integer from 3 to 400 (got ${o.mesh})`, 'options', 'chern.mesh');
  }
  if (!(o.gapTolerance >= 0)) throw new PhasewrightError('must be ≥ 0', 'options', 'chern.gapTolerance');
  return o;
}

/** Chern numbers of every isolated band group of a two-dimensional Bloch model. */
export function chernNumbers(model: BlochModel, options: ChernOptions = {}): ChernResult {
  const o = checkChernOptions(options);
  if (model.translations.length !== 2) {
    throw new PhasewrightError('Chern numbers need a two-dimensional lattice', 'options', '$.lattice.kind');
  }
  const N = o.mesh;
  const n = model.nBands;
  const G = reciprocal(model.translations);
  const [t1, t2] = model.translations;
  const orientation = Math.sign(t1[0] * t2[1] - t1[1] * t2[0]);
  const vecRe: Float64Array[] = [];
  const vecIm: Float64Array[] = [];
  const values: Float64Array[] = [];
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      const k = [(i / N) * G[0][0] + (j / N) * G[1][0], (i / N) * G[0][1] + (j / N) * G[1][1]];
      blochHamiltonian(model, k, re, im);
      const e = hermitianEigen(re, im, n);
      vecRe.push(e.vectorsRe);
      vecIm.push(e.vectorsIm);
      values.push(e.values);
    }
  }
  // Direct gaps between consecutive bands over the mesh → groups.
  const minGap = new Array<number>(Math.max(0, n - 1)).fill(Infinity);
  for (const v of values) for (let b = 0; b + 1 < n; b++) minGap[b] = Math.min(minGap[b], v[b + 1] - v[b]);
  const groups: number[][] = [[0]];
  for (let b = 1; b < n; b++) {
    if (minGap[b - 1] > o.gapTolerance) groups.push([b]);
    else groups[groups.length - 1].push(b);
  }
  const at = (i: number, j: number): number => ((i + N) % N) * N + ((j + N) % N);
  const link = (p: number, q: number, bands: number[]): [number, number] => {
    // det of ⟨u_m(p)|u_n(q)⟩, normalised to unit modulus.
    const g = bands.length;
    const mr = new Float64Array(g * g);
    const mi = new Float64Array(g * g);
    const ar = vecRe[p], ai = vecIm[p], br = vecRe[q], bi = vecIm[q];
    for (let x = 0; x < g; x++) {
      for (let y = 0; y < g; y++) {
        let sr = 0;
        let si = 0;
        for (let a = 0; a < n; a++) {
          const ur = ar[a * n + bands[x]], ui = ai[a * n + bands[x]];
          const vr = br[a * n + bands[y]], vi = bi[a * n + bands[y]];
          sr += ur * vr + ui * vi;
          si += ur * vi - ui * vr;
        }
        mr[x * g + y] = sr;
        mi[x * g + y] = si;
      }
    }
    const [dr, di] = complexDet(mr, mi, g);
    const mag = Math.hypot(dr, di);
    if (mag < 1e-14) {
      throw new PhasewrightError('link variable vanishes: refine the mesh (chern.mesh)', 'numeric', 'chern.mesh');
    }
    return [dr / mag, di / mag];
  };
  const cellArea = Math.abs(G[0][0] * G[1][1] - G[0][1] * G[1][0]) / (N * N);
  const out: BandGroup[] = groups.map((bands, gi) => {
    let sum = 0;
    const curvature: number[] = [];
    for (let i = 0; i < N; i++) {
      for (let j = 0; j < N; j++) {
        const u1 = link(at(i, j), at(i + 1, j), bands);
        const u2 = link(at(i + 1, j), at(i + 1, j + 1), bands);
        const u3 = link(at(i, j + 1), at(i + 1, j + 1), bands);
        const u4 = link(at(i, j), at(i, j + 1), bands);
        // U1(k) U2(k+1) conj(U1(k+2)) conj(U2(k))
        let pr = u1[0] * u2[0] - u1[1] * u2[1];
        let pi = u1[0] * u2[1] + u1[1] * u2[0];
        [pr, pi] = [pr * u3[0] + pi * u3[1], pi * u3[0] - pr * u3[1]];
        [pr, pi] = [pr * u4[0] + pi * u4[1], pi * u4[0] - pr * u4[1]];
        const f = -Math.atan2(pi, pr) * orientation;
        sum += f;
        if (o.curvature) curvature.push(f / cellArea);
      }
    }
    const c = sum / (2 * Math.PI);
    const last = bands[bands.length - 1];
    const group: BandGroup = {
      bands,
      chern: Math.round(c) + 0,
      directGapAbove: gi + 1 < groups.length ? minGap[last] : null,
    };
    if (o.curvature) group.curvature = curvature;
    return group;
  });
  return { mesh: N, groups: out, total: out.reduce((s, g) => s + g.chern, 0), reciprocal: G.map((g) => [...g]) };
}

/** Determinant of a small complex matrix by Gaussian elimination with partial pivoting. */
function complexDet(re: Float64Array, im: Float64Array, n: number): [number, number] {
  const ar = Float64Array.from(re);
  const ai = Float64Array.from(im);
  let dr = 1;
  let di = 0;
  for (let c = 0; c < n; c++) {
    let piv = c;
    let best = -1;
    for (let r = c; r < n; r++) {
      const m = Math.hypot(ar[r * n + c], ai[r * n + c]);
      if (m > best) {
        best = m;
        piv = r;
      }
    }
    if (best === 0) return [0, 0];
    if (piv !== c) {
      for (let k = 0; k < n; k++) {
        [ar[c * n + k], ar[piv * n + k]] = [ar[piv * n + k], ar[c * n + k]];
        [ai[c * n + k], ai[piv * n + k]] = [ai[piv * n + k], ai[c * n + k]];
      }
      dr = -dr;
      di = -di;
    }
    const pr = ar[c * n + c];
    const pi = ai[c * n + c];
    [dr, di] = [dr * pr - di * pi, dr * pi + di * pr];
    const m2 = pr * pr + pi * pi;
    for (let r = c + 1; r < n; r++) {
      // f = a[r][c] / a[c][c]
      const xr = ar[r * n + c], xi = ai[r * n + c];
      const fr = (xr * pr + xi * pi) / m2;
      const fi = (xi * pr - xr * pi) / m2;
      for (let k = c; k < n; k++) {
        const yr = ar[c * n + k], yi = ai[c * n + k];
        ar[r * n + k] -= fr * yr - fi * yi;
        ai[r * n + k] -= fr * yi + fi * yr;
      }
    }
  }
  return [dr, di];
}
