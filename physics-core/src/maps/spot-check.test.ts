import { describe, expect, it } from 'vitest';
import { compareSpotCheck, samplePointKeys, spotCheckJobs } from './spot-check.js';
import type { MapPoint } from './map-format.js';
import type { ModelSpec } from '../model/types.js';
import { chainModel, chainSweep } from '../sweep/fake-solver.js';
import { InProcessExecutor, runSweep } from '../sweep/run.js';
import { solvePoint } from '../sweep/solve-point.js';
import type { SweepSpec } from '../sweep/spec.js';

describe('spot-check sampling and jobs', () => {
  const keys = Array.from({ length: 20 }, (_, i) => `V=${i / 4}`);

  it('draws k distinct keys reproducibly from the seed, whatever the order they come in', () => {
    const a = samplePointKeys(keys, 5, 7);
    expect(new Set(a).size).toBe(5);
    expect(a.every((k) => keys.includes(k))).toBe(true);
    expect(samplePointKeys([...keys].reverse(), 5, 7)).toEqual(a);
    expect(samplePointKeys(keys, 5, 8)).not.toEqual(a);
    expect(samplePointKeys(keys, 50, 7)).toHaveLength(20);
    expect(samplePointKeys(keys, 0, 7)).toEqual([]);
  });

  it('re-runs every sampled point in its own cold segment with the sweep context', () => {
    const sweep = { axes: [{ parameter: 'V' }], method: 'ed', model: { spec: 'phasewright.model/1' }, seed: 3 } as unknown as SweepSpec;
    const points = { 'V=0': { parameters: { V: 0 }, level: 0 }, 'V=1': { parameters: { V: 1 }, level: 2 } };
    const jobs = spotCheckJobs(sweep, points, ['V=0', 'V=1'], { kind: 'node', version: 'v20', cores: 2 });
    expect(jobs).toHaveLength(2);
    expect(jobs.map((j) => j.items.length)).toEqual([1, 1]);
    expect(jobs[1].items[0]).toEqual({ key: 'V=1', parameters: { V: 1 }, coords: [], level: 2 });
    expect(jobs[0].context.axes).toEqual(['V']);
    expect(jobs[0].context.seed).toBe(3);
  });
});

describe('compareSpotCheck: one rule for the CLI, the server and the browser', () => {
  const pt = (energy: number, label?: string) => ({
    energy,
    parameters: { V: 1 },
    ...(label ? { label: { id: label, confidence: 1, evidence: {} } } : {}),
    convergence: { converged: true, iterations: 10, residual: 1e-12 },
    wallMs: 3,
  });

  it('ED: energies within 1e-8 relative and the same labels pass; beyond, or a changed label, fail and say why', () => {
    const stored = { a: pt(-4, 'sf'), b: pt(-2, 'dw') };
    const ok = compareSpotCheck('ed', stored, new Map([['a', pt(-4 * (1 + 5e-9), 'sf')], ['b', pt(-2, 'dw')]]));
    expect(ok).toMatchObject({ pass: true, reproduced: 2, differs: 0, failed: 0, tolerance: 1e-8, worstKey: 'a', labelsAgree: 2, labelsCompared: 2 });
    expect(ok.maxRelEnergyDifference).toBeCloseTo(5e-9, 15);
    // ED has no "stored lower": a higher fresh energy is a difference like any other.
    const higher = compareSpotCheck('ed', stored, new Map([['a', pt(-4 * (1 - 5e-8), 'sf')], ['b', pt(-2, 'dw')]]));
    expect(higher).toMatchObject({ pass: false, differs: 1 });
    expect(higher.points[0].problem).toMatch(/relative \|ΔE\| = 5\.00e-8 > 1e-8/);
    expect(higher.maxAbsEnergyDifference).toBeCloseTo(2e-7, 12);
    const label = compareSpotCheck('ed', stored, new Map([['a', pt(-4, 'sf')], ['b', pt(-2, 'sf')]]));
    expect(label).toMatchObject({ pass: false, labelsAgree: 1, labelsCompared: 2 });
    expect(label.points[1]).toMatchObject({ outcome: 'differs', problem: 'label dw → sf' });
    // A label that vanishes is a change too.
    expect(compareSpotCheck('ed', { a: pt(-1, 'sf') }, new Map([['a', pt(-1)]])).points[0].problem).toBe('label sf → (none)');
  });

  it('mean-field: a lower fresh minimum fails (the map missed it); a higher one passes with a note (the stored point stands)', () => {
    const stored = { a: pt(-1, 'mi') };
    const lower = compareSpotCheck('meanfield', stored, new Map([['a', pt(-1.01, 'mi')]]));
    expect(lower).toMatchObject({ pass: false, differs: 1, tolerance: 1e-6 });
    expect(lower.points[0].problem).toMatch(/lower minimum/);
    const higher = compareSpotCheck('meanfield', stored, new Map([['a', pt(-0.99, 'sf')]]));
    expect(higher).toMatchObject({ pass: true, storedLower: 1, differs: 0 });
    expect(higher.points[0]).toMatchObject({ outcome: 'stored-lower', labelsAgree: false });
    expect(higher.points[0].note).toMatch(/higher minimum .* label mi → sf\); the stored point.* stands/);
    expect(compareSpotCheck('meanfield', stored, new Map([['a', pt(-1 - 5e-7, 'mi')]])).pass).toBe(true);
    // Near E = 0 the difference is absolute (in the model's energy unit): 1e-11 against 0 reproduces.
    expect(compareSpotCheck('meanfield', { a: pt(1e-11, 'sf') }, new Map([['a', pt(-3e-12, 'sf')]]))).toMatchObject({ pass: true, reproduced: 1 });
  });

  it('a point that could not be re-run fails the check and says why; an empty sample never passes', () => {
    const r = compareSpotCheck('ed', { a: pt(-1) }, new Map(), new Map([['a', 'too large']]));
    expect(r).toMatchObject({ pass: false, failed: 1, sample: 1 });
    expect(r.points[0]).toMatchObject({ outcome: 'not-run', problem: 'too large' });
    expect(compareSpotCheck('ed', {}, new Map()).pass).toBe(false);
    expect(() => compareSpotCheck('ed', { a: pt(-1) }, new Map(), new Map(), 0)).toThrow(/tolerance must be a positive number/);
  });

  it('real re-runs: an ED cut of a chain reproduces, and its V = 0 point is the free-fermion energy; a warm-started mean-field cut passes', async () => {
    const runtime = { kind: 'node' as const, version: 'v20', cores: 1 };
    const executor = new InProcessExecutor(solvePoint);
    const model = { ...chainModel(), lattice: { kind: 'chain', size: [6], boundary: ['open'] } } as ModelSpec;
    for (const method of ['ed', 'meanfield'] as const) {
      const sweep = chainSweep({ model, method, axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 3, points: 4 }], ...(method === 'meanfield' ? { solver: { supercell: [2] } } : {}) });
      const { map } = await runSweep(sweep, { executor, runtime, refine: false });
      const keys = samplePointKeys(Object.keys(map.points), 4, 1);
      const fresh = new Map<string, MapPoint>();
      await executor.run(spotCheckJobs(sweep, map.points, keys, runtime), (e) => {
        if (e.kind === 'point') fresh.set(e.key, e.point);
      });
      const report = compareSpotCheck(method, map.points, fresh);
      expect(report.pass, JSON.stringify(report.points.filter((p) => p.problem))).toBe(true);
      expect(report.sample).toBe(4);
      if (method === 'ed') {
        // Hardcore bosons on an open chain are free fermions (Jordan–Wigner; Lieb, Schultz & Mattis,
        // Ann. Phys. 16, 407 (1961)): E0 = −2J Σ_{k=1..3} cos(kπ/7) for 3 particles on 6 sites.
        const exact = -2 * [1, 2, 3].reduce((s, k) => s + Math.cos((k * Math.PI) / 7), 0);
        expect(report.points.find((p) => p.key === 'V=0')?.freshEnergy).toBeCloseTo(exact, 9);
        expect(report.reproduced).toBe(4);
      }
    }
  });
});
