import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { chainSweep } from './fake-solver.js';
import { axisValue, chunkPlan, parseChunk, planSweep, pointKey, snakeCoords } from './plan.js';
import type { SweepSpec } from './spec.js';

const grid = (nx: number, ny: number, nz?: number): SweepSpec => chainSweep({
  axes: [
    { parameter: 'V', kind: 'linear', from: 0, to: 1, points: nx },
    { parameter: 'J', kind: 'log', from: 0.1, to: 10, points: ny },
    ...(nz ? [{ parameter: 'mu', kind: 'list' as const, values: Array.from({ length: nz }, (_, i) => i / 3) }] : []),
  ],
  model: { ...chainSweep().model, parameters: { J: 1, V: 1, mu: 0 } },
});

describe('planning', () => {
  it('axis values: linear and log ends exact, interior rounded to 12 digits', () => {
    const lin = { parameter: 'V', kind: 'linear' as const, from: 0, to: 0.3, points: 4 };
    expect([0, 1, 2, 3].map((u) => axisValue(lin, u))).toEqual([0, 0.1, 0.2, 0.3]);
    const log = { parameter: 'J', kind: 'log' as const, from: 0.01, to: 100, points: 5 };
    expect([0, 1, 2, 3, 4].map((u) => axisValue(log, u))).toEqual([0.01, 0.1, 1, 10, 100]);
    expect(axisValue({ parameter: 'x', kind: 'list', values: [1, 2, 4] }, 1.5)).toBe(3);
  });

  it('keys are canonical: sorted names, shortest numbers, −0 as 0', () => {
    expect(pointKey({ V: 0.5, J: 1 })).toBe('J=1,V=0.5');
    expect(pointKey({ V: -0 })).toBe('V=0');
  });

  it('snake path visits every point once, each step to a grid neighbour (property)', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 1, max: 6 }), { minLength: 1, maxLength: 3 }), (sizes) => {
        const total = sizes.reduce((a, b) => a * b, 1);
        const seen = new Set<string>();
        let prev: number[] | undefined;
        for (let p = 0; p < total; p++) {
          const c = snakeCoords(p, sizes);
          c.forEach((x, a) => expect(x >= 0 && x < sizes[a]).toBe(true));
          seen.add(c.join());
          if (prev) expect(c.reduce((s, x, a) => s + Math.abs(x - prev![a]), 0)).toBe(1);
          prev = c;
        }
        expect(seen.size).toBe(total);
      }),
    );
  });

  it('chunks are contiguous runs of whole segments whose union is the plan, each point once (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 12 }), (nx, ny, n) => {
        const plan = planSweep(grid(nx, ny));
        const chunks = Array.from({ length: n }, (_, i) => chunkPlan(plan, { index: i + 1, count: n }));
        expect(chunks.flatMap((c) => c.items.map((x) => x.key))).toEqual(plan.items.map((x) => x.key));
        expect(new Set(plan.items.map((x) => x.key)).size).toBe(nx * ny);
      }),
    );
  });

  it('a stack of grids is planned as one path and is deterministic', () => {
    const a = planSweep(grid(3, 4, 2));
    expect(a.items).toHaveLength(24);
    expect(planSweep(grid(3, 4, 2))).toEqual(a);
    expect(a.items[0].parameters).toEqual({ V: 0, J: 0.1, mu: 0 });
  });

  it('parses --chunk i/n and refuses nonsense', () => {
    expect(parseChunk('2/5')).toEqual({ index: 2, count: 5 });
    expect(() => parseChunk('0/5')).toThrow('--chunk must be i/n with 1 ≤ i ≤ n (got "0/5")');
    expect(() => parseChunk('6/5')).toThrow('--chunk');
    expect(() => parseChunk('a')).toThrow('--chunk');
  });
});
