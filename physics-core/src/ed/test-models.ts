/**
 * Hand-built compiled models for tests (no spec parsing involved) and dense reference
 * diagonalization with ml-matrix. Not part of the public API.
 */
import { Matrix, EigenvalueDecomposition } from 'ml-matrix';
import type { Bond, CompiledModel, CompiledTerm, Lattice, Plaquette } from '../model/types.js';
import { mulberry32 } from '../util/random.js';

export interface HandModel {
  nSites: number;
  nParticles: number;
  /** [from, to, re, im]: t·b†_to b_from + h.c. */
  hops?: [number, number, number, number][];
  /** Conditional hop families. */
  conditional?: { when: 'empty' | 'occupied'; entries: [number, number, number, number, number][] }[];
  /** [i, j, value] */
  interactions?: [number, number, number][];
  /** [i, value] */
  onsite?: [number, number][];
  positions?: [number, number][];
  /** Plaquettes as counter-clockwise site lists; steps are resolved against the hop bonds. */
  plaquettes?: number[][];
  momenta?: number[][];
}

export function handModel(h: HandModel): CompiledModel {
  const positions = h.positions ?? Array.from({ length: h.nSites }, (_, i) => [i, 0] as [number, number]);
  const bonds: Bond[] = [];
  const bondOf = (a: number, b: number): number => {
    const found = bonds.find((x) => (x.from === a && x.to === b) || (x.from === b && x.to === a));
    if (found) return found.index;
    const bond: Bond = {
      index: bonds.length,
      from: a,
      to: b,
      dx: positions[b][0] - positions[a][0],
      dy: positions[b][1] - positions[a][1],
      shell: 1,
      classes: ['nn'],
      wrap: [0],
    };
    bonds.push(bond);
    return bond.index;
  };
  const terms: CompiledTerm[] = [];
  let termIndex = 0;
  if (h.hops?.length) {
    terms.push({
      termIndex: termIndex++,
      kind: 'hop',
      entries: h.hops.map(([from, to, re, im]) => ({ from, to, re, im, bond: bondOf(from, to) })),
    });
  }
  for (const family of h.conditional ?? []) {
    terms.push({
      termIndex: termIndex++,
      kind: 'conditional-hop',
      when: family.when,
      entries: family.entries.map(([from, via, to, re, im], path) => ({ from, via, to, re, im, path })),
    });
  }
  if (h.interactions?.length) {
    terms.push({
      termIndex: termIndex++,
      kind: 'interaction',
      entries: h.interactions.map(([i, j, value]) => ({ i, j, value, bond: -1 })),
    });
  }
  if (h.onsite?.length) {
    terms.push({ termIndex, kind: 'onsite', entries: h.onsite.map(([i, value]) => ({ i, value })) });
  }
  const plaquettes: Plaquette[] = (h.plaquettes ?? []).map((sites, index) => ({
    index,
    sites,
    steps: sites.map((a, s) => {
      const b = sites[(s + 1) % sites.length];
      const bond = bonds[bondOf(a, b)];
      return { bond: bond.index, sign: bond.from === a ? 1 : -1 } as { bond: number; sign: 1 | -1 };
    }),
    area: 0,
    cx: 0,
    cy: 0,
  }));
  const lattice: Lattice = {
    kind: 'custom',
    size: [1],
    boundary: ['open'],
    twist: [0],
    translations: [[1, 0]],
    basis: positions.map(([x, y], sublattice) => ({ x, y, sublattice })),
    sites: positions.map(([x, y], index) => ({ index, x, y, sublattice: index, cell: [0] })),
    bonds,
    paths: [],
    plaquettes,
    shellDistances: [1],
    momenta: h.momenta ?? [[0, 0]],
  };
  return {
    spec: {
      spec: 'phasewright.model/1',
      lattice: { kind: 'custom', size: [1], boundary: ['open'] },
      particles: { kind: 'hardcore', count: h.nParticles },
      parameters: {},
      terms: [],
    },
    parameters: {},
    lattice,
    nSites: h.nSites,
    nParticles: h.nParticles,
    terms,
  };
}

/**
 * H = −J Σ (e^{iφ_b} b†_{i+1} b_i + h.c.) + V Σ n_i n_{i+1} on a chain (periodic: the bond L−1→0
 * carries the twist). φ_b = twist/L on every bond if `spreadTwist`, else all on the last bond.
 */
export function chainModel(o: {
  L: number;
  N: number;
  J?: number;
  V?: number;
  periodic?: boolean;
  twist?: number;
  spreadTwist?: boolean;
}): CompiledModel {
  const J = o.J ?? 1;
  const V = o.V ?? 0;
  const twist = o.twist ?? 0;
  const hops: [number, number, number, number][] = [];
  const interactions: [number, number, number][] = [];
  const nb = o.periodic ? o.L : o.L - 1;
  for (let b = 0; b < nb; b++) {
    const phi = o.spreadTwist ? twist / o.L : b === o.L - 1 ? twist : 0;
    hops.push([b, (b + 1) % o.L, -J * Math.cos(phi), -J * Math.sin(phi)]);
    if (V !== 0) interactions.push([b, (b + 1) % o.L, V]);
  }
  const momenta = o.periodic
    ? Array.from({ length: o.L }, (_, m) => [(2 * Math.PI * m) / o.L, 0])
    : [[0, 0]];
  return handModel({ nSites: o.L, nParticles: o.N, hops, interactions, momenta });
}

/**
 * A random model with complex hops, both kinds of conditional hops, interactions and on-site
 * terms among `nSites` sites (pairs chosen at random), seeded.
 */
export function randomModel(seed: number, nSites: number, nParticles: number): CompiledModel {
  const rand = mulberry32(seed);
  const u = (): number => 2 * rand() - 1;
  const hops: [number, number, number, number][] = [];
  const cond: [number, number, number, number, number][] = [];
  const condOcc: [number, number, number, number, number][] = [];
  const interactions: [number, number, number][] = [];
  const onsite: [number, number][] = [];
  for (let i = 0; i < nSites; i++) {
    hops.push([i, (i + 1) % nSites, u(), u()]);
    if (rand() < 0.5) hops.push([i, (i + 2) % nSites, u(), u()]);
    onsite.push([i, u()]);
    interactions.push([i, (i + 1) % nSites, u()]);
    if (nSites >= 3) {
      cond.push([i, (i + 1) % nSites, (i + 2) % nSites, u(), u()]);
      if (rand() < 0.5) condOcc.push([(i + 2) % nSites, (i + 1) % nSites, i, u(), u()]);
    }
  }
  return handModel({
    nSites,
    nParticles,
    hops,
    conditional: [
      { when: 'empty', entries: cond },
      { when: 'occupied', entries: condOcc },
    ],
    interactions,
    onsite,
  });
}

/** Dense complex matrix of a matvec (the solver's own, in src/eigen/lowest-eigenpairs.ts). */
export { denseFromMatvec } from '../eigen/lowest-eigenpairs.js';

/**
 * Eigen-decomposition of a complex Hermitian matrix with ml-matrix through the real symmetric
 * embedding [[Re, −Im], [Im, Re]] (each eigenvalue appears twice). Returns the n distinct-slot
 * eigenvalues ascending, and eigenvectors as interleaved complex arrays.
 */
export function denseHermitianEigen(re: Float64Array, im: Float64Array, n: number): { values: number[]; vectors: Float64Array[] } {
  const big = Matrix.zeros(2 * n, 2 * n);
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < n; c++) {
      big.set(r, c, re[r * n + c]);
      big.set(r + n, c + n, re[r * n + c]);
      big.set(r, c + n, -im[r * n + c]);
      big.set(r + n, c, im[r * n + c]);
    }
  }
  const eig = new EigenvalueDecomposition(big, { assumeSymmetric: true });
  const all = eig.realEigenvalues.map((value, index) => ({ value, index })).sort((a, b) => a.value - b.value);
  const vecs = eig.eigenvectorMatrix;
  const values: number[] = [];
  const vectors: Float64Array[] = [];
  // Pairs (u, w) → complex u + i w; take every second eigenvalue of the doubled spectrum.
  for (let p = 0; p < 2 * n; p += 2) {
    values.push(all[p].value);
    const col = all[p].index;
    const v = new Float64Array(2 * n);
    let norm = 0;
    for (let r = 0; r < n; r++) {
      v[2 * r] = vecs.get(r, col);
      v[2 * r + 1] = vecs.get(r + n, col);
      norm += v[2 * r] ** 2 + v[2 * r + 1] ** 2;
    }
    for (let q = 0; q < 2 * n; q++) v[q] /= Math.sqrt(norm);
    vectors.push(v);
  }
  return { values, vectors };
}
