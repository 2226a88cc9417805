import { describe, expect, it } from 'vitest';
import { Matrix, solve } from 'ml-matrix';
import { mulberry32 } from '../util/random.js';
import { PhasewrightError } from '../errors.js';
import { checkLbfgsOptions, lbfgs } from './lbfgs.js';

describe('lbfgs', () => {
  it('finds the minimum of the Rosenbrock function at (1, …, 1) with f = 0 (Rosenbrock, Comput. J. 1960)', () => {
    const n = 6;
    const r = lbfgs((x, g) => {
      let f = 0;
      g.fill(0);
      for (let i = 0; i < n - 1; i++) {
        const a = x[i + 1] - x[i] * x[i];
        const b = 1 - x[i];
        f += 100 * a * a + b * b;
        g[i] += -400 * x[i] * a - 2 * b;
        g[i + 1] += 200 * a;
      }
      return f;
    }, new Array(n).fill(-1.2), { maxIterations: 2000, gradientTolerance: 1e-9 });
    expect(r.converged).toBe(true);
    for (const v of r.x) expect(v).toBeCloseTo(1, 6);
    expect(r.f).toBeLessThan(1e-12);
  });

  it('solves a random positive-definite quadratic like ml-matrix solve(A, b)', () => {
    const n = 10;
    const rand = mulberry32(7);
    const B = Matrix.rand(n, n, { random: rand });
    const A = B.transpose().mmul(B).add(Matrix.eye(n).mul(0.5));
    const b = Matrix.columnVector(Array.from({ length: n }, () => rand() - 0.5));
    const ref = solve(A, b).to1DArray();
    const r = lbfgs((x, g) => {
      const xv = Matrix.columnVector(Array.from(x));
      const Ax = A.mmul(xv).to1DArray();
      let f = 0;
      for (let i = 0; i < n; i++) {
        f += 0.5 * x[i] * Ax[i] - b.get(i, 0) * x[i];
        g[i] = Ax[i] - b.get(i, 0);
      }
      return f;
    }, new Array(n).fill(0), { gradientTolerance: 1e-11 });
    expect(r.converged).toBe(true);
    r.x.forEach((v, i) => expect(v).toBeCloseTo(ref[i], 6));
  });

  it('throws instead of stopping silently on a NaN objective', () => {
    expect(() => lbfgs((x, g) => {
      g[0] = 1;
      return x[0] < -0.5 ? Number.NaN : x[0];
    }, [0])).toThrow(PhasewrightError);
  });

  it('rejects bad options with the option named', () => {
    expect(() => checkLbfgsOptions({ memory: 0 })).toThrow(/lbfgs\.memory/);
    expect(() => checkLbfgsOptions({ c1: 0.95 })).toThrow(/lbfgs\.c1/);
  });
});
