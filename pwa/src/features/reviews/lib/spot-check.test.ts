// The comparison rule itself is tested in physics-core (src/maps/spot-check.test.ts); here the browser's run.
import { InProcessExecutor, runSweep, solvePoint, type SweepSpec } from '@phasewright/physics-core';
import { describe, expect, it } from 'vitest';
import { chainVCut } from '../../../test/chain-sweep.js';
import { runSpotCheck } from './spot-check.js';

const runtime = { kind: 'browser' as const, version: 'vitest', cores: 1 };

const sweep: SweepSpec = chainVCut({ name: 'chain V cut', sites: 6, to: 3, points: 4, seed: 3 });

describe('runSpotCheck (ED)', () => {
  it('re-runs stored points and passes; the V=0 energy equals the free-fermion value', async () => {
    const executor = new InProcessExecutor(solvePoint);
    const { map } = await runSweep(sweep, { executor, runtime, refine: false });
    const report = await runSpotCheck(executor, sweep, map.points, { sample: 4, seed: 1, runtime });
    expect(report.sample).toBe(4);
    expect(report).toMatchObject({ pass: true, reproduced: 4, method: 'ed', seed: 1 });
    expect(report.maxRelEnergyDifference).toBeLessThanOrEqual(1e-8);
    // Hardcore bosons on an open chain map to free fermions (Jordan–Wigner; Lieb, Schultz & Mattis,
    // Ann. Phys. 16, 407 (1961)): E0 = −2J Σ_{k=1..3} cos(kπ/7) for 3 particles on 6 sites.
    const v0 = report.points.find((p) => p.key.includes('V=0'));
    const exact = -2 * [1, 2, 3].reduce((s, k) => s + Math.cos((k * Math.PI) / 7), 0);
    expect(v0?.freshEnergy).toBeCloseTo(exact, 9);
  });
});
