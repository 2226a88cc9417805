import type { MapPoint, PhaseMap, SweepSpec } from '@phasewright/physics-core';
import { describe, expect, it } from 'vitest';
import { compare, comparableObservables, differenceCells, differenceScale, divergingColor } from './compare-data.js';

const sweep = (axes: string[]): SweepSpec =>
  ({
    spec: 'phasewright.sweep/1',
    model: { spec: 'phasewright.model/1', lattice: { kind: 'chain', size: [4], boundary: ['periodic'] }, particles: { kind: 'hardcore', filling: 0.5 }, parameters: { J: 1, V: 0 }, terms: [] },
    method: 'ed',
    axes: axes.map((parameter) => ({ parameter, kind: 'linear', from: 0, to: 2, points: 3 })),
  }) as unknown as SweepSpec;

function point(V: number, energy: number, gap: number, label: string): MapPoint {
  return {
    parameters: { V },
    level: 0,
    energy,
    observables: { gap },
    convergence: { converged: true, iterations: 1, residual: 0 },
    wallMs: 1,
    seed: 0,
    computed: { at: '2030-01-01T00:00:00.000Z', runtime: { kind: 'browser', version: 't', cores: 1 } },
    label: { id: label, confidence: 1, evidence: {} },
  };
}

function map(points: MapPoint[], axes = ['V']): PhaseMap {
  return {
    spec: 'phasewright.map/1',
    id: 'x',
    sweep: sweep(axes),
    points: Object.fromEntries(points.map((p) => [`V=${p.parameters.V}`, p])),
    provenance: { createdAt: '', runtime: { kind: 'browser', version: 't', cores: 1 }, seeds: [0], coreVersion: '0', warnings: [], sources: [] },
  } as PhaseMap;
}

const a = map([point(0, -2, 1, 'sf'), point(1, -1.5, 0.5, 'sf'), point(2, -1, 0.2, 'dw')]);
const b = map([point(1, -1.25, 0.75, 'sf'), point(2, -1.5, 0.2, 'sf'), point(3, -1, 0.1, 'dw')]);

describe('compare view data', () => {
  it('a map compared with itself differs by exactly zero everywhere (invariant)', () => {
    const c = compare(a, a);
    for (const obs of comparableObservables(c)) {
      const cells = differenceCells(a, c, obs);
      expect(cells).toHaveLength(3);
      expect(differenceScale(cells)).toBe(0);
    }
    expect(c.result.labelAgreement).toEqual({ agree: 3, compared: 3 });
  });

  it('differences are b − a on common points only, antisymmetric under swapping the maps', () => {
    const ab = compare(a, b);
    const ba = compare(b, a);
    expect(ab.sameAxes).toBe(true);
    expect(ab.result.common.map((p) => p.key)).toEqual(['V=1', 'V=2']);
    const dab = differenceCells(a, ab, 'energy').map((c) => c.difference);
    const dba = differenceCells(b, ba, 'energy').map((c) => c.difference);
    expect(dab).toEqual([0.25, -0.5]);
    expect(dba).toEqual([-0.25, 0.5]);
    expect(differenceScale(differenceCells(a, ab, 'gap'))).toBeCloseTo(0.25, 12);
    expect(ab.result.labelAgreement).toEqual({ agree: 1, compared: 2 });
  });

  it('maps over different parameters are flagged; the colour scale is symmetric about zero', () => {
    expect(compare(a, map([point(0, -2, 1, 'sf')], ['V', 'J'])).sameAxes).toBe(false);
    expect(divergingColor(0, 1)).toBe('rgb(245 241 232)');
    expect(divergingColor(-1, 1)).toBe('rgb(0 114 178)');
    expect(divergingColor(1, 1)).toBe('rgb(213 94 0)');
    expect(divergingColor(5, 1)).toBe(divergingColor(1, 1));
  });
});
