import type { FixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import type { DiagonalTerms, DirectedMoves } from './directed-terms.js';

/**
 * y = (D + A) x without storing A, through the same split of a state into its low and high bits
 * as the basis ranking (fixed-number-basis.ts): s = (hi, lo), rank(s) = offsetOfHigh[hi] + rankOfLow[lo].
 *
 * - A move that touches only low bits keeps hi, so it sends rank r to r + rankOfLow[lo ^ f] −
 *   rankOfLow[lo]: whether it applies and where it lands depend on lo alone. Per low pattern the
 *   plan lists the applicable moves with that rank offset (tables of 2^nLow patterns, a few KB).
 * - A move that touches only high bits keeps lo, so it sends r to r + offsetOfHigh[hi ^ f] −
 *   offsetOfHigh[hi]: listed per high pattern likewise.
 * - The few moves crossing the split (bonds across it, or a conditional hop whose via site lies on
 *   the other side) are tested on every state and ranked on the fly.
 *
 * Per stored element this reads an offset and a coefficient index from small cache-resident
 * tables instead of a column from memory, and the low moves land close to the row in x. The
 * diagonal uses the same split (sums over low-only and high-only terms tabulated).
 */
export interface SplitPlan {
  nLow: number;
  lowMask: number;
  lowStart: Int32Array;
  lowDelta: Int32Array;
  /** 2 × coefficient index (position in the interleaved table). */
  lowCoef: Int32Array;
  highStart: Int32Array;
  highDelta: Int32Array;
  highCoef: Int32Array;
  crossCount: number;
  crossCheck: Int32Array;
  crossWant: Int32Array;
  crossFlip: Int32Array;
  crossCoef: Int32Array;
}

export function buildSplitPlan(basis: FixedNumberBasis, moves: DirectedMoves): SplitPlan {
  const { nLow, lowMask, rankOfLow, offsetOfHigh } = basis;
  const lowSize = lowMask + 1;
  const highSize = offsetOfHigh.length;
  const lowMoves: number[] = [];
  const highMoves: number[] = [];
  const cross: number[] = [];
  for (let d = 0; d < moves.count; d++) {
    const touched = moves.check[d] | moves.flip[d];
    if ((touched & ~lowMask) === 0) lowMoves.push(d);
    else if ((touched & lowMask) === 0) highMoves.push(d);
    else cross.push(d);
  }
  // Low lists.
  const lowStart = new Int32Array(lowSize + 1);
  const lowDelta: number[] = [];
  const lowCoef: number[] = [];
  for (let lo = 0; lo < lowSize; lo++) {
    for (const d of lowMoves) {
      if ((lo & moves.check[d]) === moves.want[d]) {
        lowDelta.push(rankOfLow[lo ^ moves.flip[d]] - rankOfLow[lo]);
        lowCoef.push(2 * moves.coefficient[d]);
      }
    }
    lowStart[lo + 1] = lowDelta.length;
  }
  // High lists (only for high patterns that occur).
  const highStart = new Int32Array(highSize + 1);
  const highDelta: number[] = [];
  const highCoef: number[] = [];
  for (let hi = 0; hi < highSize; hi++) {
    if (offsetOfHigh[hi] >= 0) {
      for (const d of highMoves) {
        const check = moves.check[d] >>> nLow;
        const want = moves.want[d] >>> nLow;
        if ((hi & check) === want) {
          const target = hi ^ (moves.flip[d] >>> nLow);
          highDelta.push(offsetOfHigh[target] - offsetOfHigh[hi]);
          highCoef.push(2 * moves.coefficient[d]);
        }
      }
    }
    highStart[hi + 1] = highDelta.length;
  }
  return {
    nLow,
    lowMask,
    lowStart,
    lowDelta: Int32Array.from(lowDelta),
    lowCoef: Int32Array.from(lowCoef),
    highStart,
    highDelta: Int32Array.from(highDelta),
    highCoef: Int32Array.from(highCoef),
    crossCount: cross.length,
    crossCheck: Int32Array.from(cross.map((d) => moves.check[d])),
    crossWant: Int32Array.from(cross.map((d) => moves.want[d])),
    crossFlip: Int32Array.from(cross.map((d) => moves.flip[d])),
    crossCoef: Int32Array.from(cross.map((d) => 2 * moves.coefficient[d])),
  };
}

/** Bytes of the plan's tables. */
export function splitPlanBytes(plan: SplitPlan): number {
  return (
    plan.lowStart.byteLength +
    plan.lowDelta.byteLength +
    plan.lowCoef.byteLength +
    plan.highStart.byteLength +
    plan.highDelta.byteLength +
    plan.highCoef.byteLength +
    16 * plan.crossCount
  );
}

export function matrixFreeMatvec(
  basis: FixedNumberBasis,
  plan: SplitPlan,
  table: Float64Array,
  diagonal: Float64Array,
  x: Float64Array,
  y: Float64Array,
): void {
  const { states, dimension, rankOfLow, offsetOfHigh } = basis;
  const { nLow, lowMask, lowStart, lowDelta, lowCoef, highStart, highDelta, highCoef } = plan;
  const { crossCount, crossCheck, crossWant, crossFlip, crossCoef } = plan;
  for (let r = 0; r < dimension; r++) {
    const s = states[r] | 0;
    const lo = s & lowMask;
    const hi = s >>> nLow;
    const dr = diagonal[r];
    let re = dr * x[2 * r];
    let im = dr * x[2 * r + 1];
    for (let e = lowStart[lo], end = lowStart[lo + 1]; e < end; e++) {
      const c = (r + lowDelta[e]) << 1;
      const q = lowCoef[e];
      const tr = table[q];
      const ti = table[q + 1];
      const xr = x[c];
      const xi = x[c + 1];
      re += tr * xr - ti * xi;
      im += tr * xi + ti * xr;
    }
    for (let e = highStart[hi], end = highStart[hi + 1]; e < end; e++) {
      const c = (r + highDelta[e]) << 1;
      const q = highCoef[e];
      const tr = table[q];
      const ti = table[q + 1];
      const xr = x[c];
      const xi = x[c + 1];
      re += tr * xr - ti * xi;
      im += tr * xi + ti * xr;
    }
    for (let m = 0; m < crossCount; m++) {
      if ((s & crossCheck[m]) === crossWant[m]) {
        const t = s ^ crossFlip[m];
        const c = (offsetOfHigh[t >>> nLow] + rankOfLow[t & lowMask]) << 1;
        const q = crossCoef[m];
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

/**
 * diagonal[r] = Σ value over diagonal terms whose sites are all occupied in states[r], with the
 * terms inside the low or the high bits summed once per pattern (tables of 2^nLow and 2^nHigh).
 */
export function fillDiagonalSplit(basis: FixedNumberBasis, terms: DiagonalTerms, diagonal: Float64Array): void {
  const { states, nLow, lowMask, offsetOfHigh } = basis;
  const lowSize = lowMask + 1;
  const highSize = offsetOfHigh.length;
  const lowSum = new Float64Array(lowSize);
  const highSum = new Float64Array(highSize);
  const crossMask: number[] = [];
  const crossValue: number[] = [];
  for (let k = 0; k < terms.count; k++) {
    const m = terms.mask[k];
    const v = terms.value[k];
    if ((m & ~lowMask) === 0) {
      for (let lo = 0; lo < lowSize; lo++) if ((lo & m) === m) lowSum[lo] += v;
    } else if ((m & lowMask) === 0) {
      const mh = m >>> nLow;
      for (let hi = 0; hi < highSize; hi++) if ((hi & mh) === mh) highSum[hi] += v;
    } else {
      crossMask.push(m);
      crossValue.push(v);
    }
  }
  const cm = Int32Array.from(crossMask);
  const cv = Float64Array.from(crossValue);
  const nc = cm.length;
  for (let r = 0; r < states.length; r++) {
    const s = states[r] | 0;
    let d = lowSum[s & lowMask] + highSum[s >>> nLow];
    for (let k = 0; k < nc; k++) {
      const m = cm[k];
      if ((s & m) === m) d += cv[k];
    }
    diagonal[r] = d;
  }
}
