import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { bandsCommand } from './bands.js';

/** Haldane's model (Haldane, Phys. Rev. Lett. 1988) as a model file. */
function haldaneFile(): string {
  const dir = mkdtempSync(join(tmpdir(), 'pw-bands-'));
  const file = join(dir, 'haldane.json');
  writeFileSync(file, JSON.stringify({
    spec: 'phasewright.model/1',
    name: 'Haldane honeycomb',
    lattice: { kind: 'honeycomb', size: [3, 3], boundary: ['periodic', 'periodic'] },
    particles: { kind: 'hardcore', count: 1 },
    parameters: { t1: 1, t2: 0.1, phi: 'pi/2', M: 0 },
    terms: [
      { kind: 'hop', neighbors: 1, amplitude: 't1' },
      { kind: 'conditional-hop', neighbors: 2, via: 'common-neighbor', when: 'empty', amplitude: 't2', phase: 'turn*phi' },
      { kind: 'onsite', amplitude: 'M*(1-2*sublattice)' },
    ],
  }));
  return file;
}

describe('phasewright bands', () => {
  it('prints the path, two bands, Chern numbers ±1 summing to 0, and the gap 2·3√3 t2 at M = 0', () => {
    const out = JSON.parse(bandsCommand(haldaneFile(), { set: [], points: '31', mesh: '12' }));
    expect(out.spec).toBe('phasewright.bands/1');
    expect(out.bands).toHaveLength(2);
    expect(out.path.labels.map((l: { label: string }) => l.label)).toEqual(['Γ', 'K', 'M', 'Γ']);
    expect(out.chern.groups.map((g: { chern: number }) => Math.abs(g.chern))).toEqual([1, 1]);
    expect(out.chern.total).toBe(0);
    expect(out.gaps[0].direct).toBeCloseTo(2 * 3 * Math.sqrt(3) * 0.1, 8);
  });

  it('--set moves the model past |M| = 3√3 t2 where the Chern numbers vanish; bad flags are named', () => {
    const out = JSON.parse(bandsCommand(haldaneFile(), { set: ['M=0.7'], mesh: '10' }));
    expect(out.chern.groups.map((g: { chern: number }) => g.chern)).toEqual([0, 0]);
    expect(() => bandsCommand(haldaneFile(), { set: [], mesh: '1' })).toThrow(/--mesh/);
  });
});
