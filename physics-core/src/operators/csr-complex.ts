import type { FixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import type { SplitPlan } from './matrix-free.js';

/**
 * Compressed sparse rows for the off-diagonal part of H, with the values replaced by a small
 * index into a complex coefficient table (the amplitudes of the model's hop entries); changing
 * amplitudes only rewrites the table. The real diagonal is kept apart.
 *
 * Only the upper triangle (column > row) is stored: H is Hermitian by construction (every hop
 * entry brings its conjugate, directed-terms.ts), so the product adds H[r,c]·x[c] to y[r] and
 * conj(H[r,c])·x[r] to y[c] from one stored element. Half the memory, and measured ~20% faster
 * than the full matrix at 22 sites (bench/ed.bench.ts) since the product is bound by memory traffic.
 *
 * When the coefficient index fits in 8 bits and the column in 24, both share one Int32
 * (column << 8 | index): 4 bytes per stored element and one load in the product (measured
 * ~15–20% faster than separate arrays on the benchmark, bench/ed.bench.ts). Otherwise the column
 * (4 bytes) and the index (1, 2 or 4 bytes) are stored apart.
 */
export interface CsrComplex {
  rowStart: Int32Array;
  /** Stored elements (the upper triangle: half the off-diagonal elements). */
  stored: number;
  /** column << 8 | coefficient index, when `packable`; else null. */
  packed: Int32Array | null;
  column: Int32Array | null;
  coefficient: Uint8Array | Uint16Array | Uint32Array | null;
  nnz: number;
}

export function coefficientIndexBytes(coefficientCount: number): 1 | 2 | 4 {
  return coefficientCount <= 256 ? 1 : coefficientCount <= 65536 ? 2 : 4;
}

export function packable(dimension: number, coefficientCount: number): boolean {
  return coefficientCount <= 256 && dimension <= 2 ** 24;
}

/** Bytes for an operator with `nnz` off-diagonal elements (half of them stored). */
export function csrBytes(dimension: number, nnz: number, coefficientCount: number): number {
  const perElement = packable(dimension, coefficientCount) ? 4 : 4 + coefficientIndexBytes(coefficientCount);
  return 4 * (dimension + 1) + Math.ceil(nnz / 2) * perElement;
}

/**
 * Builds the CSR structure from the split plan (matrix-free.ts): each row's elements are its low
 * pattern's moves, its high pattern's moves, then the crossing moves that apply, so building
 * costs table lookups instead of testing every move on every state. `nnz` (all off-diagonal
 * elements) must be exact; half of them, those above the diagonal, are stored.
 */
export function buildCsr(basis: FixedNumberBasis, plan: SplitPlan, coefficientCount: number, nnz: number): CsrComplex {
  if (nnz > 2 ** 31 - 1) throw new RangeError(`CSR: ${nnz} stored elements exceed 32-bit row pointers`);
  const { states, dimension, rankOfLow, offsetOfHigh } = basis;
  const { nLow, lowMask, lowStart, lowDelta, lowCoef, highStart, highDelta, highCoef } = plan;
  const { crossCount, crossCheck, crossWant, crossFlip, crossCoef } = plan;
  if (nnz % 2 !== 0) throw new Error(`CSR: ${nnz} off-diagonal elements cannot come in conjugate pairs`);
  const stored = nnz / 2;
  const rowStart = new Int32Array(dimension + 1);
  const pack = packable(dimension, coefficientCount);
  const packed = pack ? new Int32Array(stored) : null;
  const column = pack ? null : new Int32Array(stored);
  const bytes = coefficientIndexBytes(coefficientCount);
  const coefficient = pack
    ? null
    : bytes === 1
      ? new Uint8Array(stored)
      : bytes === 2
        ? new Uint16Array(stored)
        : new Uint32Array(stored);
  // Columns and halved (plan) coefficient positions into a scratch row, then stored.
  const rowColumns = new Int32Array(lowStart.length + highStart.length + crossCount + 64);
  const rowCoefs = new Int32Array(rowColumns.length);
  let k = 0;
  let all = 0;
  for (let r = 0; r < dimension; r++) {
    const s = states[r] | 0;
    const lo = s & lowMask;
    const hi = s >>> nLow;
    let n = 0;
    for (let e = lowStart[lo], end = lowStart[lo + 1]; e < end; e++) {
      rowColumns[n] = r + lowDelta[e];
      rowCoefs[n++] = lowCoef[e] >>> 1;
    }
    for (let e = highStart[hi], end = highStart[hi + 1]; e < end; e++) {
      rowColumns[n] = r + highDelta[e];
      rowCoefs[n++] = highCoef[e] >>> 1;
    }
    for (let m = 0; m < crossCount; m++) {
      if ((s & crossCheck[m]) === crossWant[m]) {
        const t = s ^ crossFlip[m];
        rowColumns[n] = offsetOfHigh[t >>> nLow] + rankOfLow[t & lowMask];
        rowCoefs[n++] = crossCoef[m] >>> 1;
      }
    }
    all += n;
    for (let i = 0; i < n; i++) {
      if (rowColumns[i] <= r) continue;
      if (k >= stored) throw new Error(`CSR: more upper-triangle elements than half of the ${nnz} counted`);
      if (packed) packed[k] = (rowColumns[i] << 8) | rowCoefs[i];
      else {
        (column as Int32Array)[k] = rowColumns[i];
        (coefficient as Uint32Array)[k] = rowCoefs[i];
      }
      k++;
    }
    rowStart[r + 1] = k;
  }
  if (all !== nnz || k !== stored) throw new Error(`CSR: found ${all} elements (${k} above the diagonal), expected ${nnz} (${stored})`);
  return { rowStart, stored, packed, column, coefficient, nnz };
}

/**
 * y = (D + A) x for interleaved complex vectors (x[2c] = Re, x[2c+1] = Im); `table` holds the
 * interleaved complex coefficients, `diagonal` the real diagonal. x and y must not alias.
 */
export function csrMatvec(
  csr: CsrComplex,
  table: Float64Array,
  diagonal: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  if (csr.packed) packedHermitianMatvec(csr.rowStart, csr.packed, 8, table, diagonal, x, y);
  else splitMatvec(csr.rowStart, csr.column as Int32Array, csr.coefficient as Uint32Array, table, diagonal, x, y);
}

/**
 * y = (D + A + A†) x from the upper triangle A, each stored element packed as
 * column << bits | coefficient index (interleaved complex `table`): y[r] += t·x[c] and
 * y[c] += conj(t)·x[r]. Shared by the full-basis CSR (8 index bits) and the momentum-sector
 * blocks (symmetry/translation-sectors.ts).
 */
export function packedHermitianMatvec(
  rowStart: Int32Array,
  packed: Int32Array,
  bits: number,
  table: Float64Array,
  diagonal: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  const n = diagonal.length;
  const mask = (1 << bits) - 1;
  initialize(diagonal, x, y);
  let k = 0;
  for (let r = 0; r < n; r++) {
    const x0r = x[2 * r];
    const x0i = x[2 * r + 1];
    let re = 0;
    let im = 0;
    const end = rowStart[r + 1];
    for (; k < end; k++) {
      const p = packed[k];
      const c = (p >>> bits) << 1;
      const q = (p & mask) << 1;
      const tr = table[q];
      const ti = table[q + 1];
      const xr = x[c];
      const xi = x[c + 1];
      re += tr * xr - ti * xi;
      im += tr * xi + ti * xr;
      y[c] += tr * x0r + ti * x0i;
      y[c + 1] += tr * x0i - ti * x0r;
    }
    y[2 * r] += re;
    y[2 * r + 1] += im;
  }
}

function splitMatvec(
  rowStart: Int32Array,
  column: Int32Array,
  coefficient: Uint8Array | Uint16Array | Uint32Array,
  table: Float64Array,
  diagonal: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  const n = diagonal.length;
  initialize(diagonal, x, y);
  let k = 0;
  for (let r = 0; r < n; r++) {
    const x0r = x[2 * r];
    const x0i = x[2 * r + 1];
    let re = 0;
    let im = 0;
    const end = rowStart[r + 1];
    for (; k < end; k++) {
      const c = column[k] << 1;
      const q = coefficient[k] << 1;
      const tr = table[q];
      const ti = table[q + 1];
      const xr = x[c];
      const xi = x[c + 1];
      re += tr * xr - ti * xi;
      im += tr * xi + ti * xr;
      y[c] += tr * x0r + ti * x0i;
      y[c + 1] += tr * x0i - ti * x0r;
    }
    y[2 * r] += re;
    y[2 * r + 1] += im;
  }
}

/** y = D x (the elements above and below the diagonal are added by the row loop). */
function initialize(diagonal: Float64Array, x: Float64Array, y: Float64Array): void {
  const n = diagonal.length;
  for (let r = 0; r < n; r++) {
    const d = diagonal[r];
    y[2 * r] = d * x[2 * r];
    y[2 * r + 1] = d * x[2 * r + 1];
  }
}
