import { describe, expect, it } from 'vitest';
import { SpecError } from '../errors.js';
import type { BoundaryKind, Lattice, LatticeKind, LatticeSpec } from '../model/types.js';
import { buildLattice } from './lattices.js';

const periodic = (kind: LatticeKind, size: number[]): LatticeSpec => ({
  kind,
  size,
  boundary: size.map((): BoundaryKind => 'periodic'),
});

/** Number of bonds of shell `s` at every site (sorted distinct values). */
function coordination(l: Lattice, shell: number): number[] {
  const z = new Array<number>(l.sites.length).fill(0);
  for (const b of l.bonds)
    if (b.shell === shell) {
      z[b.from]++;
      z[b.to]++;
    }
  return [...new Set(z)].sort();
}

describe('coordination numbers per shell on periodic clusters', () => {
  // Coordination numbers of the square, triangular, honeycomb and kagome lattices are textbook
  // facts (e.g. Ashcroft & Mermin, Solid State Physics, 1976, ch. 4, for the Bravais ones;
  // honeycomb z1 = 3, z2 = 6 and kagome z1 = 4, z2 = 4 from memory). Ladder and zigzag values
  // follow from their unit cells (documented in lattices.ts).
  const cases: [LatticeKind, number[], number, number, number, number][] = [
    // kind, size, z1, z2, d1, d2
    ['chain', [8], 2, 2, 1, 2],
    ['ladder', [6], 3, 2, 1, Math.SQRT2],
    ['zigzag', [6], 4, 2, 1, Math.sqrt(3)],
    ['square', [4, 4], 4, 4, 1, Math.SQRT2],
    ['triangular', [4, 4], 6, 6, 1, Math.sqrt(3)],
    ['honeycomb', [3, 3], 3, 6, 1, Math.sqrt(3)],
    ['kagome', [3, 3], 4, 4, 1, Math.sqrt(3)],
  ];
  for (const [kind, size, z1, z2, d1, d2] of cases)
    it(`${kind}: z1 = ${z1}, z2 = ${z2}, bond count = Σz/2`, () => {
      const l = buildLattice(periodic(kind, size));
      expect(coordination(l, 1)).toEqual([z1]);
      expect(coordination(l, 2)).toEqual([z2]);
      const n = l.sites.length;
      expect(l.bonds.filter((b) => b.shell === 1).length).toBe((n * z1) / 2);
      expect(l.bonds.filter((b) => b.shell === 2).length).toBe((n * z2) / 2);
      expect(l.shellDistances[0]).toBeCloseTo(d1, 12);
      expect(l.shellDistances[1]).toBeCloseTo(d2, 12);
      for (const b of l.bonds) expect(Math.hypot(b.dx, b.dy)).toBeCloseTo(l.shellDistances[b.shell - 1], 9);
      expect(l.bonds.every((b) => b.classes.includes(b.shell === 1 ? 'nn' : 'nnn'))).toBe(true);
    });

  it('open boundaries drop the bonds that leave the cluster', () => {
    // open chain of L sites: L−1 nn and L−2 nnn bonds; open Lx×Ly square: Lx(Ly−1)+Ly(Lx−1) nn
    const chain = buildLattice({ kind: 'chain', size: [7], boundary: ['open'] });
    expect(chain.bonds.filter((b) => b.shell === 1).length).toBe(6);
    expect(chain.bonds.filter((b) => b.shell === 2).length).toBe(5);
    const sq = buildLattice({ kind: 'square', size: [4, 3], boundary: ['open', 'open'] });
    expect(sq.bonds.filter((b) => b.shell === 1).length).toBe(4 * 2 + 3 * 3);
    expect(sq.bonds.every((b) => b.wrap.every((w) => w === 0))).toBe(true);
  });

  it('ladder and zigzag classes', () => {
    const lad = buildLattice(periodic('ladder', [5]));
    expect(lad.bonds.filter((b) => b.classes.includes('leg')).length).toBe(10);
    expect(lad.bonds.filter((b) => b.classes.includes('rung')).length).toBe(5);
    for (const b of lad.bonds.filter((x) => x.classes.includes('rung'))) expect([b.dx, b.dy]).toEqual([0, 1]);
    const zz = buildLattice(periodic('zigzag', [6]));
    const legs = zz.bonds.filter((b) => b.classes.includes('leg'));
    const zigs = zz.bonds.filter((b) => b.classes.includes('zig'));
    expect(legs.length).toBe(12);
    expect(zigs.length).toBe(12);
    for (const b of legs) expect(zz.sites[b.from].sublattice).toBe(zz.sites[b.to].sublattice);
    for (const b of zigs) expect([zz.sites[b.from].sublattice, zz.sites[b.to].sublattice]).toEqual([0, 1]);
  });
});

describe('numbering, positions, orientation', () => {
  it('index = cellOrder·basisSize + sublattice, axis 0 fastest, r = c·a + basis', () => {
    const l = buildLattice(periodic('kagome', [3, 2]));
    for (const s of l.sites) {
      expect(s.index).toBe((s.cell[0] + 3 * s.cell[1]) * 3 + s.sublattice);
      const x = s.cell[0] * l.translations[0][0] + s.cell[1] * l.translations[1][0] + l.basis[s.sublattice].x;
      const y = s.cell[0] * l.translations[0][1] + s.cell[1] * l.translations[1][1] + l.basis[s.sublattice].y;
      expect(s.x).toBeCloseTo(x, 12);
      expect(s.y).toBeCloseTo(y, 12);
    }
  });

  it('bond displacement = position difference + wrap·L·a, orientation rule holds', () => {
    for (const [kind, size] of [
      ['honeycomb', [3, 4]],
      ['triangular', [4, 5]],
      ['kagome', [3, 3]],
      ['zigzag', [5]],
    ] as [LatticeKind, number[]][]) {
      const l = buildLattice(periodic(kind, size));
      for (const b of l.bonds) {
        const f = l.sites[b.from];
        const t = l.sites[b.to];
        let ex = t.x - f.x;
        let ey = t.y - f.y;
        b.wrap.forEach((w, a) => {
          ex += w * size[a] * l.translations[a][0];
          ey += w * size[a] * l.translations[a][1];
        });
        expect(b.dx).toBeCloseTo(ex, 9);
        expect(b.dy).toBeCloseTo(ey, 9);
        if (f.sublattice !== t.sublattice) expect(f.sublattice).toBeLessThan(t.sublattice);
        else expect(b.dx > 1e-9 || (Math.abs(b.dx) < 1e-9 && b.dy > 0)).toBe(true);
      }
    }
  });

  it('honeycomb nn bonds all run A → B', () => {
    const l = buildLattice(periodic('honeycomb', [3, 3]));
    for (const b of l.bonds.filter((x) => x.shell === 1)) {
      expect(l.sites[b.from].sublattice).toBe(0);
      expect(l.sites[b.to].sublattice).toBe(1);
    }
  });
});

describe('plaquettes', () => {
  const S3 = Math.sqrt(3);
  const cellArea = (l: Lattice) =>
    l.translations.length === 2
      ? Math.abs(l.translations[0][0] * l.translations[1][1] - l.translations[0][1] * l.translations[1][0])
      : NaN;

  // Areas (nn distance 1): triangle √3/4, square 1, hexagon 3√3/2 (elementary geometry).
  const cases: [LatticeKind, number[], Record<number, [number, number]>][] = [
    ['square', [4, 3], { 4: [12, 1] }],
    ['triangular', [4, 3], { 3: [24, S3 / 4] }],
    ['honeycomb', [3, 4], { 6: [12, (3 * S3) / 2] }],
    ['kagome', [3, 3], { 3: [18, S3 / 4], 6: [9, (3 * S3) / 2] }],
  ];
  for (const [kind, size, expected] of cases)
    it(`${kind}: counts, areas, Euler V − E + F = 0 on the torus, Σ areas = cluster area`, () => {
      const l = buildLattice(periodic(kind, size), { shells: 1 });
      const byLen = new Map<number, number[]>();
      for (const p of l.plaquettes) byLen.set(p.sites.length, [...(byLen.get(p.sites.length) ?? []), p.area]);
      expect([...byLen.keys()].sort()).toEqual(Object.keys(expected).map(Number).sort());
      for (const [len, [count, area]] of Object.entries(expected)) {
        const areas = byLen.get(Number(len)) ?? [];
        expect(areas.length).toBe(count);
        for (const a of areas) expect(a).toBeCloseTo(area, 10);
      }
      const nnBonds = l.bonds.filter((b) => b.shell === 1).length;
      expect(l.sites.length - nnBonds + l.plaquettes.length).toBe(0);
      const total = l.plaquettes.reduce((s, p) => s + p.area, 0);
      expect(total).toBeCloseTo(cellArea(l) * size[0] * size[1], 9);
    });

  it('each plaquette is a closed counter-clockwise loop of its steps', () => {
    const l = buildLattice(periodic('kagome', [3, 3]));
    for (const p of l.plaquettes) {
      let sx = 0;
      let sy = 0;
      let cross = 0;
      p.steps.forEach((st, k) => {
        const b = l.bonds[st.bond];
        const [from, to] = st.sign === 1 ? [b.from, b.to] : [b.to, b.from];
        expect(from).toBe(p.sites[k]);
        expect(to).toBe(p.sites[(k + 1) % p.sites.length]);
        cross += sx * st.sign * b.dy - sy * st.sign * b.dx;
        sx += st.sign * b.dx;
        sy += st.sign * b.dy;
      });
      expect(Math.hypot(sx, sy)).toBeLessThan(1e-9);
      expect(cross / 2).toBeCloseTo(p.area, 9);
      expect(p.sites[0]).toBe(Math.min(...p.sites));
    }
  });

  it('open clusters: no outer loop; strips: no loop around the periodic axis', () => {
    expect(buildLattice({ kind: 'square', size: [3, 3], boundary: ['open', 'open'] }).plaquettes.length).toBe(4);
    expect(buildLattice({ kind: 'zigzag', size: [5], boundary: ['open'] }).plaquettes.length).toBe(8); // 4 up + 4 down triangles
    expect(buildLattice(periodic('zigzag', [5])).plaquettes.length).toBe(10);
    expect(buildLattice(periodic('ladder', [5])).plaquettes.length).toBe(5);
    expect(buildLattice(periodic('chain', [5])).plaquettes.length).toBe(0);
  });
});

describe('two-step paths', () => {
  it('turn is +1 for a left (counter-clockwise) turn on a triangle and flips with reversal', () => {
    const l = buildLattice({ kind: 'triangular', size: [3, 3], boundary: ['open', 'open'] });
    // sites: 0 at (0,0), 1 at (1,0), 3 at (1/2, √3/2): the path 0 → 1 → 3 turns left.
    const at = (x: number, y: number) => l.sites.findIndex((s) => Math.hypot(s.x - x, s.y - y) < 1e-9);
    const [a, b, c] = [at(0, 0), at(1, 0), at(0.5, Math.sqrt(3) / 2)];
    const p = l.paths.find((q) => q.via === b && new Set([q.from, q.to]).size === 2 && [q.from, q.to].includes(a) && [q.from, q.to].includes(c));
    expect(p).toBeDefined();
    if (!p) return;
    // canonical orientation: total displacement from a to c is (1/2, √3/2), dx > 0, so a → c
    expect([p.from, p.to]).toEqual([a, c]);
    expect(p.turn).toBe(1);
    // the other way round the same triangle, a → 3?: path a → c through b reversed is c → b → a: clockwise
    const q = l.paths.find((r) => r.via === c && [r.from, r.to].includes(a) && [r.from, r.to].includes(b));
    expect(q?.from).toBe(a);
    expect(q?.turn).toBe(-1); // 0 → 3 → 1 is a right turn
  });

  it('straight paths on a chain have turn 0; each unordered path appears once', () => {
    const l = buildLattice(periodic('chain', [6]));
    const nnPaths = l.paths.filter((p) => l.bonds[p.first.bond].shell === 1 && l.bonds[p.second.bond].shell === 1);
    expect(nnPaths.length).toBe(6);
    expect(nnPaths.every((p) => p.turn === 0 && p.dx === 2)).toBe(true);
    // total count: per site, the pairs of incident bonds of one shell (nn with nn, nnn with nnn):
    // C(2,2) + C(2,2) = 2 per site (no path returns to its start on this cluster)
    expect(l.paths.length).toBe(12);
    const keys = l.paths.map((p) => [p.first.bond, p.second.bond].sort((a, b) => a - b).join(','));
    expect(new Set(keys).size).toBe(l.paths.length);
  });

  it('path steps chain from → via → to and add up to the path displacement and wrap', () => {
    const l = buildLattice(periodic('honeycomb', [3, 3]));
    for (const p of l.paths) {
      const b1 = l.bonds[p.first.bond];
      const b2 = l.bonds[p.second.bond];
      expect(p.first.sign === 1 ? [b1.from, b1.to] : [b1.to, b1.from]).toEqual([p.from, p.via]);
      expect(p.second.sign === 1 ? [b2.from, b2.to] : [b2.to, b2.from]).toEqual([p.via, p.to]);
      expect(p.dx).toBeCloseTo(p.first.sign * b1.dx + p.second.sign * b2.dx, 12);
      expect(p.dy).toBeCloseTo(p.first.sign * b1.dy + p.second.sign * b2.dy, 12);
      p.wrap.forEach((w, a) => expect(w).toBe(p.first.sign * b1.wrap[a] + p.second.sign * b2.wrap[a]));
      const cross = p.first.sign * b1.dx * p.second.sign * b2.dy - p.first.sign * b1.dy * p.second.sign * b2.dx;
      expect(p.turn).toBe(Math.abs(cross) < 1e-9 ? 0 : Math.sign(cross));
      if (p.pair) {
        expect(p.pair.sign).toBe(1);
        expect(l.bonds[p.pair.bond].dx).toBeCloseTo(p.dx, 12);
      }
    }
    // nnn pairs through a common nn neighbour: on honeycomb each nnn bond has exactly one
    const viaNn = l.paths.filter((p) => l.bonds[p.first.bond].shell === 1 && l.bonds[p.second.bond].shell === 1);
    expect(viaNn.length).toBe(l.bonds.filter((b) => b.shell === 2).length);
    expect(viaNn.every((p) => p.pair && l.bonds[p.pair.bond].shell === 2 && p.turn !== 0)).toBe(true);
  });
});

describe('small periodic clusters', () => {
  function sizeError(spec: LatticeSpec, shells: number): SpecError {
    try {
      buildLattice(spec, { shells });
    } catch (e) {
      if (e instanceof SpecError) return e;
      throw e;
    }
    throw new Error('expected a SpecError');
  }
  it('a ring of 2 (nn) or of 4 (nn + nnn) is refused with the length needed', () => {
    const e = sizeError(periodic('chain', [2]), 1);
    expect(e.issues[0].path).toBe('$.lattice.size');
    expect(e.issues[0].message).toContain('axis 0 needs length ≥ 3 (has 2)');
    const e2 = sizeError(periodic('chain', [4]), 2);
    expect(e2.issues[0].message).toContain('axis 0 needs length ≥ 5 (has 4)');
    expect(() => buildLattice(periodic('chain', [4]), { shells: 1 })).not.toThrow();
  });
  it('the 8-site honeycomb torus (2×2) is fine for nn: every pair joined at most once', () => {
    const l = buildLattice(periodic('honeycomb', [2, 2]), { shells: 1 });
    const pairs = new Set(l.bonds.map((b) => `${Math.min(b.from, b.to)}-${Math.max(b.from, b.to)}`));
    expect(pairs.size).toBe(l.bonds.length);
    expect(l.bonds.length).toBe(12);
  });
  it('distinctPairs: false keeps every image (for Bloch sums)', () => {
    const l = buildLattice(periodic('triangular', [1, 1]), { shells: 1, distinctPairs: false });
    expect(l.bonds.length).toBe(3);
    expect(l.bonds.every((b) => b.from === 0 && b.to === 0)).toBe(true);
  });
  it('an open axis never needs a minimum length', () => {
    expect(buildLattice({ kind: 'square', size: [1, 2], boundary: ['open', 'open'] }).bonds.length).toBe(1);
  });
});

describe('momenta and twist', () => {
  it('allowed momenta satisfy e^{i q·L_a a_a} = 1 and number the cells', () => {
    const l = buildLattice(periodic('honeycomb', [3, 4]));
    expect(l.momenta.length).toBe(12);
    for (const q of l.momenta)
      for (let a = 0; a < 2; a++) {
        const phase = l.size[a] * (q[0] * l.translations[a][0] + q[1] * l.translations[a][1]);
        expect(Math.cos(phase)).toBeCloseTo(1, 10);
      }
    expect(new Set(l.momenta.map((q) => q.map((v) => v.toFixed(9)).join(','))).size).toBe(12);
  });
  it('twist is stored on periodic axes; a twist on an open axis is an error', () => {
    expect(buildLattice({ ...periodic('chain', [5]), twist: [0.3] }).twist).toEqual([0.3]);
    expect(buildLattice({ ...periodic('chain', [5]), twist: ['pi/2'] }).twist[0]).toBeCloseTo(Math.PI / 2, 15);
    expect(() => buildLattice({ kind: 'chain', size: [5], boundary: ['open'], twist: [0.3] })).toThrow(/twist\[0\].*open axis/);
  });
});
