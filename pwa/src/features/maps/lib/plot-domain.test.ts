import { scaleLinear } from '@visx/scale';
import { describe, expect, it } from 'vitest';
import { plotDomain, TICK_SPECIFIER } from './plot-domain.js';

describe('plotDomain', () => {
  it('pads a real range by 8% on each side', () => {
    const [lo, hi] = plotDomain([-4, -2, -3]);
    expect(lo).toBeCloseTo(-4.16, 12);
    expect(hi).toBeCloseTo(-1.84, 12);
  });
  it('draws rounding noise near zero flat at zero, with short tick labels', () => {
    // Bond currents of a time-reversal-symmetric state: zero up to a few 1e-12.
    const d = plotDomain([5e-12, 5.3e-12, 4.8e-12]);
    expect(d).toEqual([-0.08, 0.08]);
    const y = scaleLinear<number>({ domain: d, range: [200, 0], nice: true });
    const labels = y.ticks(5).map(y.tickFormat(5, TICK_SPECIFIER));
    for (const l of labels) expect(l.length).toBeLessThanOrEqual(6);
    expect(labels).toContain('0');
  });
  it('draws a constant energy flat around it', () => {
    const [lo, hi] = plotDomain([-3.5, -3.5 + 1e-12]);
    expect((lo + hi) / 2).toBeCloseTo(-3.5, 9);
    expect(hi - lo).toBeCloseTo(0.56, 9);
  });
  it('keeps small but real differences (1e-6 of the value) as structure, with ticks that tell them apart', () => {
    const [lo, hi] = plotDomain([-3.5, -3.5 + 4e-6]);
    expect(hi - lo).toBeLessThan(1e-5);
    const y = scaleLinear<number>({ domain: [lo, hi], range: [200, 0], nice: true });
    const labels = y.ticks(5).map(y.tickFormat(5, TICK_SPECIFIER));
    expect(new Set(labels).size).toBe(labels.length);
  });
  it('ignores non-finite values; nothing at all gives [0, 1]', () => {
    expect(plotDomain([])).toEqual([0, 1]);
    expect(plotDomain([Number.NaN, 2, 2])).toEqual([2 - 0.16, 2 + 0.16]);
  });
});
