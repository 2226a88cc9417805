import { describe, expect, it } from 'vitest';
import { canonicalJson } from '../maps/canonical-json.js';
import { mergeMaps } from '../maps/merge.js';
import type { PhaseMap } from '../maps/map-format.js';
import { chainSweep, fakeSolve } from './fake-solver.js';
import { InProcessExecutor, runSweep, type Progress } from './run.js';

const runtime = { kind: 'node' as const, version: 'v20', cores: 1 };
const physics = (m: PhaseMap) =>
  canonicalJson(Object.fromEntries(Object.entries(m.points).map(([k, p]) => [k, { e: p.energy, o: p.observables, l: p.label, c: p.convergence, lv: p.level, s: p.seed }])));

describe('runSweep (fake solver)', () => {
  const grid = chainSweep({
    axes: [
      { parameter: 'V', kind: 'linear', from: 0, to: 4, points: 5 },
      { parameter: 'mu', kind: 'linear', from: -2, to: 2, points: 5 },
    ],
    model: { ...chainSweep().model, parameters: { J: 1, V: 1, mu: 0 } },
  });

  it('computes every point once, warm-starting along segments, with progress to the end', async () => {
    const events: Progress[] = [];
    const { map, cancelled } = await runSweep(grid, { executor: new InProcessExecutor(fakeSolve), runtime, segmentLength: 5, onProgress: (p) => events.push(p) });
    expect(cancelled).toBe(false);
    expect(Object.keys(map.points)).toHaveLength(25);
    const cold = Object.values(map.points).filter((p) => p.convergence.iterations === 30);
    expect(cold).toHaveLength(5); // one cold start per segment of 5
    expect(events.at(-1)).toMatchObject({ done: 25, total: 25, skipped: 0 });
    expect(map.provenance.finishedAt).toBeDefined();
  });

  it('chunks merged give the unsplit map (same id, same points)', async () => {
    const whole = (await runSweep(grid, { executor: new InProcessExecutor(fakeSolve), runtime })).map;
    const parts = [];
    for (let i = 1; i <= 3; i++) parts.push((await runSweep(grid, { executor: new InProcessExecutor(fakeSolve), runtime, chunk: { index: i, count: 3 } })).map);
    expect(parts.map((p) => Object.keys(p.points).length).reduce((a, b) => a + b)).toBe(25);
    const merged = mergeMaps(parts);
    expect(merged.id).toBe(whole.id);
    expect(physics(merged)).toBe(physics(whole));
  });

  it('cancels mid-way and resumes without recomputing or losing a point', async () => {
    const controller = new AbortController();
    let seen = 0;
    const first = await runSweep(grid, {
      executor: new InProcessExecutor(fakeSolve), runtime, signal: controller.signal,
      onPoint: () => { if (++seen === 11) controller.abort(); },
    });
    expect(first.cancelled).toBe(true);
    expect(Object.keys(first.map.points)).toHaveLength(11);
    expect(first.map.provenance.finishedAt).toBeUndefined();
    const computed: string[] = [];
    const second = await runSweep(grid, {
      executor: new InProcessExecutor((req, warm) => { computed.push(req.key); return fakeSolve(req, warm); }),
      runtime, resume: first.map,
    });
    expect(second.skipped).toBe(11);
    expect(computed).toHaveLength(14);
    expect(computed.some((k) => first.map.points[k])).toBe(false);
    expect(Object.keys(second.map.points).sort()).toEqual(Object.keys((await runSweep(grid, { executor: new InProcessExecutor(fakeSolve), runtime })).map.points).sort());
    expect(second.map.provenance.sources).toHaveLength(2);
  });

  it('refuses to resume a map of another sweep, and records failed points as warnings', async () => {
    const other = (await runSweep(chainSweep(), { executor: new InProcessExecutor(fakeSolve), runtime })).map;
    await expect(runSweep(grid, { executor: new InProcessExecutor(fakeSolve), runtime, resume: other })).rejects.toThrow(/different sweep/);
    const { map, failed } = await runSweep(chainSweep(), {
      executor: new InProcessExecutor((req, warm) => { if (req.parameters.V === 2) throw new Error('too big'); return fakeSolve(req, warm); }),
      runtime,
    });
    expect(failed).toBe(1);
    expect(map.points['V=2']).toBeUndefined();
    expect(map.provenance.warnings).toContain('V=2: failed: too big');
  });
});
