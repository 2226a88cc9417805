import { compileModel, parseModelSpec } from '@phasewright/physics-core';
import { describe, expect, it } from 'vitest';
import { BROWSER_LIMIT_BYTES, estimateEdSize, formatBytes, formatCount } from './size-estimate.js';

const chain = (L: number) =>
  compileModel(
    parseModelSpec({
      spec: 'phasewright.model/1',
      lattice: { kind: 'chain', size: [L], boundary: ['periodic'] },
      particles: { kind: 'hardcore', filling: 0.5 },
      parameters: { J: 1 },
      terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J' }],
    }),
  );

describe('ED size estimate', () => {
  it('dimension is the binomial coefficient C(L, L/2)', () => {
    // C(16, 8) = 12870, C(24, 12) = 2704156 (binomial coefficients, any table).
    expect(estimateEdSize(chain(16)).dimension).toBe(12870);
    expect(estimateEdSize(chain(24)).dimension).toBe(2704156);
  });

  it('a 16-site chain is fine; 36 sites is beyond a browser', () => {
    expect(estimateEdSize(chain(16)).verdict).toBe('fine');
    const big = estimateEdSize(chain(36)); // C(36, 18) ≈ 9.1e9 states
    expect(big.verdict).toBe('too-large');
    expect(big.bytes).toBeGreaterThan(BROWSER_LIMIT_BYTES);
    // At least the Lanczos vectors: 16 bytes per complex entry, window + 2 + states vectors.
    expect(big.bytes).toBeGreaterThanOrEqual(16 * big.dimension * 24);
  });

  it('grows with the cluster: more sites never need less memory', () => {
    const sizes = [8, 12, 16, 20].map((L) => estimateEdSize(chain(L)).bytes);
    for (let i = 1; i < sizes.length; i++) expect(sizes[i]).toBeGreaterThan(sizes[i - 1]);
  });

  it('formats', () => {
    expect(formatBytes(512)).toBe('512 B');
    expect(formatBytes(1.5 * 2 ** 30)).toBe('1.5 GB');
    expect(formatCount(12870)).toBe('12 870');
    expect(formatCount(9075135300)).toBe('9.1 × 10⁹');
  });
});
