/**
 * Lattices of model spec v1. Lengths are in units of the nearest-neighbour distance (= 1 on
 * every built-in lattice). Full description with pictures in words: physics-core/docs/lattices.md.
 *
 * Numbering (all lattices): site index = cellOrder · basisSize + s, with s the site's index in
 * the unit cell (`Site.sublattice`) and cellOrder = c0 + L0·c1 (axis 0 FASTEST). A site sits at
 * r = c0·a0 + c1·a1 + basis[s] (no wrapping of positions).
 *
 * Unit cells (translations a0, a1; basis):
 * - chain:      a0 = (1, 0);                 basis (0, 0).
 * - ladder:     a0 = (1, 0);                 basis s0 = (0, 0) lower leg, s1 = (0, 1) upper leg.
 *               classes `leg` (along x) and `rung` (along y), both in shell 1; nnn = diagonals.
 * - zigzag:     a0 = (1, 0);                 basis s0 = (0, 0) lower leg, s1 = (1/2, √3/2) upper
 *               leg: a strip of equilateral triangles, so `zig` (between the legs) and `leg` (along
 *               one leg) are BOTH in shell 1 (4 nn per site); shell 2 (nnn) is at distance √3.
 *               `size: [L]` has 2L sites.
 * - square:     a0 = (1, 0), a1 = (0, 1).
 * - triangular: a0 = (1, 0), a1 = (1/2, √3/2).
 * - honeycomb:  a0 = (√3, 0), a1 = (√3/2, 3/2); basis A = (0, 0), B = (0, 1).
 * - kagome:     a0 = (2, 0), a1 = (1, √3);    basis (0, 0), (1, 0), (1/2, √3/2).
 * - custom:     as given (see custom.ts).
 *
 * Bond orientation (all lattices): from the lower cell-site index to the higher (honeycomb A→B,
 * ladder rungs lower→upper, zigzag zig lower→upper); between equal cell-site indices towards +x,
 * or +y when dx = 0. A hop on a bond reads t·b†_to b_from + h.c.
 *
 * Twist: on a periodic axis a, a bond from → to that crosses the boundary w_a times in the +a
 * direction (`Bond.wrap[a]` = w_a) carries e^{+i·w_a·twist_a} on b†_to b_from; open axes have
 * wrap 0 and must have twist 0.
 *
 * Momenta: q = Σ_a (m_a / L_a)·b_a, m_a = 0 … L_a − 1 (axis 0 fastest), b the reciprocal vectors
 * (a_i·b_j = 2π δ_ij). Open axes use the same grid (a convention: those q are not good quantum
 * numbers there).
 */
import { SpecError } from '../errors.js';
import type { BoundaryKind, Lattice, LatticeKind, LatticeSpec, Site } from '../model/types.js';
import { evaluateConstant } from '../model/expressions.js';
import { customUnitCell } from './custom.js';
import { cellScale, cellShells, checkDistinctPairs, layBonds } from './neighbors.js';
import { buildPaths } from './paths.js';
import { buildPlaquettes, cellNnPlanar } from './plaquettes.js';
import { DISTANCE_TOLERANCE, type UnitCell } from './unit-cell.js';

export const LATTICE_KINDS: readonly LatticeKind[] = [
  'chain',
  'ladder',
  'zigzag',
  'square',
  'triangular',
  'honeycomb',
  'kagome',
  'custom',
];

const S3 = Math.sqrt(3);
const EPS = DISTANCE_TOLERANCE;

/** Unit cell of a built-in lattice kind. */
export function builtinUnitCell(kind: Exclude<LatticeKind, 'custom'>): UnitCell {
  switch (kind) {
    case 'chain':
      return { kind, translations: [[1, 0]], basis: [{ x: 0, y: 0, sublattice: 0 }], classes: ['nn', 'nnn'] };
    case 'ladder':
      return {
        kind,
        translations: [[1, 0]],
        basis: [
          { x: 0, y: 0, sublattice: 0 },
          { x: 0, y: 1, sublattice: 1 },
        ],
        classify: (b) =>
          b.shell !== 1 ? [] : Math.abs(b.dy) < EPS ? ['leg'] : Math.abs(b.dx) < EPS ? ['rung'] : [],
        classes: ['nn', 'nnn', 'leg', 'rung'],
      };
    case 'zigzag':
      return {
        kind,
        translations: [[1, 0]],
        basis: [
          { x: 0, y: 0, sublattice: 0 },
          { x: 0.5, y: S3 / 2, sublattice: 1 },
        ],
        classify: (b) => (b.shell !== 1 ? [] : b.from === b.to ? ['leg'] : ['zig']),
        classes: ['nn', 'nnn', 'leg', 'zig'],
      };
    case 'square':
      return {
        kind,
        translations: [
          [1, 0],
          [0, 1],
        ],
        basis: [{ x: 0, y: 0, sublattice: 0 }],
        classes: ['nn', 'nnn'],
      };
    case 'triangular':
      return {
        kind,
        translations: [
          [1, 0],
          [0.5, S3 / 2],
        ],
        basis: [{ x: 0, y: 0, sublattice: 0 }],
        classes: ['nn', 'nnn'],
      };
    case 'honeycomb':
      return {
        kind,
        translations: [
          [S3, 0],
          [S3 / 2, 1.5],
        ],
        basis: [
          { x: 0, y: 0, sublattice: 0 },
          { x: 0, y: 1, sublattice: 1 },
        ],
        classes: ['nn', 'nnn'],
      };
    case 'kagome':
      return {
        kind,
        translations: [
          [2, 0],
          [1, S3],
        ],
        basis: [
          { x: 0, y: 0, sublattice: 0 },
          { x: 1, y: 0, sublattice: 1 },
          { x: 0.5, y: S3 / 2, sublattice: 2 },
        ],
        classes: ['nn', 'nnn'],
      };
  }
}

/** Number of axes (entries of `size`) of a lattice kind; custom: its number of translations. */
export function latticeDimension(spec: Pick<LatticeSpec, 'kind' | 'custom'>): number {
  if (spec.kind === 'custom') return spec.custom?.translations.length ?? 0;
  return spec.kind === 'chain' || spec.kind === 'ladder' || spec.kind === 'zigzag' ? 1 : 2;
}

/** Bond classes a lattice defines (`nn`, `nnn`, then its own). */
export function latticeClasses(spec: Pick<LatticeSpec, 'kind' | 'custom'>): string[] {
  return unitCellOf(spec).classes.slice();
}

export function unitCellOf(spec: Pick<LatticeSpec, 'kind' | 'custom'>): UnitCell {
  if (spec.kind === 'custom') {
    if (!spec.custom) throw new SpecError([{ path: '$.lattice.custom', message: 'a custom lattice needs `custom`' }]);
    return customUnitCell(spec.custom);
  }
  return builtinUnitCell(spec.kind);
}

/** Distance shells of the infinite lattice of this kind (first `shells`). */
export function shellDistancesOf(spec: Pick<LatticeSpec, 'kind' | 'custom'>, shells = 2): number[] {
  return cellShells(unitCellOf(spec), shells).distances.slice(0, shells);
}

export interface BuildLatticeOptions {
  /** Number of distance shells laid as bonds (named custom bonds are always laid). @default 2 */
  shells?: number;
  /**
   * Refuse periodic clusters on which two bonds join the same pair of sites, or a bond joins a
   * site to itself (SpecError at `$.lattice.size`). Switch off only for Bloch sums over images
   * (e.g. a one-cell periodic cluster). @default true
   */
  distinctPairs?: boolean;
  /** Twist angles (radians per axis), already evaluated; otherwise `spec.twist` (numbers, or expressions in `pi`). */
  twist?: number[];
  /** Build the two-step paths (only conditional hops need them). @default true */
  paths?: boolean;
  /** Largest number of sites accepted. @default 1_000_000 */
  maxSites?: number;
}

function reciprocal(tr: number[][]): number[][] {
  if (tr.length === 1) {
    const [ax, ay] = tr[0];
    const n2 = ax * ax + ay * ay;
    return [[(2 * Math.PI * ax) / n2, (2 * Math.PI * ay) / n2]];
  }
  const [[a0x, a0y], [a1x, a1y]] = tr;
  const det = a0x * a1y - a0y * a1x;
  return [
    [(2 * Math.PI * a1y) / det, (-2 * Math.PI * a1x) / det],
    [(-2 * Math.PI * a0y) / det, (2 * Math.PI * a0x) / det],
  ];
}

/** Momenta of the cluster: q = Σ_a (m_a/L_a) b_a, axis 0 fastest (see the file comment). */
export function clusterMomenta(translations: number[][], size: number[]): number[][] {
  const b = reciprocal(translations);
  const total = size.reduce((p, q) => p * q, 1);
  const out: number[][] = [];
  for (let i = 0; i < total; i++) {
    let rest = i;
    let qx = 0;
    let qy = 0;
    for (let a = 0; a < size.length; a++) {
      const m = rest % size[a];
      rest = Math.floor(rest / size[a]);
      qx += (m / size[a]) * b[a][0];
      qy += (m / size[a]) * b[a][1];
    }
    out.push([qx, qy]);
  }
  return out;
}

function resolveTwist(spec: LatticeSpec, dim: number, given?: number[]): number[] {
  const issues: { path: string; message: string }[] = [];
  const raw = given ?? spec.twist ?? [];
  if (raw.length !== 0 && raw.length !== dim)
    issues.push({ path: '$.lattice.twist', message: `has ${raw.length} entries; this lattice has ${dim} axes` });
  const twist = new Array<number>(dim).fill(0);
  for (let a = 0; a < Math.min(dim, raw.length); a++) {
    const v = raw[a];
    const path = `$.lattice.twist[${a}]`;
    const num = typeof v === 'number' ? v : evaluateConstant(v, {}, path);
    if (!Number.isFinite(num)) issues.push({ path, message: `must be a finite number of radians` });
    else if (num !== 0 && spec.boundary[a] === 'open')
      issues.push({ path, message: `twist ${num} on an open axis has no meaning; set it to 0 or make axis ${a} periodic` });
    else twist[a] = num;
  }
  if (issues.length) throw new SpecError(issues);
  return twist;
}

/** Build the finite cluster: sites, bonds, two-step paths, plaquettes, shells and momenta. */
export function buildLattice(spec: LatticeSpec, options: BuildLatticeOptions = {}): Lattice {
  const shells = options.shells ?? 2;
  if (!LATTICE_KINDS.includes(spec.kind))
    throw new SpecError([
      { path: '$.lattice.kind', message: `unknown lattice kind '${String(spec.kind)}' (allowed: ${LATTICE_KINDS.join(', ')})` },
    ]);
  const cell = unitCellOf(spec);
  const dim = cell.translations.length;
  const issues: { path: string; message: string }[] = [];
  if (!Array.isArray(spec.size) || spec.size.length !== dim)
    issues.push({ path: '$.lattice.size', message: `needs ${dim} entr${dim === 1 ? 'y' : 'ies'} for a ${spec.kind} lattice` });
  else
    spec.size.forEach((l, a) => {
      if (!Number.isInteger(l) || l < 1) issues.push({ path: `$.lattice.size[${a}]`, message: `must be a positive integer, got ${l}` });
    });
  if (!Array.isArray(spec.boundary) || spec.boundary.length !== dim)
    issues.push({ path: '$.lattice.boundary', message: `needs ${dim} entr${dim === 1 ? 'y' : 'ies'} for a ${spec.kind} lattice` });
  else
    spec.boundary.forEach((b, a) => {
      if (b !== 'open' && b !== 'periodic')
        issues.push({ path: `$.lattice.boundary[${a}]`, message: `must be 'open' or 'periodic', got '${String(b)}'` });
    });
  if (issues.length) throw new SpecError(issues);
  const size = spec.size.slice();
  const boundary = spec.boundary.slice() as BoundaryKind[];
  const nBasis = cell.basis.length;
  const nSites = size.reduce((p, q) => p * q, nBasis);
  const maxSites = options.maxSites ?? 1_000_000;
  if (nSites > maxSites)
    throw new SpecError([{ path: '$.lattice.size', message: `${nSites} sites exceed the limit of ${maxSites}` }]);
  const twist = resolveTwist(spec, dim, options.twist);

  const { distances, bonds: cellBonds } = cellShells(cell, shells);
  if (options.distinctPairs ?? true) checkDistinctPairs(cellBonds, size, boundary);

  const sites: Site[] = [];
  const nCells = nSites / nBasis;
  for (let ci = 0; ci < nCells; ci++) {
    const c: number[] = [];
    let rest = ci;
    for (let a = 0; a < dim; a++) {
      c.push(rest % size[a]);
      rest = Math.floor(rest / size[a]);
    }
    for (let s = 0; s < nBasis; s++) {
      let x = cell.basis[s].x;
      let y = cell.basis[s].y;
      for (let a = 0; a < dim; a++) {
        x += c[a] * cell.translations[a][0];
        y += c[a] * cell.translations[a][1];
      }
      sites.push({ index: ci * nBasis + s, x, y, sublattice: s, cell: c.slice() });
    }
  }
  const bonds = layBonds(cellBonds, nBasis, size, boundary);
  const scale = cellScale(cell);
  const planar = spec.kind !== 'custom' || cellNnPlanar(cell, cellBonds);
  return {
    kind: spec.kind,
    size,
    boundary,
    twist,
    translations: cell.translations.map((t) => t.slice()),
    basis: cell.basis.map((b) => ({ ...b })),
    sites,
    bonds,
    paths: options.paths === false ? [] : buildPaths(sites, bonds, scale),
    plaquettes: buildPlaquettes(sites, bonds, scale, planar),
    shellDistances: distances,
    momenta: clusterMomenta(cell.translations, size),
  };
}
