import { describe, expect, it } from 'vitest';
import { plainLanczos } from './plain-lanczos.js';
import { dotc, norm2 } from './complex-vector.js';
import { EdOperator } from '../operators/ed-operator.js';
import { denseFromMatvec, denseHermitianEigen, randomModel } from '../ed/test-models.js';

/** Diagonal operator: its eigenvalues are the given values by construction. */
function diagonalOperator(values: number[]): (x: Float64Array, y: Float64Array) => void {
  return (x, y) => {
    for (let r = 0; r < values.length; r++) {
      y[2 * r] = values[r] * x[2 * r];
      y[2 * r + 1] = values[r] * x[2 * r + 1];
    }
  };
}

describe('Lanczos without reorthogonalization', () => {
  it('matches ml-matrix dense eigenvalues on random complex models, with stored and with recomputed vectors', () => {
    for (const [seed, L, N, k] of [
      [1, 9, 4, 2],
      [2, 10, 3, 4],
      [3, 8, 4, 3],
    ]) {
      const op = new EdOperator(randomModel(seed, L, N));
      const n = op.dimension;
      const { re, im } = denseFromMatvec((x, y) => op.matvec(x, y), n);
      const dense = denseHermitianEigen(re, im, n).values;
      const stored = plainLanczos((x, y) => op.matvec(x, y), n, { states: k, seed });
      const recomputed = plainLanczos((x, y) => op.matvec(x, y), n, { states: k, seed, vectorStoreBytes: 5 * 16 * n });
      expect(recomputed.storedVectors).toBeLessThan(recomputed.steps);
      expect(recomputed.secondPassIterations).toBeGreaterThan(0);
      for (const res of [stored, recomputed]) {
        expect(res.converged).toBe(true);
        expect(res.residual).toBeLessThan(1e-10);
        for (let i = 0; i < k; i++) expect(res.values[i]).toBeCloseTo(dense[i], 9);
        const h = new Float64Array(2);
        for (let i = 0; i < k; i++) {
          for (let j = 0; j < k; j++) {
            dotc(res.vectors[i], res.vectors[j], h);
            expect(Math.hypot(h[0] - (i === j ? 1 : 0), h[1])).toBeLessThan(1e-9);
          }
          const y = new Float64Array(2 * n);
          op.matvec(res.vectors[i], y);
          for (let q = 0; q < 2 * n; q++) y[q] -= res.values[i] * res.vectors[i][q];
          expect(norm2(y)).toBeLessThan(1e-8);
        }
      }
      // The second pass repeats the recurrence exactly: same vectors to rounding.
      for (let i = 0; i < k; i++) {
        const h = new Float64Array(2);
        dotc(stored.vectors[i], recomputed.vectors[i], h);
        expect(Math.hypot(h[0], h[1])).toBeCloseTo(1, 12);
      }
    }
  });

  it('does not report ghost copies of a converged level as a degeneracy (isolated ground level, slow cluster above)', () => {
    // Spectrum: −10 alone, then 0, 0.02 and 400 levels in [0.1, 1]: the ground level converges
    // within a few steps, loses orthogonality and grows copies while the next two still converge.
    const n = 403;
    const values = [-10, 0, 0.02, ...Array.from({ length: n - 3 }, (_, i) => 0.1 + (0.9 * i) / (n - 4))];
    const res = plainLanczos(diagonalOperator(values), n, { states: 3, tolerance: 1e-11 });
    expect(res.converged).toBe(true);
    expect(res.values[0]).toBeCloseTo(-10, 12);
    expect(res.values[1]).toBeCloseTo(values[1], 10);
    expect(res.values[2]).toBeCloseTo(values[2], 10);
    expect(res.steps).toBeGreaterThan(40);
  });

  it('closes on an invariant subspace with exact values (free space smaller than the request)', () => {
    const res = plainLanczos(diagonalOperator([3, 1, 2]), 3, { states: 3 });
    expect(res.invariant).toBe(true);
    expect(res.values.map((v) => Number(v.toFixed(12)))).toEqual([1, 2, 3]);
  });
});
