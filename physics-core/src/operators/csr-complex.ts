import type { FixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import type { DirectedMoves } from './directed-terms.js';

/**
 * Compressed sparse rows for the off-diagonal part of H, with the values replaced by a small
 * index into a complex coefficient table (the amplitudes of the model's hop entries). A stored
 * element costs 4 bytes (column) + 1, 2 or 4 bytes (coefficient index) instead of 4 + 16, and
 * changing amplitudes only rewrites the table. The real diagonal is kept apart.
 */
export interface CsrComplex {
  rowStart: Int32Array;
  column: Int32Array;
  coefficient: Uint8Array | Uint16Array | Uint32Array;
  nnz: number;
}

export function coefficientIndexBytes(coefficientCount: number): 1 | 2 | 4 {
  return coefficientCount <= 256 ? 1 : coefficientCount <= 65536 ? 2 : 4;
}

export function csrBytes(dimension: number, nnz: number, coefficientCount: number): number {
  return 4 * (dimension + 1) + nnz * (4 + coefficientIndexBytes(coefficientCount));
}

/** Builds the CSR structure; `nnz` must be the exact count (see countMoves). */
export function buildCsr(basis: FixedNumberBasis, moves: DirectedMoves, nnz: number): CsrComplex {
  if (nnz > 2 ** 31 - 1) throw new RangeError(`CSR: ${nnz} stored elements exceed 32-bit row pointers`);
  const { states, dimension, nLow, lowMask, rankOfLow, offsetOfHigh } = basis;
  const rowStart = new Int32Array(dimension + 1);
  const column = new Int32Array(nnz);
  const bytes = coefficientIndexBytes(moves.coefficientCount);
  const coefficient =
    bytes === 1 ? new Uint8Array(nnz) : bytes === 2 ? new Uint16Array(nnz) : new Uint32Array(nnz);
  const { count, check, want, flip } = moves;
  const coef = moves.coefficient;
  let k = 0;
  for (let r = 0; r < dimension; r++) {
    const s = states[r] | 0;
    for (let d = 0; d < count; d++) {
      if ((s & check[d]) === want[d]) {
        const t = s ^ flip[d];
        column[k] = offsetOfHigh[t >>> nLow] + rankOfLow[t & lowMask];
        coefficient[k] = coef[d];
        k++;
      }
    }
    rowStart[r + 1] = k;
  }
  if (k !== nnz) throw new Error(`CSR: filled ${k} elements, expected ${nnz}`);
  return { rowStart, column, coefficient, nnz };
}

/**
 * y = (D + A) x for interleaved complex vectors (x[2c] = Re, x[2c+1] = Im); `table` holds the
 * interleaved complex coefficients, `diagonal` the real diagonal.
 */
export function csrMatvec(
  csr: CsrComplex,
  table: Float64Array,
  diagonal: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  const { rowStart, column, coefficient } = csr;
  const n = diagonal.length;
  let k = 0;
  for (let r = 0; r < n; r++) {
    const dr = diagonal[r];
    let re = dr * x[2 * r];
    let im = dr * x[2 * r + 1];
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
    }
    y[2 * r] = re;
    y[2 * r + 1] = im;
  }
}
