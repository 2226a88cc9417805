/**
 * Supercells of a Bravais lattice in unit-cell coordinates: the periodicity of a mean-field
 * ansatz. A supercell is an integer matrix whose columns are the supercell vectors (in units of
 * the primitive translations): `[2, 1]` is the diagonal 2×1 cell, `[[1, -1], [1, 2]]` gives the
 * vectors (1,1) and (−1,2), and `'sqrt3'` picks a √3×√3 cell on lattices with hexagonal symmetry.
 */
import { PhasewrightError } from '../errors.js';

export type SupercellSpec = number[] | number[][] | 'sqrt3';

export interface Supercell {
  /** Number of lattice axes (1 or 2). */
  dim: number;
  /** matrix[a][j]: component along primitive axis a of supercell vector j. */
  matrix: number[][];
  /** |det matrix| = number of unit cells in the supercell. */
  cells: number;
  /** Unit cells of the home supercell (canonical representatives), in a fixed order. */
  homeCells: number[][];
  /** Smallest k per axis with k·e_a a supercell translation. */
  period: number[];
}

const EPS = 1e-9;

function inverse(m: number[][]): number[][] {
  if (m.length === 1) return [[1 / m[0][0]]];
  const det = m[0][0] * m[1][1] - m[0][1] * m[1][0];
  return [
    [m[1][1] / det, -m[0][1] / det],
    [-m[1][0] / det, m[0][0] / det],
  ];
}

function mul(m: number[][], v: number[]): number[] {
  return m.map((row) => row.reduce((s, x, j) => s + x * v[j], 0));
}

/** Resolves a supercell spec for a lattice with the given primitive translations. */
export function resolveSupercell(
  spec: SupercellSpec | undefined,
  translations: number[][],
  path = '$.supercell',
): Supercell {
  const dim = translations.length;
  let matrix: number[][];
  if (spec === undefined) {
    matrix = Array.from({ length: dim }, (_, a) => Array.from({ length: dim }, (_, j) => (a === j ? 1 : 0)));
  } else if (spec === 'sqrt3') {
    matrix = sqrt3Matrix(translations, path);
  } else if (Array.isArray(spec) && spec.every((x) => typeof x === 'number')) {
    const diag = spec as number[];
    if (diag.length !== dim) {
      throw new PhasewrightError(`needs ${dim} entries (one per lattice axis), got ${diag.length}`, 'options', path);
    }
    matrix = Array.from({ length: dim }, (_, a) => Array.from({ length: dim }, (_, j) => (a === j ? diag[a] : 0)));
  } else if (Array.isArray(spec) && spec.every((v) => Array.isArray(v))) {
    const vectors = spec as number[][];
    if (vectors.length !== dim || vectors.some((v) => v.length !== dim)) {
      throw new PhasewrightError(`needs ${dim} vectors of ${dim} integers (one per lattice axis)`, 'options', path);
    }
    matrix = Array.from({ length: dim }, (_, a) => vectors.map((v) => v[a]));
  } else {
    throw new PhasewrightError('must be a list of cell counts, a list of integer vectors, or "sqrt3"', 'options', path);
  }
  for (const row of matrix) {
    for (const x of row) {
      if (!Number.isInteger(x)) throw new PhasewrightError(`entries must be integers (got ${x})`, 'options', path);
    }
  }
  const det = dim === 1 ? matrix[0][0] : matrix[0][0] * matrix[1][1] - matrix[0][1] * matrix[1][0];
  if (det === 0) throw new PhasewrightError('supercell vectors are linearly dependent', 'options', path);
  const cells = Math.abs(det);
  if (cells > 64) throw new PhasewrightError(`supercell of ${cells} unit cells is larger than the limit of 64`, 'options', path);
  const inv = inverse(matrix);
  const period: number[] = [];
  for (let a = 0; a < dim; a++) {
    let k = 1;
    for (; k <= cells; k++) {
      const e = Array.from({ length: dim }, (_, b) => (b === a ? k : 0));
      const f = mul(inv, e);
      if (f.every((x) => Math.abs(x - Math.round(x)) < EPS)) break;
    }
    period.push(k);
  }
  const sc: Supercell = { dim, matrix, cells, homeCells: [], period };
  // Enumerate the canonical representatives inside the bounding box of the parallelogram.
  const lo = new Array<number>(dim).fill(0);
  const hi = new Array<number>(dim).fill(0);
  for (let mask = 0; mask < 1 << dim; mask++) {
    for (let a = 0; a < dim; a++) {
      let s = 0;
      for (let j = 0; j < dim; j++) if (mask & (1 << j)) s += matrix[a][j];
      lo[a] = Math.min(lo[a], s);
      hi[a] = Math.max(hi[a], s);
    }
  }
  const visit = (prefix: number[]): void => {
    if (prefix.length === dim) {
      const r = reduceCell(sc, prefix);
      if (r.every((x, a) => x === prefix[a])) sc.homeCells.push(prefix);
      return;
    }
    const a = prefix.length;
    for (let c = lo[a]; c <= hi[a]; c++) visit([...prefix, c]);
  };
  visit([]);
  if (sc.homeCells.length !== cells) {
    throw new PhasewrightError(`internal: found ${sc.homeCells.length} home cells for ${cells}`, 'internal', path);
  }
  return sc;
}

/** The canonical representative of `cell` modulo the supercell translations. */
export function reduceCell(sc: Supercell, cell: number[]): number[] {
  const inv = inverse(sc.matrix);
  const f = mul(inv, cell);
  const m = f.map((x) => Math.floor(x + EPS));
  const shift = mul(sc.matrix, m);
  return cell.map((c, a) => Math.round(c - shift[a]));
}

/** √3×√3 supercell vectors: two integer combinations of length √3·|a| with determinant 3. */
function sqrt3Matrix(translations: number[][], path: string): number[][] {
  if (translations.length !== 2) throw new PhasewrightError('"sqrt3" needs a two-dimensional lattice', 'options', path);
  const [t1, t2] = translations;
  const l1 = Math.hypot(t1[0], t1[1]);
  const l2 = Math.hypot(t2[0], t2[1]);
  const cos = (t1[0] * t2[0] + t1[1] * t2[1]) / (l1 * l2);
  if (Math.abs(l1 - l2) > 1e-6 * l1 || Math.abs(Math.abs(cos) - 0.5) > 1e-6) {
    throw new PhasewrightError('"sqrt3" needs a lattice with hexagonal symmetry (equal translations at 60° or 120°)', 'options', path);
  }
  const candidates: number[][] = [];
  for (let p = -2; p <= 2; p++) {
    for (let q = -2; q <= 2; q++) {
      const x = p * t1[0] + q * t2[0];
      const y = p * t1[1] + q * t2[1];
      if (Math.abs(x * x + y * y - 3 * l1 * l1) < 1e-6 * l1 * l1) candidates.push([p, q]);
    }
  }
  for (const u of candidates) {
    for (const v of candidates) {
      if (u[0] * v[1] - u[1] * v[0] === 3) return [[u[0], v[0]], [u[1], v[1]]];
    }
  }
  throw new PhasewrightError('no √3×√3 cell found for this lattice', 'options', path);
}

/**
 * Momenta compatible with the supercell (q·R ∈ 2πℤ for every supercell translation R), as
 * Cartesian [qx, qy], reduced to one representative per reciprocal-lattice class.
 */
export function supercellMomenta(sc: Supercell, translations: number[][]): number[][] {
  const recip = reciprocal(translations);
  const out: number[][] = [];
  const n = sc.cells;
  // k (in reciprocal-basis coordinates) is allowed iff Mᵀ k ∈ ℤ^d; candidates on the 1/n grid.
  const visit = (prefix: number[]): void => {
    if (prefix.length === sc.dim) {
      const k = prefix.map((p) => p / n);
      let ok = true;
      for (let j = 0; j < sc.dim && ok; j++) {
        let s = 0;
        for (let a = 0; a < sc.dim; a++) s += sc.matrix[a][j] * k[a];
        ok = Math.abs(s - Math.round(s)) < EPS;
      }
      if (ok) {
        let qx = 0;
        let qy = 0;
        for (let a = 0; a < sc.dim; a++) {
          qx += k[a] * recip[a][0];
          qy += k[a] * recip[a][1];
        }
        out.push([qx, qy]);
      }
      return;
    }
    for (let p = 0; p < n; p++) visit([...prefix, p]);
  };
  visit([]);
  return out;
}

/** Reciprocal vectors G_a with G_a·T_b = 2π δ_ab (1D: along the translation). */
export function reciprocal(translations: number[][]): number[][] {
  if (translations.length === 1) {
    const [tx, ty] = translations[0];
    const l2 = tx * tx + ty * ty;
    return [[(2 * Math.PI * tx) / l2, (2 * Math.PI * ty) / l2]];
  }
  const [[ax, ay], [bx, by]] = translations;
  const det = ax * by - ay * bx;
  return [
    [(2 * Math.PI * by) / det, (-2 * Math.PI * bx) / det],
    [(-2 * Math.PI * ay) / det, (2 * Math.PI * ax) / det],
  ];
}

/** Cell displacement (integers per axis) of a Cartesian displacement between basis sites. */
export function cellDisplacement(translations: number[][], dx: number, dy: number): number[] {
  const recip = reciprocal(translations);
  return recip.map((g) => Math.round((g[0] * dx + g[1] * dy) / (2 * Math.PI)));
}
