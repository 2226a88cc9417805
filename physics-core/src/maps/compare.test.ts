import { describe, expect, it } from 'vitest';
import { chainSweep, fakeSolve } from '../sweep/fake-solver.js';
import { InProcessExecutor, runSweep } from '../sweep/run.js';
import { compareMaps } from './compare.js';

const runtime = { kind: 'node' as const, version: 'v20', cores: 1 };

describe('compareMaps', () => {
  it('aligns on common points and reports observable and label differences', async () => {
    const a = (await runSweep(chainSweep(), { executor: new InProcessExecutor(fakeSolve), runtime })).map;
    // A second "method": the same points shifted in energy by 0.1, with labels flipped above V = 3.
    const b = (await runSweep(chainSweep({ method: 'meanfield', axes: [{ parameter: 'V', kind: 'linear', from: 2, to: 6, points: 9 }] }), {
      executor: new InProcessExecutor((req, warm) => {
        const out = fakeSolve(req, warm);
        out.result.energy += 0.1;
        out.result.energyPerSite += 0.1 / 8;
        if (req.parameters.V > 3) out.result.label = { id: 'other', confidence: 1, evidence: {} };
        return out;
      }),
      runtime,
    })).map;
    expect(a.id).not.toBe(b.id);
    const c = compareMaps(a, b);
    expect(c.common.map((x) => x.key)).toEqual(['V=2', 'V=2.5', 'V=3', 'V=3.5', 'V=4']);
    expect(c.onlyInA).toEqual(['V=0', 'V=0.5', 'V=1', 'V=1.5']);
    expect(c.onlyInB).toHaveLength(4);
    expect(c.summary.energy.maxAbsDifference).toBeCloseTo(0.1, 12);
    expect(c.summary.energyPerSite.maxAbsDifference).toBeCloseTo(0.1 / 8, 12);
    expect(c.summary.gap.maxAbsDifference).toBe(0);
    expect(c.labelAgreement).toEqual({ agree: 3, compared: 5 });
    expect(c.common.find((x) => x.key === 'V=4')).toMatchObject({ labelA: 'density-wave', labelB: 'other', labelsAgree: false });
  });
});
