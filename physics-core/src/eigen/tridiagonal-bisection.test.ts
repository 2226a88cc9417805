import { describe, expect, it } from 'vitest';
import { sturmCount, tridiagonalEigenvalue, tridiagonalEigenvector } from './tridiagonal-bisection.js';

describe('tridiagonal bisection and inverse iteration', () => {
  // T = tridiag(1, 0, 1) of order m has eigenvalues 2cos(jπ/(m+1)) and eigenvectors
  // u_i ∝ sin(ijπ/(m+1)), i, j = 1..m (standard result, e.g. Golub & Van Loan, "Matrix Computations", §4.8).
  const m = 40;
  const a = new Float64Array(m);
  const b = new Float64Array(m).fill(1);
  const exact = Array.from({ length: m }, (_, j) => 2 * Math.cos(((j + 1) * Math.PI) / (m + 1))).sort((x, y) => x - y);

  it('counts and finds every eigenvalue of the free-chain matrix', () => {
    for (let j = 0; j < m; j++) expect(tridiagonalEigenvalue(a, b, m, j)).toBeCloseTo(exact[j], 14);
    expect(sturmCount(a, b, m, 0)).toBe(m / 2);
    expect(sturmCount(a, b, m, -3)).toBe(0);
    // without its first row and column T is the same matrix of order m − 1
    expect(sturmCount(a, b, m, 2 * Math.cos(Math.PI / m) + 1e-9, 1)).toBe(m - 1);
    expect(sturmCount(a, b, m, 2 * Math.cos(Math.PI / m) - 1e-9, 1)).toBe(m - 2);
  });

  it('inverse iteration gives the sine eigenvectors', () => {
    const u = new Float64Array(m);
    for (const j of [1, 2, 20]) {
      const theta = 2 * Math.cos((j * Math.PI) / (m + 1));
      tridiagonalEigenvector(a, b, m, theta, u);
      let norm = 0;
      for (let i = 1; i <= m; i++) norm += Math.sin((i * j * Math.PI) / (m + 1)) ** 2;
      const sign = Math.sign(u[0]);
      for (let i = 1; i <= m; i++) expect(sign * u[i - 1]).toBeCloseTo(Math.sin((i * j * Math.PI) / (m + 1)) / Math.sqrt(norm), 10);
    }
  });
});
