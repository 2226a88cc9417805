import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import chainExtended from '../../examples/chain-extended.json' with { type: 'json' };
import honeycombNnn from '../../examples/honeycomb-conditional-nnn.json' with { type: 'json' };
import triangularFlux from '../../examples/triangular-flux.json' with { type: 'json' };
import zigzagConditional from '../../examples/zigzag-conditional.json' with { type: 'json' };
import { SpecError } from '../errors.js';
import { compileModel } from './compile.js';
import { describeModel, estimateHilbertDimension } from './describe.js';
import type { CompiledModel, CompiledTerm, ModelSpec } from './types.js';
import { parseModelSpec } from './validate.js';

const load = (json: unknown): ModelSpec => parseModelSpec(json);
const term = <K extends CompiledTerm['kind']>(c: CompiledModel, i: number, kind: K) => {
  const t = c.terms[i];
  if (t.kind !== kind) throw new Error(`term ${i} is ${t.kind}`);
  return t as Extract<CompiledTerm, { kind: K }>;
};

/** Single-particle Hamiltonian h[to][from] += t, h[from][to] += conj(t) from hop-like terms. */
function oneParticle(c: CompiledModel): { re: number[][]; im: number[][] } {
  const n = c.nSites;
  const re = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const im = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (const t of c.terms) {
    if (t.kind !== 'hop' && t.kind !== 'conditional-hop') continue;
    for (const e of t.entries) {
      re[e.to][e.from] += e.re;
      im[e.to][e.from] += e.im;
      re[e.from][e.to] += e.re;
      im[e.from][e.to] -= e.im;
    }
  }
  return { re, im };
}

/** Eigenvalues of a complex Hermitian matrix via the real symmetric [[Re, −Im], [Im, Re]] (ml-matrix). */
function hermitianEigenvalues(re: number[][], im: number[][]): number[] {
  const n = re.length;
  const m = Matrix.zeros(2 * n, 2 * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      m.set(i, j, re[i][j]);
      m.set(i + n, j + n, re[i][j]);
      m.set(i, j + n, -im[i][j]);
      m.set(i + n, j, im[i][j]);
    }
  const ev = new EigenvalueDecomposition(m, { assumeSymmetric: true }).realEigenvalues.sort((a, b) => a - b);
  return ev.filter((_, k) => k % 2 === 0); // every eigenvalue appears twice
}

describe('examples compile', () => {
  it('(a) zigzag: hops on zig bonds, conditional hops along each leg through the other leg, phase flips with the turn', () => {
    const c = compileModel(load(zigzagConditional));
    const L = 8;
    expect(c.nSites).toBe(2 * L);
    expect(c.nParticles).toBe(L);
    const hop = term(c, 0, 'hop');
    expect(hop.entries.length).toBe(2 * L);
    for (const e of hop.entries) expect(c.lattice.bonds[e.bond].classes).toContain('zig');
    const ch = term(c, 1, 'conditional-hop');
    expect(ch.when).toBe('empty');
    expect(ch.entries.length).toBe(2 * L); // one path per leg bond
    const theta = Math.PI / 2;
    const g = 0.5;
    for (const e of ch.entries) {
      const p = c.lattice.paths[e.path];
      const sub = c.lattice.sites[e.from].sublattice;
      expect(c.lattice.sites[e.to].sublattice).toBe(sub); // along one leg
      expect(c.lattice.sites[e.via].sublattice).toBe(1 - sub); // through the other leg
      expect(p.turn).toBe(sub === 0 ? -1 : 1); // lower leg passes above (clockwise), upper leg below
      expect(e.re).toBeCloseTo(-g * Math.cos(p.turn * theta), 12);
      expect(e.im).toBeCloseTo(-g * Math.sin(p.turn * theta), 12);
    }
    expect(term(c, 2, 'interaction').entries.length).toBe(2 * L);
  });

  it('(b) honeycomb, one particle: spectrum equals the Haldane bands at the cluster momenta', () => {
    // Haldane, Phys. Rev. Lett. 61, 2015 (1988), with M = 0 (formula from memory):
    // ε±(k) = 2 t2 cos φ Σ_i cos(k·b_i) ± sqrt((2 t2 sin φ Σ_i sin(k·b_i))² + t1² |Σ_j e^{ik·δ_j}|²),
    // δ_j the three nn vectors, b_i three nnn vectors at 120°; here t2 → −t2 (amplitude "-t2").
    for (const theta of [Math.PI / 2, 0.7]) {
      const c = compileModel(load(honeycombNnn), { theta });
      expect(c.nParticles).toBe(1);
      expect(term(c, 1, 'conditional-hop').entries.length).toBe(c.nSites * 3); // 6 nnn per site / 2
      const { re, im } = oneParticle(c);
      const got = hermitianEigenvalues(re, im);
      const t1 = 1;
      const t2 = -0.2;
      const S3 = Math.sqrt(3);
      const delta = [
        [0, 1],
        [-S3 / 2, -0.5],
        [S3 / 2, -0.5],
      ];
      const b = [
        [S3, 0],
        [-S3 / 2, 1.5],
        [-S3 / 2, -1.5],
      ];
      const want: number[] = [];
      for (const [qx, qy] of c.lattice.momenta) {
        const cs = b.reduce((s, v) => s + Math.cos(qx * v[0] + qy * v[1]), 0);
        const sn = b.reduce((s, v) => s + Math.sin(qx * v[0] + qy * v[1]), 0);
        const fr = delta.reduce((s, v) => s + Math.cos(qx * v[0] + qy * v[1]), 0);
        const fi = delta.reduce((s, v) => s + Math.sin(qx * v[0] + qy * v[1]), 0);
        const m = 2 * t2 * Math.sin(theta) * sn;
        const r = Math.sqrt(m * m + t1 * t1 * (fr * fr + fi * fi));
        want.push(2 * t2 * Math.cos(theta) * cs + r, 2 * t2 * Math.cos(theta) * cs - r);
      }
      want.sort((p, q) => p - q);
      got.forEach((v, k) => expect(v).toBeCloseTo(want[k], 10));
    }
  });

  it('(c) triangular cylinder: every triangle encloses the flux phi (sum of Peierls phases, ccw)', () => {
    for (const phi of [Math.PI / 4, 1.1]) {
      // J = −1 makes every amplitude +1, so the entry's argument is the Peierls phase
      const c = compileModel(load(triangularFlux), { J: -1, phi });
      const hop = term(c, 0, 'hop');
      const phaseOf = new Map(hop.entries.map((e) => [e.bond, Math.atan2(e.im, e.re)]));
      expect(c.lattice.plaquettes.length).toBe(2 * 6 * 3); // 6 columns × 3 rows of up+down triangles
      for (const p of c.lattice.plaquettes) {
        const total = p.steps.reduce((s, st) => s + st.sign * (phaseOf.get(st.bond) ?? NaN), 0);
        const diff = total - phi;
        expect(Math.abs(Math.atan2(Math.sin(diff), Math.cos(diff)))).toBeLessThan(1e-10);
      }
      for (const e of hop.entries) expect(Math.hypot(e.re, e.im)).toBeCloseTo(1, 14);
    }
  });

  it('(d) chain with nearest and next-nearest interactions', () => {
    const c = compileModel(load(chainExtended));
    expect(term(c, 1, 'interaction').entries.length).toBe(12);
    const nnn = term(c, 2, 'interaction');
    expect(nnn.entries.length).toBe(12);
    for (const e of nnn.entries) {
      expect((e.j - e.i + 12) % 12).toBe(2);
      expect(e.value).toBe(0.5);
    }
    expect(describeModel(c).lines[0]).toContain('12 sites, 6 particles, dimension 924');
  });
});

describe('twist', () => {
  const ring = (twist: string): ModelSpec =>
    load({
      spec: 'phasewright.model/1',
      lattice: { kind: 'chain', size: [5], boundary: ['periodic'], twist: [twist] },
      particles: { kind: 'hardcore', count: 1 },
      parameters: { phi: 0.7 },
      terms: [
        { kind: 'hop', amplitude: 1 },
        { kind: 'conditional-hop', neighbors: 2, when: 'empty', amplitude: 1 },
      ],
    });
  it('a ring with twist φ has total phase φ around it (and 2φ for paths going round twice)', () => {
    const c = compileModel(ring('phi'));
    const hop = term(c, 0, 'hop');
    // every nn bond runs +x, so the loop 0→1→…→4→0 follows each bond once
    const total = hop.entries.reduce((s, e) => s + Math.atan2(e.im, e.re), 0);
    expect(total).toBeCloseTo(0.7, 12);
    const ch = term(c, 1, 'conditional-hop');
    expect(ch.entries.length).toBe(5);
    expect(ch.entries.reduce((s, e) => s + Math.atan2(e.im, e.re), 0)).toBeCloseTo(1.4, 12);
    // the single crossing bond carries the whole twist (sign: + direction → e^{+iφ})
    const crossing = hop.entries.filter((e) => e.im !== 0);
    expect(crossing.map((e) => [e.from, e.to])).toEqual([[4, 0]]);
    expect(crossing[0].im).toBeCloseTo(Math.sin(0.7), 14);
  });
  it('one-particle spectrum of a twisted ring with t = +1 is 2cos((2πm + φ)/L)', () => {
    // free particle on a ring of L sites threaded by flux φ: ε_m = 2t cos((2πm + φ)/L) (Bloch's theorem)
    const c = compileModel(ring('phi'));
    c.terms = [c.terms[0]];
    const { re, im } = oneParticle(c);
    const got = hermitianEigenvalues(re, im);
    const want = [0, 1, 2, 3, 4].map((m) => 2 * Math.cos((2 * Math.PI * m + 0.7) / 5)).sort((a, b) => a - b);
    got.forEach((v, k) => expect(v).toBeCloseTo(want[k], 12));
  });
});

describe('selection and values', () => {
  const base = (terms: unknown[], lattice: unknown = { kind: 'ladder', size: [4], boundary: ['periodic'] }) =>
    load({
      spec: 'phasewright.model/1',
      lattice,
      particles: { kind: 'hardcore', filling: 0.5 },
      parameters: { J: 1, V: 2, M: 0.3 },
      terms,
    });
  it('neither neighbors nor class means nn; both means the intersection', () => {
    const c = compileModel(
      base([
        { kind: 'hop', amplitude: '-J' },
        { kind: 'hop', neighbors: 1, class: 'rung', amplitude: '-J' },
        { kind: 'interaction', neighbors: 2, amplitude: 'V' },
        { kind: 'interaction', class: 'leg', amplitude: 'V*dx' },
      ]),
    );
    expect(c.terms.map((t) => t.entries.length)).toEqual([12, 4, 8, 8]);
    for (const e of term(c, 3, 'interaction').entries) expect(e.value).toBe(2); // dx = 1 on legs
  });
  it('zero amplitudes are kept so sweeps can re-weight', () => {
    const c = compileModel(load(zigzagConditional), { g: 0 });
    const ch = term(c, 1, 'conditional-hop');
    expect(ch.entries.length).toBe(16);
    expect(ch.entries.every((e) => e.re === 0 && e.im === 0)).toBe(true);
    expect(describeModel(c).terms[1]).toMatchObject({ entries: 16, nonzero: 0 });
  });
  it('onsite sees the sublattice label and position', () => {
    const c = compileModel(base([{ kind: 'onsite', amplitude: 'M*(1-2*sublattice) + y' }]));
    for (const e of term(c, 0, 'onsite').entries) {
      const s = c.lattice.sites[e.i];
      expect(e.value).toBeCloseTo(0.3 * (1 - 2 * s.sublattice) + s.y, 14);
    }
  });
  it('overrides: derived parameters follow, unknown names are refused', () => {
    const c = compileModel(load(honeycombNnn), { theta: 1 });
    expect(c.parameters.theta).toBe(1);
    expect(c.spec.parameters.theta).toBe(1);
    const f = compileModel(load(triangularFlux), { phi: 0.3 });
    expect(f.parameters.B).toBeCloseTo(0.3 / (Math.sqrt(3) / 4), 14);
    expect(() => compileModel(load(triangularFlux), { psi: 1 })).toThrow(SpecError);
    try {
      compileModel(load(triangularFlux), { psi: 1 });
    } catch (e) {
      expect((e as SpecError).issues[0].path).toBe('$.parameters.psi');
    }
  });
  it('a non-real value names the term path and the bond', () => {
    let err: unknown;
    try {
      compileModel(base([{ kind: 'hop', amplitude: 'sqrt(dx - 1)' }])); // dx = 0 on rungs → −1
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(SpecError);
    const issue = (err as SpecError).issues[0];
    expect(issue.path).toBe('$.terms[0].amplitude');
    expect(issue.message).toMatch(/not a finite real number on bond \d+ \(\d+→\d+, dx=0, dy=1\)/);
  });
});

describe('sizes', () => {
  it('estimateHilbertDimension is the binomial coefficient', () => {
    expect(estimateHilbertDimension(24, 12)).toBe(2704156); // C(24,12), Pascal's triangle
    expect(estimateHilbertDimension(32, 16)).toBe(601080390); // C(32,16)
    expect(estimateHilbertDimension(10, 0)).toBe(1);
    expect(estimateHilbertDimension(10, 11)).toBe(0);
  });
});
