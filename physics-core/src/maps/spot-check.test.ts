import { describe, expect, it } from 'vitest';
import { samplePointKeys, spotCheckJobs } from './spot-check.js';
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
