import { describe, expect, it } from 'vitest';
import { tridiagonalQl } from './tridiagonal-ql.js';
import { denseSymmetricEigen } from './dense-symmetric.js';
import { mulberry32 } from '../util/random.js';

describe('implicit QL on a symmetric tridiagonal matrix', () => {
  it('reproduces the closed form of the free chain: 2cos(kπ/(n+1)) (a textbook result)', () => {
    const n = 40;
    const d = new Float64Array(n);
    const e = new Float64Array(n).fill(1);
    const z = new Float64Array(n * n);
    for (let i = 0; i < n; i++) z[i * n + i] = 1;
    tridiagonalQl(d, e, z);
    const exact = Array.from({ length: n }, (_, k) => 2 * Math.cos(((k + 1) * Math.PI) / (n + 1))).sort((a, b) => a - b);
    for (let k = 0; k < n; k++) expect(d[k]).toBeCloseTo(exact[k], 12);
  });

  it('dense symmetric eigen: A·v = λ·v and orthonormal vectors on seeded random matrices', () => {
    const rand = mulberry32(7);
    for (const n of [1, 2, 3, 7, 25]) {
      const a = new Float64Array(n * n);
      for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) a[i * n + j] = a[j * n + i] = 2 * rand() - 1;
      const { values, vectors } = denseSymmetricEigen(a, n);
      for (let k = 0; k < n; k++) {
        if (k > 0) expect(values[k]).toBeGreaterThanOrEqual(values[k - 1]);
        for (let i = 0; i < n; i++) {
          let av = 0;
          for (let j = 0; j < n; j++) av += a[i * n + j] * vectors[j * n + k];
          expect(av).toBeCloseTo(values[k] * vectors[i * n + k], 11);
        }
        for (let l = 0; l < n; l++) {
          let dot = 0;
          for (let i = 0; i < n; i++) dot += vectors[i * n + k] * vectors[i * n + l];
          expect(dot).toBeCloseTo(k === l ? 1 : 0, 12);
        }
      }
    }
  });
});
