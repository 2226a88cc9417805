import { describe, expect, it } from 'vitest';
import { canonicalJson } from './canonical-json.js';
import { parseMapText, serializeMap, type MapPoint, type PhaseMap } from './map-format.js';
import { mergeMaps } from './merge.js';
import { sha256Hex } from './provenance.js';

// Pins of the canonical bytes: the SHA-256 values were recorded with the first (unoptimised)
// implementation of canonicalJson/serializeMap/mergeMaps. Any change of the canonical text changes
// every stored map hash, so these must never be updated to make a change pass.

const node = { kind: 'node' as const, version: 'v20.20.0', cores: 2 };
const browser = { kind: 'browser' as const, version: 'Mozilla/5.0 (X11; Linux) “quoted” ünï', cores: 8 };

function pt(V: number, energy: number, minute: number, extra: Partial<MapPoint> = {}): MapPoint {
  return {
    parameters: { V, mu: -0, 'J\'': 1e-7 },
    level: minute % 2,
    energy,
    observables: { energyPerSite: energy / 8, density: [0.5, 0.5, 1 / 3, -0], structureFactor: [[Math.PI, 0, 1e21], [0, Math.PI, 5e-324]] },
    label: { id: 'density-wave', confidence: 0.75, evidence: { peak: 2.5, 'S(π,π)': 0.1 + 0.2 } },
    convergence: { converged: minute !== 3, iterations: 40 + minute, residual: 1.5e-11 },
    wallMs: 12.25 + minute,
    seed: 4294967295 - minute,
    computed: { at: new Date(Date.UTC(2031, 4, 6, 7, minute)).toISOString(), runtime: minute % 2 ? browser : node, author: 'ana\n"b"\\' },
    warnings: ['not converged \u0001 \u2028 tab\t'],
    ...extra,
  };
}

function fixedMap(minute: number, energies: number[]): PhaseMap {
  const createdAt = new Date(Date.UTC(2031, 4, 6, 7, minute)).toISOString();
  const points: Record<string, MapPoint> = {};
  energies.forEach((e, i) => {
    const { computed, ...summary } = pt(i, e - 1e-9, minute + 1);
    points[`V=${i},mu=0`] = pt(i, e, minute, i === 1 ? { history: [{ ...summary, computed }], disputed: [{ ...summary, energy: e + 0.5, computed }] } : {});
  });
  return {
    spec: 'phasewright.map/1',
    id: 'ab'.repeat(32),
    sweep: {
      spec: 'phasewright.sweep/1',
      name: `sweep ${minute}`,
      model: {
        spec: 'phasewright.model/1',
        name: 'chain L=8, nearest-neighbour repulsion',
        lattice: { kind: 'chain', size: [8], boundary: ['periodic'] },
        particles: { kind: 'hardcore', filling: 0.5 },
        parameters: { J: 1, V: 1 },
        terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J' }, { kind: 'interaction', neighbors: 1, amplitude: 'V' }],
      },
      axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 2, points: 3 }],
      method: 'ed',
      seed: 7,
    },
    points,
    provenance: {
      createdAt, finishedAt: createdAt, runtime: node, seeds: [7, minute], coreVersion: '0.1.0', warnings: [`w${minute}`],
      sources: [{ createdAt, finishedAt: createdAt, runtime: minute % 2 ? browser : node, author: 'bo' }],
    },
  };
}

describe('canonical bytes are pinned', () => {
  it('canonicalJson of an awkward value', () => {
    const value = { 'b c': [1, -0, 1e21, 1e-7, 0.1, { z: 'é\u0000', a: null, 'ü': true }], $a: new Float64Array([0.25, -0]), _: false, '1x': 'x', u: undefined };
    expect(sha256Hex(canonicalJson(value))).toBe('e3d80de698a9343172b62c5c3bbfb40ec62d5c430b12a18f93b946e2ea67716c');
  });

  it('serializeMap of a small fixed map', () => {
    expect(sha256Hex(serializeMap(fixedMap(0, [-1, -2, -3])))).toBe('a4399f367494d5649f8a83525b277b1c75b368a7232551fdfdc516e34149fd3b');
  });

  it('mergeMaps of overlapping fixed maps', () => {
    const merged = mergeMaps([fixedMap(0, [-1, -2, -3]), fixedMap(1, [-1 + 1e-12, -2.5, -3]), fixedMap(0, [-1, -2, -3])]);
    expect(sha256Hex(serializeMap(merged))).toBe('385c8a4c0b557771869b31f272e16b7291454268f18eefe19a4134f7e6bf301f');
  });

  it('parse → serialize of the fixed map keeps the bytes', () => {
    const text = serializeMap(mergeMaps([fixedMap(0, [-1, -2, -3]), fixedMap(1, [-1, -2.5, -3])]));
    expect(serializeMap(parseMapText(text))).toBe(text);
  });
});
