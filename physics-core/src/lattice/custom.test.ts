import { describe, expect, it } from 'vitest';
import type { LatticeSpec } from '../model/types.js';
import { buildLattice } from './lattices.js';
import { buildPlaquettes } from './plaquettes.js';

describe('custom lattices', () => {
  it('a one-site square cell reproduces the built-in square lattice', () => {
    const custom = buildLattice({
      kind: 'custom',
      size: [4, 5],
      boundary: ['periodic', 'open'],
      custom: { sites: [{ x: 0, y: 0 }], translations: [[1, 0], [0, 1]] },
    });
    const builtin = buildLattice({ kind: 'square', size: [4, 5], boundary: ['periodic', 'open'] });
    const strip = (l: typeof custom) => l.bonds.map((b) => [b.from, b.to, b.shell, b.dx, b.dy, ...b.wrap]);
    expect(strip(custom)).toEqual(strip(builtin));
    expect(custom.plaquettes.map((p) => p.sites)).toEqual(builtin.plaquettes.map((p) => p.sites));
  });

  it('Lieb lattice with named bonds: coordination 4 (corner) and 2 (edge), one 8-site loop per cell', () => {
    // Lieb lattice: corner (0,0), edge sites (1,0) and (0,1), period 2 (a standard construction).
    const spec: LatticeSpec = {
      kind: 'custom',
      size: [3, 3],
      boundary: ['periodic', 'periodic'],
      custom: {
        sites: [{ x: 0, y: 0 }, { x: 1, y: 0, sublattice: 1 }, { x: 0, y: 1, sublattice: 1 }],
        translations: [[2, 0], [0, 2]],
        bonds: [
          { class: 'horizontal', from: 0, to: 1, offset: [0, 0] },
          { class: 'horizontal', from: 1, to: 0, offset: [1, 0] },
          { class: 'long', from: 0, to: 0, offset: [1, 1] },
          { class: 'corner', from: 1, to: 2, offset: [1, 0] },
        ],
      },
    };
    const l = buildLattice(spec);
    const z = new Array<number>(l.sites.length).fill(0);
    for (const b of l.bonds.filter((x) => x.shell === 1)) {
      z[b.from]++;
      z[b.to]++;
    }
    l.sites.forEach((s) => expect(z[s.index]).toBe(s.sublattice === 0 ? 4 : 2));
    expect(l.bonds.filter((b) => b.classes.includes('horizontal')).length).toBe(18);
    for (const b of l.bonds.filter((x) => x.classes.includes('horizontal'))) expect(b.dy).toBe(0);
    // 'long' (length 2√2) lies beyond the shells laid (1, √2): laid anyway, with the shell of its
    // length among 1, √2, 2, √5, 2√2 → shell 5
    const long = l.bonds.filter((b) => b.classes.includes('long'));
    expect(long.length).toBe(9);
    for (const b of long) expect([b.shell, b.classes]).toEqual([5, ['long']]);
    expect(l.shellDistances.map((d) => d * d)).toEqual([1, 2, 4, 5, 8].map((v) => expect.closeTo(v, 12)));
    // 'corner' (length √2) coincides with automatic nnn bonds between the edge sites: class added
    const corner = l.bonds.filter((b) => b.classes.includes('corner'));
    expect(corner.length).toBe(9);
    for (const b of corner) expect(b.classes).toEqual(['nnn', 'corner']);
    // the basis label is kept in `basis`; Site.sublattice is the index in the cell
    expect(l.basis.map((b) => b.sublattice)).toEqual([0, 1, 1]);
    expect(l.sites.slice(0, 3).map((s) => s.sublattice)).toEqual([0, 1, 2]);
    expect(l.plaquettes.length).toBe(9);
    for (const p of l.plaquettes) {
      expect(p.sites.length).toBe(8);
      expect(p.area).toBeCloseTo(4, 12);
    }
  });

  it('fallback for crossing nn bonds: shortest cycles, each closed and counter-clockwise', () => {
    const l = buildLattice({ kind: 'square', size: [4, 4], boundary: ['periodic', 'periodic'] }, { shells: 1 });
    const loops = buildPlaquettes(l.sites, l.bonds, 1, false);
    expect(loops.length).toBeGreaterThan(0);
    for (const p of loops) {
      expect(p.sites.length).toBe(4);
      expect(p.area).toBeCloseTo(1, 12);
    }
  });
});
