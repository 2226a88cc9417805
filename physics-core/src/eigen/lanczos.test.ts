import { describe, expect, it } from 'vitest';
import { lanczos } from './lanczos.js';
import { lowestEigenpairs } from './lowest-eigenpairs.js';
import { dotc, norm2 } from './complex-vector.js';
import { EdOperator } from '../operators/ed-operator.js';
import { chainModel, denseFromMatvec, denseHermitianEigen, randomModel } from '../ed/test-models.js';

describe('thick-restart Lanczos', () => {
  it('matches ml-matrix dense eigenvalues on random complex models with conditional hops', () => {
    for (const [seed, L, N, k] of [
      [1, 8, 4, 2],
      [2, 9, 3, 4],
      [3, 9, 4, 3],
      [4, 5, 2, 2],
    ]) {
      const op = new EdOperator(randomModel(seed, L, N));
      const n = op.dimension;
      const { re, im } = denseFromMatvec((x, y) => op.matvec(x, y), n);
      const dense = denseHermitianEigen(re, im, n).values;
      const res = lanczos((x, y) => op.matvec(x, y), n, { states: k, windowSize: 12, seed });
      expect(res.converged).toBe(true);
      expect(res.residual).toBeLessThan(1e-10);
      for (let i = 0; i < k; i++) expect(res.values[i]).toBeCloseTo(dense[i], 9);
      // orthonormal Ritz vectors and H x = θ x
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
  });

  it('finds exact degeneracies when the window covers the whole space (free ring, degenerate levels)', () => {
    // Free hardcore bosons on a 6-ring with 1 particle: E = −2cos(2πm/6), levels ±1 twice degenerate.
    const op = new EdOperator(chainModel({ L: 6, N: 1, periodic: true }));
    const res = lanczos((x, y) => op.matvec(x, y), 6, { states: 6 });
    const exact = [0, 1, 2, 3, 4, 5].map((m) => -2 * Math.cos((2 * Math.PI * m) / 6)).sort((a, b) => a - b);
    for (let i = 0; i < 6; i++) expect(res.values[i]).toBeCloseTo(exact[i], 12);
  });

  it('lowestEigenpairs recovers a degenerate copy single-vector Lanczos misses (30-ring, 1 particle, twist π: −2cos((2m+1)π/30), each level twice)', () => {
    const op = new EdOperator(chainModel({ L: 30, N: 1, periodic: true, twist: Math.PI }));
    const exact = [-2 * Math.cos(Math.PI / 30), -2 * Math.cos(Math.PI / 30), -2 * Math.cos((3 * Math.PI) / 30)];
    const res = lowestEigenpairs((x, y) => op.matvec(x, y), 30, { states: 3 });
    expect(res.converged).toBe(true);
    for (let i = 0; i < 3; i++) expect(res.values[i]).toBeCloseTo(exact[i], 11);
    const h = new Float64Array(2);
    dotc(res.vectors[0], res.vectors[1], h);
    expect(Math.hypot(h[0], h[1])).toBeLessThan(1e-9);
  });

  it('lowestEigenpairs diagonalizes tiny spaces densely: a 2×2 zero block gives both levels (0, 0) with orthonormal vectors (invariant)', () => {
    const res = lowestEigenpairs((x, y) => y.fill(0 * x[0]), 2, { states: 2 });
    expect(res.converged).toBe(true);
    expect(res.values).toEqual([0, 0]);
    const [u, v] = res.vectors;
    const dot = (a: Float64Array, b: Float64Array) => [a[0] * b[0] + a[1] * b[1] + a[2] * b[2] + a[3] * b[3], a[0] * b[1] - a[1] * b[0] + a[2] * b[3] - a[3] * b[2]];
    expect(dot(u, u)[0]).toBeCloseTo(1, 12);
    expect(dot(v, v)[0]).toBeCloseTo(1, 12);
    expect(Math.hypot(...dot(u, v))).toBeLessThan(1e-12);
  });

  it('is deterministic for a seed, and a warm start from the answer converges at once', () => {
    const op = new EdOperator(randomModel(9, 12, 6));
    const n = op.dimension;
    const a = lanczos((x, y) => op.matvec(x, y), n, { states: 1, seed: 5 });
    const b = lanczos((x, y) => op.matvec(x, y), n, { states: 1, seed: 5 });
    expect(b.values).toEqual(a.values);
    expect(b.iterations).toBe(a.iterations);
    const warm = lanczos((x, y) => op.matvec(x, y), n, { states: 1, startVector: a.vectors[0] });
    expect(warm.values[0]).toBeCloseTo(a.values[0], 10);
    expect(warm.iterations).toBeLessThan(a.iterations);
  });

  it('throws instead of stopping silently on NaN', () => {
    expect(() =>
      lanczos((x, y) => {
        y.set(x);
        y[0] = Number.NaN;
      }, 50),
    ).toThrow(/NaN/);
  });
});
