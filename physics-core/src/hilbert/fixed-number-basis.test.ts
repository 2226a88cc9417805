import { describe, expect, it } from 'vitest';
import { binomial, buildFixedNumberBasis, popcount32, rankState } from './fixed-number-basis.js';
import { SizeError } from '../errors.js';

describe('fixed-number hardcore basis', () => {
  it('enumerates C(L, N) states in increasing order with the right popcount and ranks them back', () => {
    for (const [L, N] of [
      [1, 0],
      [1, 1],
      [5, 2],
      [8, 4],
      [11, 3],
      [16, 8],
    ]) {
      const b = buildFixedNumberBasis(L, N);
      expect(b.dimension).toBe(binomial(L, N));
      let bad = 0;
      for (let r = 0; r < b.dimension; r++) {
        if (popcount32(b.states[r]) !== N) bad++;
        if (r > 0 && !(b.states[r] > b.states[r - 1])) bad++;
        if (rankState(b, b.states[r] | 0) !== r) bad++;
      }
      expect(bad).toBe(0);
    }
  });

  it('handles 32 sites (bit 31) with unsigned states', () => {
    // C(32, 1) = 32 and C(32, 31) = 32: the highest state uses bit 31.
    for (const N of [1, 31]) {
      const b = buildFixedNumberBasis(32, N);
      expect(b.dimension).toBe(32);
      const last = b.states[b.dimension - 1];
      expect(last).toBeGreaterThanOrEqual(2 ** 31);
      for (let r = 0; r < b.dimension; r++) expect(rankState(b, b.states[r] | 0)).toBe(r);
    }
  });

  it('counts match the binomial table (Pascal identity, an outside check)', () => {
    for (let n = 1; n < 30; n++) for (let k = 1; k < n; k++) expect(binomial(n, k)).toBe(binomial(n - 1, k - 1) + binomial(n - 1, k));
  });

  it('refuses above the memory budget with the estimate in the message', () => {
    expect(() => buildFixedNumberBasis(30, 15, 1e6)).toThrow(SizeError);
    expect(() => buildFixedNumberBasis(30, 15, 1e6)).toThrow(/155117520 states.*memoryBudgetBytes/);
  });
});
