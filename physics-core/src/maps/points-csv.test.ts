import { describe, expect, it } from 'vitest';
import { csvField, exportFileStem, pointsCsv } from './points-csv.js';
import type { MapPoint, PhaseMap } from './map-format.js';

const point = (V: number, energy: number, label: string): MapPoint =>
  ({
    parameters: { V },
    level: 0,
    energy,
    observables: { energyPerSite: energy / 4, densities: [0.5, 0.5, 0.5, 0.5] },
    label: { id: label, confidence: 1, evidence: {} },
    convergence: { converged: true, iterations: 10, residual: 1e-12 },
    wallMs: 3,
    seed: 1,
    computed: { at: '2026-12-01T00:00:00.000Z', author: 'Quill, A.', runtime: { kind: 'node', version: 'v20', cores: 2 } },
  }) as unknown as MapPoint;

describe('pointsCsv', () => {
  const map = {
    sweep: { axes: [{ parameter: 'V' }] },
    points: { 'V=10': point(10, 1, 'density-wave'), 'V=2': point(2, -1.5, 'superfluid'), 'V=0.5': point(0.5, -2.25, 'superfluid') },
  } as unknown as Pick<PhaseMap, 'sweep' | 'points'>;

  it('one row per point in numeric axis order, scalar observables only, RFC 4180 quoting and line ends', () => {
    const text = pointsCsv(map);
    const lines = text.split('\r\n');
    expect(lines.at(-1)).toBe('');
    const header = lines[0].split(',');
    expect(header.slice(0, 4)).toEqual(['key', 'V', 'energy', 'label']);
    expect(header).toContain('energyPerSite');
    expect(header).not.toContain('densities');
    expect(lines.slice(1, -1).map((l) => l.split(',')[0])).toEqual(['V=0.5', 'V=2', 'V=10']);
    expect(lines[1]).toContain('"Quill, A."');
    expect(Number(lines[2].split(',')[2])).toBe(-1.5);
    expect(pointsCsv(map, { lineEnd: '\n' }).split('\n')).toHaveLength(5);
  });

  it('quotes only what needs it and names files by sweep and id', () => {
    expect(csvField('a"b')).toBe('"a""b"');
    expect(csvField(3.5)).toBe('3.5');
    expect(csvField(undefined)).toBe('');
    expect(exportFileStem('Zigzag: V cut!', '0123456789abcdef')).toBe('zigzag-v-cut-01234567');
    expect(exportFileStem(undefined, 'ffffffff00')).toBe('map-ffffffff');
  });
});
