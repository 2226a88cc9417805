import { CORE_VERSION } from '../version.js';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { chainSweep } from '../sweep/fake-solver.js';
import { canonicalJson } from './canonical-json.js';
import type { MapPoint, PhaseMap, RuntimeInfo } from './map-format.js';
import { MergeError, mergeMaps, mergePoints, normaliseMap } from './merge.js';
import { mapIdentity } from './provenance.js';

const node: RuntimeInfo = { kind: 'node', version: 'v20.20.0', cores: 2 };
const browser: RuntimeInfo = { kind: 'browser', version: 'Chromium', cores: 8 };

interface Rec { key: string; energy: number; label: string; at: number; browser: boolean; author?: string }

function point(r: Rec): MapPoint {
  return {
    parameters: { V: Number(r.key.slice(2)) },
    level: 0,
    energy: r.energy,
    observables: { energyPerSite: r.energy / 8, structureFactor: [[Math.PI, 0, r.energy * -0.1]] },
    label: { id: r.label, confidence: 0.8, evidence: {} },
    convergence: { converged: true, iterations: 20 + r.at, residual: 1e-11 },
    wallMs: 3 + r.at,
    seed: r.at,
    computed: { at: new Date(Date.UTC(2031, 0, 1, 0, r.at)).toISOString(), runtime: r.browser ? browser : node, ...(r.author ? { author: r.author } : {}) },
  };
}

function singleton(method: 'ed' | 'meanfield', r: Rec): PhaseMap {
  const sweep = chainSweep({ method });
  const createdAt = new Date(Date.UTC(2031, 0, 1, 0, r.at)).toISOString();
  const runtime = r.browser ? browser : node;
  const source = { createdAt, finishedAt: createdAt, runtime, ...(r.author ? { author: r.author } : {}) };
  return {
    spec: 'phasewright.map/1',
    id: mapIdentity(sweep, CORE_VERSION),
    sweep,
    points: { [r.key]: point(r) },
    provenance: { createdAt, finishedAt: createdAt, runtime, seeds: [7], coreVersion: '0.1.0', warnings: [`${r.key}: w${r.at % 3}`], sources: [source], ...(r.author ? { author: r.author } : {}) },
  };
}

// Energies chosen so that ED agreement (1e-8 relative) and disagreement both occur often.
const recArb = fc.record({
  key: fc.constantFrom('V=0', 'V=1', 'V=2'),
  energy: fc.constantFrom(-1, -1 + 1e-12, -1 - 5e-9, -1.5, -2),
  label: fc.constantFrom('superfluid', 'density-wave'),
  at: fc.integer({ min: 0, max: 5 }),
  browser: fc.boolean(),
  author: fc.option(fc.constantFrom('ana', 'bo'), { nil: undefined }),
});
const mapArb = (method: 'ed' | 'meanfield') =>
  fc.array(recArb, { minLength: 1, maxLength: 5 }).map((recs) => mergeMaps(recs.map((r) => singleton(method, r))));
const text = (m: PhaseMap) => canonicalJson(m);

describe.each(['ed', 'meanfield'] as const)('mergeMaps laws (%s, random maps with disputes and history)', (method) => {
  it('is commutative', () => {
    fc.assert(fc.property(mapArb(method), mapArb(method), (a, b) => {
      expect(text(mergeMaps([a, b]))).toBe(text(mergeMaps([b, a])));
    }));
  });
  it('is associative', () => {
    fc.assert(fc.property(mapArb(method), mapArb(method), mapArb(method), (a, b, c) => {
      expect(text(mergeMaps([mergeMaps([a, b]), c]))).toBe(text(mergeMaps([a, mergeMaps([b, c])])));
    }));
  });
  it('is idempotent', () => {
    fc.assert(fc.property(mapArb(method), (a) => {
      expect(text(mergeMaps([a, a]))).toBe(text(a));
      expect(text(normaliseMap(a))).toBe(text(a));
    }));
  });
  it('keeps every result once and the lowest energy on top', () => {
    fc.assert(fc.property(fc.array(recArb, { minLength: 1, maxLength: 6 }), (recs) => {
      const m = mergeMaps(recs.map((r) => singleton(method, r)));
      for (const [key, p] of Object.entries(m.points)) {
        const mine = recs.filter((r) => r.key === key);
        expect(p.energy).toBe(Math.min(...mine.map((r) => r.energy)));
        const distinct = new Set(mine.map((r) => canonicalJson(point(r))));
        expect(1 + (p.disputed?.length ?? 0) + (p.history?.length ?? 0)).toBe(distinct.size);
        if (method === 'meanfield') expect(p.disputed).toBeUndefined();
      }
    }));
  });
});

describe('merge rules', () => {
  const r = (energy: number, at: number): Rec => ({ key: 'V=1', energy, label: 'superfluid', at, browser: false });

  it('ED: results that agree within 1e-8 confirm, others are disputed', () => {
    const m = mergeMaps([singleton('ed', r(-1, 1)), singleton('ed', r(-1 + 5e-9, 2)), singleton('ed', r(-1.001, 3))]);
    const p = m.points['V=1'];
    expect(p.energy).toBe(-1.001);
    expect(p.disputed?.map((s) => s.energy)).toEqual([-1, -1 + 5e-9]);
    const agree = mergeMaps([singleton('ed', r(-1, 1)), singleton('ed', r(-1 + 5e-9, 2))]).points['V=1'];
    expect(agree.disputed).toBeUndefined();
    expect(agree.history?.map((s) => s.energy)).toEqual([-1 + 5e-9]);
    // A looser tolerance turns the dispute into agreement.
    expect(mergeMaps([singleton('ed', r(-1, 1)), singleton('ed', r(-1.001, 3))], { edRelativeTolerance: 1e-2 }).points['V=1'].disputed).toBeUndefined();
  });

  it('mean-field: the lower energy wins, the loser keeps its provenance in history', () => {
    const m = mergeMaps([singleton('meanfield', r(-1, 1)), singleton('meanfield', r(-1.2, 4))]);
    const p = m.points['V=1'];
    expect(p.energy).toBe(-1.2);
    expect(p.computed.at).toBe('2031-01-01T00:04:00.000Z');
    expect(p.history).toEqual([{ energy: -1, label: p.label, convergence: { converged: true, iterations: 21, residual: 1e-11 }, wallMs: 4, seed: 1, computed: { at: '2031-01-01T00:01:00.000Z', runtime: node } }]);
    expect(m.provenance.sources).toHaveLength(2);
    expect(m.provenance.createdAt).toBe('2031-01-01T00:01:00.000Z');
    expect(m.provenance.finishedAt).toBe('2031-01-01T00:04:00.000Z');
  });

  it('refuses maps of different identities', () => {
    const a = singleton('ed', r(-1, 1));
    const b = singleton('meanfield', r(-1, 1));
    expect(() => mergeMaps([a, b])).toThrow(MergeError);
    expect(() => mergeMaps([a, b])).toThrow(/maps of different identities cannot be merged/);
  });

  it('equal summaries: the canonically least full point is primary, whatever the order', () => {
    const a = singleton('ed', r(-1, 1));
    const b = structuredClone(a);
    b.points['V=1'].observables = { ...b.points['V=1'].observables, gap: 0.25 };
    const c = structuredClone(a);
    c.points['V=1'].level = 2;
    const least = [a, b].map((m) => canonicalJson(m.points['V=1'])).sort()[0];
    for (const order of [[a, b, c], [c, b, a], [b, c, a]]) {
      const p = mergeMaps(order).points['V=1'];
      expect(canonicalJson({ ...p, level: 0 })).toBe(least);
      expect(p.history).toBeUndefined();
    }
  });

  it('keeps an own "__proto__" member of a point as a member (as JSON.parse made it), not as a prototype', () => {
    const a = singleton('meanfield', r(-1, 1));
    const b = singleton('meanfield', r(-1.2, 4));
    const odd = JSON.parse(`{"__proto__":{"x":1},${canonicalJson(b.points['V=1']).slice(1)}`) as MapPoint;
    b.points['V=1'] = odd;
    const p = mergeMaps([a, b]).points['V=1'];
    expect(Object.getPrototypeOf(p)).toBe(Object.prototype);
    expect(Object.prototype.hasOwnProperty.call(p, '__proto__')).toBe(true);
    expect(canonicalJson(p)).toContain('"__proto__":{"x":1}');
    expect(p.history?.map((s) => s.energy)).toEqual([-1]);
  });

  it('two plain results (the direct path) merge as by the general rule (three inputs, one repeated)', () => {
    fc.assert(fc.property(recArb, recArb, fc.constantFrom('ed', 'meanfield') as fc.Arbitrary<'ed' | 'meanfield'>, fc.integer({ min: 0, max: 2 }), (ra, rb, method, level) => {
      const a = point(ra);
      const b = { ...point(rb), level };
      const direct = canonicalJson(mergePoints([a, b], method));
      expect(direct).toBe(canonicalJson(mergePoints([a, b, structuredClone(b)], method)));
      expect(direct).toBe(canonicalJson(mergePoints([b, a], method)));
    }));
  });

  it('equal summaries, one point with an extra member: the canonically least full point is primary, whatever the order', () => {
    const a = singleton('ed', r(-1, 1));
    const d = structuredClone(a);
    (d.points['V=1'] as unknown as Record<string, unknown>).zNote = 'kept by another client';
    const least = [a, d].map((m) => canonicalJson(m.points['V=1'])).sort()[0];
    expect(canonicalJson(mergeMaps([a, d]).points['V=1'])).toBe(least);
    expect(canonicalJson(mergeMaps([d, a]).points['V=1'])).toBe(least);
  });
});
