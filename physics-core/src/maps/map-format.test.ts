import { describe, expect, it } from 'vitest';
import { SpecError } from '../errors.js';
import { chainSweep, fakeSolve } from '../sweep/fake-solver.js';
import { InProcessExecutor, runSweep } from '../sweep/run.js';
import fc from 'fast-check';
import { canonicalJson } from './canonical-json.js';
import { mergedPointText, parseMap, parseMapText, parseOwnedMap, serializeMap, type MapPoint, type PhaseMap } from './map-format.js';
import { mergePoints } from './merge.js';

const runtime = { kind: 'node' as const, version: 'v20', cores: 1 };

describe('map format v1', () => {
  it('round-trips losslessly through text', async () => {
    const { map } = await runSweep(chainSweep({ refine: { maxDepth: 2, on: ['label'] } }), { executor: new InProcessExecutor(fakeSolve), runtime, author: 'ana' });
    const text = serializeMap(map);
    const back = parseMapText(text);
    expect(back).toEqual(map);
    expect(serializeMap(back)).toBe(text);
  });

  it('refuses a newer format version with a clear message', () => {
    expect(() => parseMap({ spec: 'phasewright.map/2' })).toThrow(
      '$.spec: this map was written by a newer Phasewright (map/2); this version reads map/1',
    );
  });

  it('names bad fields by JSON path', async () => {
    const { map } = await runSweep(chainSweep(), { executor: new InProcessExecutor(fakeSolve), runtime });
    const bad = JSON.parse(serializeMap(map));
    bad.points['V=1'].energy = 'low';
    bad.points['V=1'].observables.gap = [1, 'x'];
    bad.provenance.runtime.kind = 'phone';
    bad.sweep.axes[0].points = 0;
    try {
      parseMap(bad);
      expect.unreachable();
    } catch (error) {
      expect(error).toBeInstanceOf(SpecError);
      const paths = (error as SpecError).issues.map((i) => i.path);
      expect(paths).toEqual(expect.arrayContaining([
        '$.points["V=1"].energy', '$.points["V=1"].observables.gap', '$.provenance.runtime.kind', '$.sweep.axes[0].points',
      ]));
    }
    expect(() => parseMapText('{"spec": ')).toThrow(/not valid JSON \(/);
  });

  it('returns a copy (parseMap) and names parameter, list and provenance paths', async () => {
    const { map } = await runSweep(chainSweep(), { executor: new InProcessExecutor(fakeSolve), runtime });
    const json = JSON.parse(serializeMap(map)) as PhaseMap;
    const back = parseMap(json);
    expect(back).toEqual(map);
    back.points['V=1'].observables.gap = -1;
    expect(json.points['V=1'].observables.gap).toEqual(map.points['V=1'].observables.gap);
    const bad = JSON.parse(serializeMap(map));
    bad.points['V=1'].parameters.V = null;
    bad.points['V=2'].history = {};
    bad.points['V=2'].computed.runtime.cores = 0;
    bad.provenance.sources = [{ createdAt: 1, runtime: { kind: 'node', version: 'v20', cores: 1 } }];
    expect(() => parseMap(bad)).toThrow(
      '$.points["V=1"].parameters.V: must be a finite number; $.points["V=2"].computed.runtime.cores: must be an integer ≥ 1; $.points["V=2"].history: must be an array; $.provenance.sources[0].createdAt: must be an ISO time',
    );
  });

  it('parseOwnedMap takes the value itself, with the same checks and messages as parseMap', async () => {
    const { map } = await runSweep(chainSweep({ refine: { maxDepth: 1, on: ['label'] } }), { executor: new InProcessExecutor(fakeSolve), runtime, author: 'ana' });
    const json = JSON.parse(serializeMap(map)) as PhaseMap;
    const points = json.points;
    const owned = parseOwnedMap(json);
    expect(owned).toBe(json);
    expect(owned.points).toBe(points); // no copy
    expect(owned).toEqual(parseMap(JSON.parse(serializeMap(map))));
    expect(serializeMap(owned)).toBe(serializeMap(map));

    // Every refusal is parseMap's, word for word, and leaves the value as it was.
    const fresh = () => JSON.parse(serializeMap(map)); // untyped JSON, as a request body arrives
    const spoil: ((m: ReturnType<typeof fresh>) => void)[] = [
      (m) => { m.spec = 'phasewright.map/3'; },
      (m) => { m.extra = 1; m.id = 'abc'; },
      (m) => { m.points['V=1'].energy = 'low'; m.points['V=1'].observables.gap = [1, 'x']; },
      (m) => { m.points['V=1'].parameters.V = null; m.points['V=2'].history = {}; },
      (m) => { m.points['V=2'].computed.runtime.cores = 0; m.provenance.sources = []; },
      (m) => { m.sweep.axes[0].points = 0; m.provenance.runtime.kind = 'phone'; },
      (m) => { m.points = [1]; },
    ];
    for (const f of spoil) {
      const a = fresh();
      f(a);
      const b = structuredClone(a);
      const message = (g: () => unknown): string => {
        try {
          g();
        } catch (error) {
          expect(error).toBeInstanceOf(SpecError);
          return (error as SpecError).message;
        }
        throw new Error('no error');
      };
      const expected = message(() => parseMap(b));
      expect(message(() => parseOwnedMap(a))).toBe(expected);
      expect(a).toEqual(b);
    }
    expect(() => parseOwnedMap(null)).toThrow('$: a map must be a JSON object');
  });
});

describe('mergedPointText', () => {
  const point = (energy: number, minute: number, extra: Record<string, unknown>): MapPoint => ({
    parameters: { V: 1.5, mu: -0.25 },
    level: minute % 3,
    energy,
    observables: { energyPerSite: energy / 8, densities: [0.5, 0.25, 1 / 3], structureFactor: [[Math.PI, 0, 0.125]] },
    label: { id: 'density-wave', confidence: 0.75, evidence: { 'S(π,π)': 0.3, note: 'x,"y"}' } },
    convergence: { converged: minute !== 3, iterations: 40 + minute, residual: 1e-11 },
    wallMs: 12.25 + minute,
    seed: 7 + minute,
    computed: { at: new Date(Date.UTC(2031, 4, 6, 7, minute)).toISOString(), runtime: { kind: 'node', version: 'v20', cores: 2 }, author: 'ana' },
    ...extra,
  });
  const extras = fc.constantFrom<Record<string, unknown>>({}, { warnings: ['w'] }, { aNote: { energy: 1, history: [] } }, { zNote: '},{' }, { gap: 0.5 });

  it('equals canonicalJson of the merged point, stored point primary or not (property, against canonicalJson)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(-1, -1 + 1e-12, -1.5, -0.5),
        fc.constantFrom(-1, -1 + 1e-12, -1.5, -0.5),
        fc.integer({ min: 0, max: 5 }),
        fc.integer({ min: 0, max: 5 }),
        extras,
        extras,
        fc.constantFrom('ed', 'meanfield') as fc.Arbitrary<'ed' | 'meanfield'>,
        fc.boolean(),
        (es, ep, ms, mp, xs, xp, method, storedHasHistory) => {
          const original = point(es, ms, storedHasHistory ? { ...xs, history: [{ ...point(es - 0.25, 5, {}), parameters: undefined }] } : xs);
          const storedText = canonicalJson(original);
          const stored = JSON.parse(storedText) as MapPoint; // as the server reads it back
          const merged = mergePoints([stored, point(ep, mp, xp)], method);
          expect(mergedPointText(merged, stored, storedText)).toBe(canonicalJson(merged));
          expect(mergedPointText(stored, stored, storedText)).toBe(storedText);
        },
      ),
      { numRuns: 300 },
    );
  });
});
