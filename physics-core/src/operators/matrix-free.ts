import type { FixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import type { DirectedMoves } from './directed-terms.js';

/**
 * y = (D + A) x without storing A: every row tests every directed move against the state's bits
 * and ranks the target on the fly. Uses only the basis and the move list (a few KB), at the cost
 * of ~#moves bit tests per row; the fallback when CSR would exceed the memory budget.
 */
export function matrixFreeMatvec(
  basis: FixedNumberBasis,
  moves: DirectedMoves,
  table: Float64Array,
  diagonal: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  const { states, dimension, nLow, lowMask, rankOfLow, offsetOfHigh } = basis;
  const { count, check, want, flip, coefficient } = moves;
  for (let r = 0; r < dimension; r++) {
    const s = states[r] | 0;
    const dr = diagonal[r];
    let re = dr * x[2 * r];
    let im = dr * x[2 * r + 1];
    for (let d = 0; d < count; d++) {
      if ((s & check[d]) === want[d]) {
        const t = s ^ flip[d];
        const c = (offsetOfHigh[t >>> nLow] + rankOfLow[t & lowMask]) << 1;
        const q = coefficient[d] << 1;
        const tr = table[q];
        const ti = table[q + 1];
        const xr = x[c];
        const xi = x[c + 1];
        re += tr * xr - ti * xi;
        im += tr * xi + ti * xr;
      }
    }
    y[2 * r] = re;
    y[2 * r + 1] = im;
  }
}
