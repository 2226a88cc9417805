import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { compileModel } from '../model/compile.js';
import type { ModelSpec } from '../model/types.js';
import { EdSolver, solveEd } from '../ed/solve-ed.js';
import { triangleChirality } from './plaquettes.js';
import { handModel } from '../ed/test-models.js';
import { mulberry32 } from '../util/random.js';

type C = [number, number];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];

/** Applies the spin-½ component `comp` of `site` to an 8-dim complex state (bit set = occupied = up). */
function applySpin(psi: C[], site: number, comp: 'x' | 'y' | 'z'): C[] {
  // rows/cols: 0 = up (bit 1), 1 = down (bit 0)
  const S: Record<string, C[][]> = {
    x: [[[0, 0], [0.5, 0]], [[0.5, 0], [0, 0]]],
    y: [[[0, 0], [0, -0.5]], [[0, 0.5], [0, 0]]],
    z: [[[0.5, 0], [0, 0]], [[0, 0], [-0.5, 0]]],
  };
  const m = S[comp];
  const out: C[] = psi.map(() => [0, 0]);
  for (let s = 0; s < psi.length; s++) {
    const col = (s >> site) & 1 ? 0 : 1;
    for (let row = 0; row < 2; row++) {
      const t = row === 0 ? s | (1 << site) : s & ~(1 << site);
      const v = mul(m[row][col], psi[s]);
      out[t] = [out[t][0] + v[0], out[t][1] + v[1]];
    }
  }
  return out;
}

describe('plaquette observables', () => {
  it('scalar chirality equals ⟨S_1·(S_2×S_3)⟩ from explicit spin-½ matrices, and flips under time reversal', () => {
    const rand = mulberry32(3);
    const u = (): number => 2 * rand() - 1;
    for (const N of [1, 2]) {
      const hops: [number, number, number, number][] = [
        [0, 1, u(), u()],
        [1, 2, u(), u()],
        [2, 0, u(), u()],
      ];
      const onsite: [number, number][] = [[0, 0.3 * u()]];
      const positions: [number, number][] = [[0, 0], [1, 0], [0.5, 0.87]];
      const model = handModel({ nSites: 3, nParticles: N, hops, onsite, positions });
      const sol = new EdSolver({ states: 2 }).solve(model);
      const psi: C[] = Array.from({ length: 8 }, () => [0, 0] as C);
      const v = sol.vectors[0];
      sol.manifold.basis.states.forEach((s, r) => (psi[s] = [v[2 * r], v[2 * r + 1]]));
      const eps: [string, string, string, number][] = [
        ['x', 'y', 'z', 1], ['y', 'z', 'x', 1], ['z', 'x', 'y', 1],
        ['x', 'z', 'y', -1], ['z', 'y', 'x', -1], ['y', 'x', 'z', -1],
      ];
      let chi = 0;
      for (const [a, b, c, sign] of eps) {
        const w = applySpin(applySpin(applySpin(psi, 2, c as 'x'), 1, b as 'x'), 0, a as 'x');
        // ⟨ψ|w⟩ real part (the operator is Hermitian)
        for (let s = 0; s < 8; s++) chi += sign * (psi[s][0] * w[s][0] + psi[s][1] * w[s][1]);
      }
      const ours = triangleChirality({ basis: sol.manifold.basis, vectors: [v] }, 0, 1, 2);
      expect(Math.abs(chi)).toBeGreaterThan(1e-3);
      expect(ours).toBeCloseTo(chi, 12);
      const reversed = handModel({ nSites: 3, nParticles: N, hops: hops.map(([f, t, re, im]) => [f, t, re, -im]), onsite, positions });
      const tr = new EdSolver({ states: 2 }).solve(reversed);
      expect(triangleChirality(tr.manifold, 0, 1, 2)).toBeCloseTo(-ours, 10);
    }
  });

  it('flux per triangle of the uniform-flux example equals the flux it encodes (π/4), and circulation is the sum of currents', () => {
    const spec = JSON.parse(readFileSync(new URL('../../examples/triangular-flux.json', import.meta.url), 'utf8')) as ModelSpec;
    const model = compileModel({ ...spec, lattice: { ...spec.lattice, size: [4, 3] }, particles: { kind: 'hardcore', count: 2 } });
    const r = solveEd(model, { observables: ['currents', 'plaquettes'] });
    expect(r.plaquettes.length).toBeGreaterThan(0);
    for (const p of r.plaquettes) expect(Math.abs(p.flux)).toBeCloseTo(Math.PI / 4, 10);
    const current = new Map(r.bonds.map((b) => [`${b.from}>${b.to}`, b.current]));
    for (const p of r.plaquettes) {
      let sum = 0;
      for (let s = 0; s < p.sites.length; s++) {
        const a = p.sites[s];
        const b = p.sites[(s + 1) % p.sites.length];
        sum += current.get(`${a}>${b}`) ?? -(current.get(`${b}>${a}`) ?? 0);
      }
      expect(p.circulation).toBeCloseTo(sum, 12);
    }
  });

  it('a triangle of positive (frustrated) hoppings has flux π; −|t| hoppings flux 0', () => {
    for (const [t, expected] of [
      [1, Math.PI],
      [-1, 0],
    ]) {
      const m = handModel({ nSites: 3, nParticles: 1, hops: [[0, 1, t, 0], [1, 2, t, 0], [2, 0, t, 0]], plaquettes: [[0, 1, 2]] });
      const r = solveEd(m, { observables: ['plaquettes'] });
      expect(r.plaquettes[0].flux).toBeCloseTo(expected, 12);
    }
  });
});
