import { describe, expect, it } from 'vitest';
import { RateMeter, formatDuration, formatRate, progressFigures } from './eta.js';

describe('RateMeter and progress figures', () => {
  it('a steady 2 points/s gives rate 2 and ETA = remaining / 2', () => {
    const m = new RateMeter(10_000);
    for (let i = 0; i <= 10; i++) m.record(2 * i, 1000 * i);
    expect(m.rate()).toBeCloseTo(2, 12);
    const p = progressFigures(20, 100, 1, m.rate());
    expect(p.etaS).toBeCloseTo(40, 12);
    expect(p.fraction).toBeCloseTo(0.2, 12);
    expect(p.failed).toBe(1);
  });

  it('the window forgets an early fast phase: after a slowdown the rate follows the new pace', () => {
    const m = new RateMeter(10_000);
    let done = 0;
    for (let t = 0; t <= 10_000; t += 1000) m.record((done = t / 100), t); // 10 points/s
    for (let t = 11_000; t <= 40_000; t += 1000) m.record((done += 1), t); // then 1 point/s
    expect(m.rate()).toBeCloseTo(1, 12);
  });

  it('unknown before two samples and after a reset (a pause does not count as slow work)', () => {
    const m = new RateMeter();
    expect(m.rate()).toBe(0);
    m.record(0, 0);
    expect(m.rate()).toBe(0);
    expect(Number.isNaN(progressFigures(0, 10, 0, m.rate()).etaS)).toBe(true);
    m.record(5, 5000);
    expect(m.rate()).toBeCloseTo(1, 12);
    m.reset();
    m.record(5, 600_000); // resumed ten minutes later
    m.record(7, 601_000);
    expect(m.rate()).toBeCloseTo(2, 12);
  });

  it('done and finished: ETA 0, fraction 1; time must not go backwards', () => {
    expect(progressFigures(10, 10, 0, 0)).toMatchObject({ fraction: 1, etaS: 0 });
    expect(progressFigures(0, 0, 0, 0).fraction).toBe(0);
    const m = new RateMeter();
    m.record(1, 100);
    expect(() => m.record(2, 50)).toThrow(/backwards/);
  });

  it('formats durations and rates for people', () => {
    expect(formatDuration(Number.NaN)).toBe('—');
    expect(formatDuration(12.4)).toBe('12 s');
    expect(formatDuration(187)).toBe('3 min 07 s');
    expect(formatDuration(7500)).toBe('2 h 05 min');
    expect(formatRate(0)).toBe('—');
    expect(formatRate(3.21)).toBe('3.2 points/s');
    expect(formatRate(25)).toBe('25 points/s');
    expect(formatRate(0.05)).toBe('3.0 points/min');
  });
});
