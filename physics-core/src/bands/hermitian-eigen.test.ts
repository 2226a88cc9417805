import { describe, expect, it } from 'vitest';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { mulberry32 } from '../util/random.js';
import { hermitianEigen } from './hermitian-eigen.js';

function randomHermitian(n: number, seed: number): { re: Float64Array; im: Float64Array } {
  const rand = mulberry32(seed);
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    re[i * n + i] = rand() * 2 - 1;
    for (let j = i + 1; j < n; j++) {
      const a = rand() * 2 - 1;
      const b = rand() * 2 - 1;
      re[i * n + j] = a;
      re[j * n + i] = a;
      im[i * n + j] = b;
      im[j * n + i] = -b;
    }
  }
  return { re, im };
}

describe('hermitianEigen (complex Jacobi)', () => {
  for (const [n, seed] of [[2, 1], [3, 2], [6, 3], [9, 4]] as const) {
    it(`agrees with ml-matrix on the real embedding [[Re,−Im],[Im,Re]] (n=${n})`, () => {
      const { re, im } = randomHermitian(n, seed);
      const { values, vectorsRe, vectorsIm, converged } = hermitianEigen(re, im, n);
      expect(converged).toBe(true);
      // Reference: the 2n×2n real symmetric embedding has each eigenvalue twice (ml-matrix).
      const big = Matrix.zeros(2 * n, 2 * n);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          big.set(i, j, re[i * n + j]);
          big.set(i + n, j + n, re[i * n + j]);
          big.set(i, j + n, -im[i * n + j]);
          big.set(i + n, j, im[i * n + j]);
        }
      }
      const ref = new EigenvalueDecomposition(big, { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b);
      for (let k = 0; k < n; k++) {
        expect(values[k]).toBeCloseTo(ref[2 * k], 10);
        expect(values[k]).toBeCloseTo(ref[2 * k + 1], 10);
      }
      // A·v = λ·v and orthonormality of the eigenvectors.
      for (let j = 0; j < n; j++) {
        for (let i = 0; i < n; i++) {
          let sr = 0;
          let si = 0;
          for (let k = 0; k < n; k++) {
            const ar = re[i * n + k], ai = im[i * n + k];
            const xr = vectorsRe[k * n + j], xi = vectorsIm[k * n + j];
            sr += ar * xr - ai * xi;
            si += ar * xi + ai * xr;
          }
          expect(sr).toBeCloseTo(values[j] * vectorsRe[i * n + j], 10);
          expect(si).toBeCloseTo(values[j] * vectorsIm[i * n + j], 10);
        }
        for (let l = 0; l < n; l++) {
          let dr = 0;
          let di = 0;
          for (let k = 0; k < n; k++) {
            dr += vectorsRe[k * n + j] * vectorsRe[k * n + l] + vectorsIm[k * n + j] * vectorsIm[k * n + l];
            di += vectorsRe[k * n + j] * vectorsIm[k * n + l] - vectorsIm[k * n + j] * vectorsRe[k * n + l];
          }
          expect(dr).toBeCloseTo(j === l ? 1 : 0, 12);
          expect(di).toBeCloseTo(0, 12);
        }
      }
    });
  }
});
