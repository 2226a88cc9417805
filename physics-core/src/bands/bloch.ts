/**
 * Single-particle Bloch Hamiltonians and bands along high-symmetry paths.
 *
 * With one particle, a conditional hop `when: 'empty'` always acts (the via site is empty) and
 * one `when: 'occupied'` never does; interactions vanish. The unit-cell Bloch Hamiltonian uses
 * the cell-periodic convention H(k)_{α←β} = Σ t·e^{−i k·ΔR} over hops t·b†_{α,R+ΔR} b_{β,R}
 * (+ h.c.), so that H(k + G) = H(k) for every reciprocal vector G; the eigenvalues are the
 * energies of the plane waves ψ(R, α) = u_α e^{i k·R}. The boundary twist is ignored.
 */
import type { CompiledModel } from '../model/types.js';
import { hermitianEigen } from './hermitian-eigen.js';
import { reciprocal } from '../meanfield/supercell.js';

/** One hop t·b†_{to, R+dcell} b_{from, R} + h.c. between basis sites. */
export interface BlochHop {
  from: number;
  to: number;
  re: number;
  im: number;
  /** Cell displacement from → to, one integer per lattice axis. */
  dcell: number[];
}

export interface BlochModel {
  nBands: number;
  /** Primitive translations, one [x, y] per axis. */
  translations: number[][];
  hops: BlochHop[];
  /** On-site energy per basis site. */
  onsite: number[];
}

/** Fills the n×n Hermitian H(k) (row-major re/im) of the model at Cartesian momentum k. */
export function blochHamiltonian(model: BlochModel, k: number[], re: Float64Array, im: Float64Array): void {
  const n = model.nBands;
  re.fill(0, 0, n * n);
  im.fill(0, 0, n * n);
  const T = model.translations;
  for (const h of model.hops) {
    let rx = 0;
    let ry = 0;
    for (let a = 0; a < T.length; a++) {
      rx += h.dcell[a] * T[a][0];
      ry += h.dcell[a] * T[a][1];
    }
    const ph = -(k[0] * rx + k[1] * ry);
    const c = Math.cos(ph);
    const s = Math.sin(ph);
    const tr = h.re * c - h.im * s;
    const ti = h.re * s + h.im * c;
    re[h.to * n + h.from] += tr;
    im[h.to * n + h.from] += ti;
    re[h.from * n + h.to] += tr;
    im[h.from * n + h.to] -= ti;
  }
  for (let a = 0; a < n; a++) re[a * n + a] += model.onsite[a];
}

/**
 * The Bloch model of a compiled model's unit cell. `compiled` must be compiled on a periodic
 * cluster large enough that distinct neighbours stay distinct (see `compileBlochCluster`).
 * Every hop entry whose `from` site lies in cell 0… is mapped by (sublattice, cell displacement).
 */
export function blochModelFromCell(cell: {
  nBasis: number;
  translations: number[][];
  hop: { from: Int32Array; to: Int32Array; re: Float64Array; im: Float64Array; dcell: Int32Array };
  cond: { from: Int32Array; to: Int32Array; re: Float64Array; im: Float64Array; alpha: Float64Array; dcell: Int32Array };
  onsite: Float64Array;
}): BlochModel {
  const dim = cell.translations.length;
  const hops: BlochHop[] = [];
  for (let k = 0; k < cell.hop.from.length; k++) {
    hops.push({ from: cell.hop.from[k], to: cell.hop.to[k], re: cell.hop.re[k], im: cell.hop.im[k], dcell: Array.from(cell.hop.dcell.subarray(2 * k, 2 * k + dim)) });
  }
  for (let k = 0; k < cell.cond.from.length; k++) {
    // One particle: the via site is empty, so `empty` hops act fully (alpha = 1), `occupied` not at all (alpha = 0).
    const w = cell.cond.alpha[k];
    if (w === 0) continue;
    hops.push({ from: cell.cond.from[k], to: cell.cond.to[k], re: w * cell.cond.re[k], im: w * cell.cond.im[k], dcell: Array.from(cell.cond.dcell.subarray(2 * k, 2 * k + dim)) });
  }
  return { nBands: cell.nBasis, translations: cell.translations, hops, onsite: Array.from(cell.onsite) };
}

export interface BandPathOptions {
  /** Number of k points along the whole path (at least one per segment end). @default 121 */
  points?: number;
}

export interface BandPath {
  /** Cartesian momenta along the path. */
  k: number[][];
  /** Cumulative path length at each k point. */
  distance: number[];
  /** High-symmetry points: their label and index into `k`. */
  labels: { label: string; index: number }[];
  /** energies[band][i], bands ascending. */
  energies: number[][];
}

/**
 * High-symmetry path for the lattice's translations: 1D 0 → π (Γ–X); square Γ–X–M–Γ;
 * hexagonal (equal translations at 60°/120°) Γ–K–M–Γ; any other 2D cell Γ–X–M–Y–Γ with
 * X = G₁/2, Y = G₂/2, M = (G₁+G₂)/2.
 */
export function highSymmetryPoints(translations: number[][]): { label: string; k: number[] }[] {
  const G = reciprocal(translations);
  const gamma = { label: 'Γ', k: [0, 0] };
  if (translations.length === 1) return [gamma, { label: 'X', k: [G[0][0] / 2, G[0][1] / 2] }];
  const [t1, t2] = translations;
  const l1 = Math.hypot(t1[0], t1[1]);
  const l2 = Math.hypot(t2[0], t2[1]);
  const cos = (t1[0] * t2[0] + t1[1] * t2[1]) / (l1 * l2);
  const half = (v: number[]): number[] => [v[0] / 2, v[1] / 2];
  const sum = (a: number[], b: number[]): number[] => [a[0] + b[0], a[1] + b[1]];
  if (Math.abs(l1 - l2) < 1e-9 * l1 && Math.abs(cos) < 1e-9) {
    return [gamma, { label: 'X', k: half(G[0]) }, { label: 'M', k: half(sum(G[0], G[1])) }, gamma];
  }
  if (Math.abs(l1 - l2) < 1e-9 * l1 && Math.abs(Math.abs(cos) - 0.5) < 1e-9) {
    // Reciprocal vectors at 120° when the translations are at 60°, and vice versa.
    const gcos = (G[0][0] * G[1][0] + G[0][1] * G[1][1]) / (Math.hypot(...G[0]) * Math.hypot(...G[1]));
    const K = gcos < 0
      ? [(2 * G[0][0] + G[1][0]) / 3, (2 * G[0][1] + G[1][1]) / 3]
      : [(G[0][0] + G[1][0]) / 3, (G[0][1] + G[1][1]) / 3];
    return [gamma, { label: 'K', k: K }, { label: 'M', k: half(G[0]) }, gamma];
  }
  return [gamma, { label: 'X', k: half(G[0]) }, { label: 'M', k: half(sum(G[0], G[1])) }, { label: 'Y', k: half(G[1]) }, gamma];
}

/** Bands of `model` along the high-symmetry path of its lattice. */
export function bandPath(model: BlochModel, options: BandPathOptions = {}): BandPath {
  const points = options.points ?? 121;
  const corners = highSymmetryPoints(model.translations);
  const segLen = corners.slice(1).map((c, i) => Math.hypot(c.k[0] - corners[i].k[0], c.k[1] - corners[i].k[1]));
  const total = segLen.reduce((a, b) => a + b, 0);
  const k: number[][] = [];
  const distance: number[] = [];
  const labels: { label: string; index: number }[] = [{ label: corners[0].label, index: 0 }];
  let acc = 0;
  k.push(corners[0].k);
  distance.push(0);
  segLen.forEach((len, s) => {
    const steps = Math.max(1, Math.round(((points - 1) * len) / total));
    const a = corners[s].k;
    const b = corners[s + 1].k;
    for (let i = 1; i <= steps; i++) {
      const f = i / steps;
      k.push([a[0] + f * (b[0] - a[0]), a[1] + f * (b[1] - a[1])]);
      distance.push(acc + f * len);
    }
    acc += len;
    labels.push({ label: corners[s + 1].label, index: k.length - 1 });
  });
  const n = model.nBands;
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  const energies: number[][] = Array.from({ length: n }, () => []);
  for (const kk of k) {
    blochHamiltonian(model, kk, re, im);
    const { values } = hermitianEigen(re, im, n);
    for (let b = 0; b < n; b++) energies[b].push(values[b]);
  }
  return { k, distance, labels, energies };
}

/** Counts of a compiled model's term kinds that the single-particle picture drops (for warnings). */
export function droppedForOneParticle(compiled: CompiledModel): { interactions: number; occupiedHops: number } {
  let interactions = 0;
  let occupiedHops = 0;
  for (const t of compiled.terms) {
    if (t.kind === 'interaction') interactions += t.entries.length;
    if (t.kind === 'conditional-hop' && t.when === 'occupied') occupiedHops += t.entries.length;
  }
  return { interactions, occupiedHops };
}
