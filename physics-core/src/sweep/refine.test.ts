import { describe, expect, it } from 'vitest';
import { chainSweep, fakeSolve, FAKE_DISC, FAKE_PEAK_V } from './fake-solver.js';
import { refineItems, traceBoundaries } from './refine.js';
import { InProcessExecutor, runSweep } from './run.js';

const runtime = { kind: 'node' as const, version: 'v20', cores: 1 };
const run = async (sweep: ReturnType<typeof chainSweep>) => (await runSweep(sweep, { executor: new InProcessExecutor(fakeSolve), runtime })).map;

describe('refinement', () => {
  it('1D: bisects the label change down to maxDepth; boundary within half the final cell', async () => {
    // Coarse spacing 0.5 in V; 4 halvings → final cell 0.03125; the fake's switch is at V = 2 exactly (a grid point),
    // so use a grid that does not contain it: V from 0.1.
    const sweep = chainSweep({ axes: [{ parameter: 'V', kind: 'linear', from: 0.1, to: 4.1, points: 9 }], refine: { maxDepth: 4, on: ['label'] } });
    const map = await run(sweep);
    expect(Object.keys(map.points)).toHaveLength(9 + 4);
    expect(Math.max(...Object.values(map.points).map((p) => p.level))).toBe(4);
    const [b] = traceBoundaries(sweep, map.points);
    expect(b.between).toEqual(['density-wave', 'superfluid']);
    expect(b.vertices[0].uncertainty.V).toBeCloseTo(0.5 / 16 / 2, 12);
    expect(Math.abs(b.vertices[0].at.V - 2)).toBeLessThanOrEqual(b.vertices[0].uncertainty.V);
    expect(refineItems(sweep, map.points)).toEqual([]);
  });

  it('1D: follows a fidelity-susceptibility peak', async () => {
    const sweep = chainSweep({ axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 4, points: 9 }], refine: { maxDepth: 5, on: ['fidelity'] } });
    const map = await run(sweep);
    const points = Object.values(map.points);
    const best = points.reduce((a, b) => ((a.observables.fidelitySusceptibility as number) > (b.observables.fidelitySusceptibility as number) ? a : b));
    expect(Math.abs(best.parameters.V - FAKE_PEAK_V)).toBeLessThanOrEqual(0.5 / 32);
    expect(points.length).toBeLessThan(9 + 2 * 5 + 1);
  });

  it('2D quadtree: refines only cells the boundary crosses; the traced curve stays near the true one', async () => {
    const sweep = chainSweep({
      axes: [
        { parameter: 'V', kind: 'linear', from: 1.05, to: 5.05, points: 9 },
        { parameter: 'mu', kind: 'linear', from: -2.05, to: 1.95, points: 9 },
      ],
      model: { ...chainSweep().model, parameters: { J: 1, V: 1, mu: 0 } },
      refine: { maxDepth: 3, on: ['label'] },
    });
    const map = await run(sweep);
    const points = Object.values(map.points);
    expect(points.length).toBeGreaterThan(81);
    expect(points.length).toBeLessThan(33 * 33); // fewer than the uniform grid at the final spacing
    // Refinement only where a boundary is: a point added at level d sits in a split cell of side
    // 0.5/2^(d−1), so a true boundary (V = 2, or the disc's circle) passes within that cell's diagonal.
    const disc = (V: number, mu: number) => Math.abs(Math.hypot(V - FAKE_DISC.V, mu - FAKE_DISC.mu) - FAKE_DISC.r);
    for (const p of points.filter((q) => q.level > 0)) {
      const side = 0.5 / 2 ** (p.level - 1);
      expect(Math.min(Math.abs(p.parameters.V - 2), disc(p.parameters.V, p.parameters.mu))).toBeLessThanOrEqual(Math.SQRT2 * side + 1e-9);
    }
    const lines = traceBoundaries(sweep, map.points);
    const mott = lines.filter((l) => l.between.includes('mott'));
    expect(mott).toHaveLength(1);
    expect(mott[0].between).toEqual(['density-wave', 'mott']);
    for (const v of mott[0].vertices) {
      // Every vertex lies within its uncertainty (half the final cell, 0.5/8/2 = 0.03125) of the circle.
      expect(Math.max(v.uncertainty.V, v.uncertainty.mu)).toBeCloseTo(0.03125, 12);
      expect(disc(v.at.V, v.at.mu)).toBeLessThanOrEqual(Math.hypot(v.uncertainty.V, v.uncertainty.mu) + 1e-9);
    }
    // The disc's boundary is one closed polyline.
    expect(mott[0].vertices[0]).toEqual(mott[0].vertices.at(-1));
    const line = lines.filter((l) => l.between.join() === 'density-wave,superfluid');
    expect(line.length).toBeGreaterThan(0);
    for (const l of line) for (const v of l.vertices) expect(Math.abs(v.at.V - 2)).toBeLessThanOrEqual(v.uncertainty.V + 1e-9);
  });
});
