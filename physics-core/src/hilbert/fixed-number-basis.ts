import { SizeError } from '../errors.js';

/**
 * Hilbert space of hardcore bosons on `nSites` ≤ 32 sites at a fixed particle number: every
 * basis state is a bit string (bit i set ⇔ site i occupied) stored as an unsigned 32-bit integer.
 * States are enumerated in increasing numeric order; the rank of a state is found with two
 * lookup tables over the high and the low half of its bits (for states of fixed popcount,
 * ascending order groups states by their high half, and within a group the low halves all share
 * one popcount):
 *
 *   rank(s) = offsetOfHigh[s >>> nLow] + rankOfLow[s & lowMask]
 *
 * where rankOfLow[lo] is the position of `lo` among low patterns with the same popcount, and
 * offsetOfHigh[hi] counts the states whose high half is numerically smaller than `hi`.
 * Both tables hold at most 2^16 entries.
 */
export interface FixedNumberBasis {
  readonly nSites: number;
  readonly nParticles: number;
  readonly dimension: number;
  /** Basis states in increasing order. */
  readonly states: Uint32Array;
  readonly nLow: number;
  readonly lowMask: number;
  /** Indexed by the low half; position among low patterns of the same popcount. */
  readonly rankOfLow: Int32Array;
  /** Indexed by the high half; number of states with a smaller high half (−1 if none fit). */
  readonly offsetOfHigh: Int32Array;
}

/** Binomial coefficient as a double (exact below 2^53). */
export function binomial(n: number, k: number): number {
  if (k < 0 || k > n || n < 0) return 0;
  const kk = Math.min(k, n - k);
  let r = 1;
  for (let i = 1; i <= kk; i++) r = (r * (n - kk + i)) / i;
  return Math.round(r);
}

/** Bytes that `buildFixedNumberBasis` will allocate. */
export function estimateBasisBytes(nSites: number, nParticles: number): number {
  const nLow = nSites >>> 1;
  const nHigh = nSites - nLow;
  return 4 * binomial(nSites, nParticles) + 4 * (2 ** nLow + 2 ** nHigh);
}

/** Number of set bits of a 32-bit integer. */
export function popcount32(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24);
}

/** Largest basis we accept regardless of budget: ranks and CSR row pointers are 32-bit signed. */
const MAX_DIMENSION = 2 ** 31 - 1;

export function buildFixedNumberBasis(
  nSites: number,
  nParticles: number,
  memoryBudgetBytes = Number.POSITIVE_INFINITY,
): FixedNumberBasis {
  if (!Number.isInteger(nSites) || nSites < 1 || nSites > 32) {
    throw new RangeError(`hardcore basis: nSites must be an integer in 1..32, got ${nSites}`);
  }
  if (!Number.isInteger(nParticles) || nParticles < 0 || nParticles > nSites) {
    throw new RangeError(`hardcore basis: nParticles must be an integer in 0..${nSites}, got ${nParticles}`);
  }
  const dimension = binomial(nSites, nParticles);
  const bytes = estimateBasisBytes(nSites, nParticles);
  if (dimension > MAX_DIMENSION || bytes > memoryBudgetBytes) {
    throw new SizeError(
      `basis of ${nParticles} hardcore bosons on ${nSites} sites has ${dimension} states ` +
        `(${formatBytes(bytes)} for the basis alone), above the memory budget of ` +
        `${formatBytes(memoryBudgetBytes)}; raise memoryBudgetBytes (CLI: --memory-budget) or use a smaller cluster`,
      undefined,
      { dimension, bytes, budget: memoryBudgetBytes },
    );
  }
  const nLow = nSites >>> 1;
  const nHigh = nSites - nLow;
  const lowSize = 2 ** nLow;
  const highSize = 2 ** nHigh;
  const lowMask = nLow === 0 ? 0 : lowSize - 1;

  // Low patterns grouped by popcount, each group ascending.
  const rankOfLow = new Int32Array(lowSize);
  const groupCount = new Int32Array(nLow + 1);
  for (let lo = 0; lo < lowSize; lo++) {
    const c = popcount32(lo);
    rankOfLow[lo] = groupCount[c];
    groupCount[c]++;
  }
  const groupStart = new Int32Array(nLow + 2);
  for (let c = 0; c <= nLow; c++) groupStart[c + 1] = groupStart[c] + groupCount[c];
  const lowByCount = new Int32Array(lowSize);
  for (let lo = 0; lo < lowSize; lo++) {
    const c = popcount32(lo);
    lowByCount[groupStart[c] + rankOfLow[lo]] = lo;
  }

  const states = new Uint32Array(dimension);
  const offsetOfHigh = new Int32Array(highSize);
  let n = 0;
  for (let hi = 0; hi < highSize; hi++) {
    const need = nParticles - popcount32(hi);
    if (need < 0 || need > nLow) {
      offsetOfHigh[hi] = -1;
      continue;
    }
    offsetOfHigh[hi] = n;
    // hi * 2^nLow as a double keeps bit 31 without sign trouble.
    const base = hi * lowSize;
    for (let g = groupStart[need]; g < groupStart[need + 1]; g++) states[n++] = base + lowByCount[g];
  }
  if (n !== dimension) throw new Error(`hardcore basis: enumerated ${n} states, expected ${dimension}`);
  return { nSites, nParticles, dimension, states, nLow, lowMask, rankOfLow, offsetOfHigh };
}

/** Index of `state` (a bit string with the basis' particle number) in the basis. */
export function rankState(basis: FixedNumberBasis, state: number): number {
  return basis.offsetOfHigh[state >>> basis.nLow] + basis.rankOfLow[state & basis.lowMask];
}

export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes)) return 'unlimited';
  if (bytes >= 2 ** 30) return `${(bytes / 2 ** 30).toFixed(2)} GiB`;
  if (bytes >= 2 ** 20) return `${(bytes / 2 ** 20).toFixed(1)} MiB`;
  return `${(bytes / 1024).toFixed(1)} KiB`;
}
