import { InProcessExecutor, runSweep, solvePoint, type MapPoint, type SweepSpec } from '@phasewright/physics-core';
import { describe, expect, it } from 'vitest';
import { chainVCut } from '../../../test/chain-sweep.js';
import { compareSpotCheck, runSpotCheck, samplePointKeys } from './spot-check.js';

const runtime = { kind: 'browser' as const, version: 'vitest', cores: 1 };

const sweep: SweepSpec = chainVCut({ name: 'chain V cut', sites: 6, to: 3, points: 4, seed: 3 });

describe('samplePointKeys', () => {
  const keys = Array.from({ length: 20 }, (_, i) => `V=${i}`);
  it('draws K distinct keys of the map, the same for the same seed', () => {
    const a = samplePointKeys(keys, 5, 7);
    expect(new Set(a).size).toBe(5);
    for (const k of a) expect(keys).toContain(k);
    expect(samplePointKeys([...keys].reverse(), 5, 7)).toEqual(a);
    expect(samplePointKeys(keys, 50, 7)).toHaveLength(20);
  });
  it('a different seed draws a different sample (for this case)', () => {
    expect(samplePointKeys(keys, 5, 8)).not.toEqual(samplePointKeys(keys, 5, 7));
  });
});

describe('runSpotCheck (ED)', () => {
  it('re-runs stored points and passes; the V=0 energy equals the free-fermion value', async () => {
    const executor = new InProcessExecutor(solvePoint);
    const { map } = await runSweep(sweep, { executor, runtime, refine: false });
    const report = await runSpotCheck(executor, sweep, map.points, { sample: 4, seed: 1, runtime });
    expect(report.sample).toBe(4);
    expect(report.pass).toBe(true);
    expect(report.maxRelEnergyDifference).toBeLessThanOrEqual(1e-8);
    // Hardcore bosons on an open chain map to free fermions (Jordan–Wigner; Lieb, Schultz & Mattis,
    // Ann. Phys. 16, 407 (1961)): E0 = −2J Σ_{k=1..3} cos(kπ/7) for 3 particles on 6 sites.
    const v0 = report.points.find((p) => p.key.includes('V=0'));
    const exact = -2 * [1, 2, 3].reduce((s, k) => s + Math.cos((k * Math.PI) / 7), 0);
    expect(v0?.freshEnergy).toBeCloseTo(exact, 9);
  });
});

const point = (energy: number, label?: string): MapPoint =>
  ({ energy, parameters: {}, level: 0, ...(label ? { label: { id: label } } : {}) }) as unknown as MapPoint;

describe('compareSpotCheck', () => {
  const meta = { seed: 1, wallMs: 0 };
  it('ED: fails when an energy differs by more than 1e-8 relative or a label changes', () => {
    const stored = { a: point(-4, 'sf'), b: point(-2, 'dw') };
    const ok = compareSpotCheck('ed', stored, new Map([['a', point(-4 * (1 + 5e-9), 'sf')], ['b', point(-2, 'dw')]]), new Map(), meta);
    expect(ok.pass).toBe(true);
    const energy = compareSpotCheck('ed', stored, new Map([['a', point(-4 * (1 + 5e-8), 'sf')], ['b', point(-2, 'dw')]]), new Map(), meta);
    expect(energy.pass).toBe(false);
    expect(energy.maxAbsEnergyDifference).toBeCloseTo(2e-7, 12);
    const label = compareSpotCheck('ed', stored, new Map([['a', point(-4, 'sf')], ['b', point(-2, 'sf')]]), new Map(), meta);
    expect(label.pass).toBe(false);
    expect(label.labelsAgree).toBe(1);
    expect(label.labelsCompared).toBe(2);
  });
  it('mean-field: a lower fresh energy passes (variational), a higher one fails', () => {
    const stored = { a: point(-1, 'mi') };
    expect(compareSpotCheck('meanfield', stored, new Map([['a', point(-1.01, 'mi')]]), new Map(), meta).pass).toBe(true);
    expect(compareSpotCheck('meanfield', stored, new Map([['a', point(-0.99, 'mi')]]), new Map(), meta).pass).toBe(false);
  });
  it('a point that could not be re-run fails the check and says why', () => {
    const r = compareSpotCheck('ed', { a: point(-1) }, new Map(), new Map([['a', 'too large']]), meta);
    expect(r.pass).toBe(false);
    expect(r.points[0].problem).toBe('too large');
  });
});
