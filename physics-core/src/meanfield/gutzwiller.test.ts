import { describe, expect, it } from 'vitest';
import { compileModel } from '../model/compile.js';
import type { ModelSpec } from '../model/types.js';
import { mulberry32 } from '../util/random.js';
import { supercellEnergy } from './energy.js';
import { minimiseMeanField, prepareMeanField, solveMeanField } from './gutzwiller.js';
import { hardcoreSiteSpace } from './site-space.js';
import type { SupercellModel } from './supercell-model.js';
import { convexEnvelopeAt, sectorGroundEnergies, xxzSpec } from './test-helpers.js';

/**
 * A model with every term kind, complex and conditional hops (random couplings). `small` keeps
 * only nearest-neighbour terms so that ED clusters of 6–9 sites stay legal.
 */
function richSpec(seed: number, lattice: 'triangular' | 'zigzag' | 'kagome' = 'triangular', small = false): ModelSpec {
  const r = mulberry32(seed);
  const u = (a: number, b: number) => a + (b - a) * r();
  const size = lattice === 'zigzag' ? (small ? [3] : [6]) : small ? [3, 3] : [6, 6];
  const terms: ModelSpec['terms'] = [
    { kind: 'hop', neighbors: 1, amplitude: '-J', phase: 'A*dx' },
    { kind: 'conditional-hop', neighbors: 1, via: 'common-neighbor', when: 'empty', amplitude: 'g', phase: 'turn*th' },
    { kind: 'conditional-hop', neighbors: 1, via: 'common-neighbor', when: 'occupied', amplitude: 'h', phase: 'turn*th/2' },
    { kind: 'interaction', neighbors: 1, amplitude: 'V' },
    { kind: 'onsite', amplitude: 'e' },
  ];
  if (!small) {
    terms.push(
      { kind: 'conditional-hop', neighbors: 2, via: 'common-neighbor', when: 'occupied', amplitude: 'h', phase: 'turn*th/3' },
      { kind: 'interaction', neighbors: 2, amplitude: 'W' },
    );
  }
  return {
    spec: 'phasewright.model/1',
    lattice: { kind: lattice, size, boundary: size.map(() => 'periodic' as const) },
    particles: { kind: 'hardcore', filling: lattice === 'zigzag' ? 0.5 : 1 / 3 },
    parameters: { J: u(0.5, 1.5), A: u(-1, 1), g: u(-1, 1), th: u(-3, 3), h: u(-1, 1), V: u(0, 2), W: u(-1, 1), e: u(-1, 1) },
    terms,
  };
}

function energyAt(model: SupercellModel, x: Float64Array, mu: number, grad?: Float64Array): number {
  const n = model.nSites;
  const m = new Float64Array(3 * n);
  const dm = new Float64Array(3 * n);
  hardcoreSiteSpace.moments(x, m, n);
  const e = supercellEnergy(model, m, mu, dm);
  if (grad) hardcoreSiteSpace.pullback(x, dm, grad, n);
  return e;
}

describe('Gutzwiller mean-field: hardcore bosons at half filling, J and nearest V (classical XXZ via Matsubara & Matsuda, Prog. Theor. Phys. 1956)', () => {
  // b† = S⁺, n = S^z + ½: −J(b†_i b_j + h.c.) + V n_i n_j = −2J(SˣSˣ + SʸSʸ) + V(S^zS^z + …) + const.
  // Classical spins |S| = ½ at zero magnetisation: in-plane (superfluid) E/bond = −J/2 + V/4,
  // Néel along z (checkerboard) E/bond = 0; they cross at V = 2J.
  const cases = [
    { kind: 'chain' as const, size: [8], supercell: [2] },
    { kind: 'square' as const, size: [4, 4], supercell: [2, 2] },
    { kind: 'honeycomb' as const, size: [3, 3], supercell: [1, 1] },
  ];
  for (const c of cases) {
    it(`${c.kind}: E/bond = min(−J/2 + V/4, 0), superfluid below V = 2J, checkerboard above`, () => {
      for (const V of [0.5, 1.9, 2.1, 3]) {
        const { result } = solveMeanField(xxzSpec(c.kind, c.size, V), { supercell: c.supercell, starts: 6 });
        // Per bond of the supercell (its sites and bonds repeat over the lattice).
        const bonds = result.bonds.length;
        expect((result.energyPerSite * result.sites.length) / bonds).toBeCloseTo(Math.min(-0.5 + V / 4, 0), 7);
        expect(result.convergence.converged).toBe(true);
        const densities = result.sites.map((s) => s.density);
        if (V < 2) {
          densities.forEach((d) => expect(d).toBeCloseTo(0.5, 6));
          result.sites.forEach((s) => expect(Math.hypot(...s.condensate)).toBeCloseTo(0.5, 6));
          expect(result.condensateFraction).toBeCloseTo(0.5, 6);
        } else {
          expect(Math.max(...densities)).toBeCloseTo(1, 6);
          expect(Math.min(...densities)).toBeCloseTo(0, 6);
          expect(result.condensateFraction).toBeCloseTo(0, 6);
          // Perfect checkerboard: S(Q)/Ns = 1/4 at the ordering vector (chain, square); on the
          // honeycomb the A/B order peaks at reciprocal vectors with G·τ_B = ±2π/3, where
          // |½(1 − e^{±2πi/3})|²/Ns² = 3/16.
          const peak = Math.max(...result.structureFactor.map((s) => s.value));
          expect(peak / result.sites.length).toBeCloseTo(c.kind === 'honeycomb' ? 3 / 16 : 0.25, 6);
        }
      }
    });
  }
});

describe('Gutzwiller mean-field: gradient and reduction invariants', () => {
  for (const [seed, lattice, supercell] of [[1, 'triangular', 'sqrt3'], [2, 'triangular', [2, 1]], [3, 'zigzag', [2]], [4, 'kagome', [1, 1]]] as const) {
    it(`analytic gradient equals central finite differences (${lattice}, supercell ${JSON.stringify(supercell)}, complex and conditional terms)`, () => {
      const problem = prepareMeanField(richSpec(seed, lattice), { supercell: supercell as never });
      const { model } = problem;
      expect(model.cond.from.length).toBeGreaterThan(0);
      const r = mulberry32(seed + 100);
      const x = Float64Array.from({ length: 2 * model.nSites }, () => 6 * r() - 3);
      const g = new Float64Array(x.length);
      const mu = 0.37;
      energyAt(model, x, mu, g);
      const h = 1e-6;
      for (let k = 0; k < x.length; k++) {
        const xp = Float64Array.from(x);
        const xm = Float64Array.from(x);
        xp[k] += h;
        xm[k] -= h;
        const fd = (energyAt(model, xp, mu) - energyAt(model, xm, mu)) / (2 * h);
        expect(g[k]).toBeCloseTo(fd, 6);
      }
    });
  }

  it('supercell energy (re-weighted from the cache) equals the brute-force ⟨H⟩ of a fresh compile over the whole cluster divided by the number of copies', () => {
    for (const [seed, supercell] of [[5, 'sqrt3'], [6, [3, 1]], [7, [2, 2]]] as const) {
      // Warm the structure cache with other couplings first, so the model is re-weighted
      // (reweight.ts) rather than freshly compiled; the reference is a fresh compile.
      prepareMeanField(richSpec(seed + 1000), { supercell: supercell as never });
      const problem = prepareMeanField(richSpec(seed), { supercell: supercell as never });
      const { model } = problem;
      const spec = richSpec(seed);
      const size = problem.compiled.lattice.size;
      const compiled = compileModel({ ...spec, lattice: { ...spec.lattice, size, boundary: size.map(() => 'periodic' as const) }, particles: { kind: 'hardcore', count: 1 } });
      const r = mulberry32(seed);
      const x = Float64Array.from({ length: 2 * model.nSites }, () => 6 * r() - 3);
      const m = new Float64Array(3 * model.nSites);
      hardcoreSiteSpace.moments(x, m, model.nSites);
      const at = (s: number) => model.image[s] * 3;
      let total = 0;
      for (const t of compiled.terms) {
        for (const e of t.entries as { from?: number; to?: number; via?: number; re?: number; im?: number; i?: number; j?: number; value?: number }[]) {
          if (t.kind === 'hop' || t.kind === 'conditional-hop') {
            const f = at(e.from!), o = at(e.to!);
            // 2 Re(t · conj(β_to) · β_from)
            const cr = m[o + 1] * m[f + 1] + m[o + 2] * m[f + 2];
            const ci = m[o + 1] * m[f + 2] - m[o + 2] * m[f + 1];
            let w = 1;
            if (t.kind === 'conditional-hop') w = t.when === 'empty' ? 1 - m[at(e.via!)] : m[at(e.via!)];
            total += 2 * (e.re! * cr - e.im! * ci) * w;
          } else if (t.kind === 'interaction') total += e.value! * m[at(e.i!)] * m[at(e.j!)];
          else total += e.value! * m[at(e.i!)];
        }
      }
      const copies = compiled.nSites / model.nSites;
      expect(supercellEnergy(model, m, 0)).toBeCloseTo(total / copies, 10);
    }
  });

  it('bond current equals −∂E/∂A at fixed state (phase e^{iA} on every hop moving a particle from → to)', () => {
    const problem = prepareMeanField(richSpec(8), { supercell: 'sqrt3' });
    const { result } = solveMeanField(richSpec(8), { supercell: 'sqrt3', starts: 4 });
    const params = Float64Array.from((result.extras as { meanField: { params: number[] } }).meanField.params);
    const { model } = problem;
    const links = (result.extras as { links: { from: number; to: number; dcell: number[]; current: number }[] }).links;
    const h = 1e-6;
    for (const link of links.slice(0, 6)) {
      const linkIndex = model.links.findIndex((l) => l.from === link.from && l.to === link.to && l.dcell.join() === link.dcell.join());
      const shifted = (A: number): number => {
        const copy: SupercellModel = { ...model, hop: { ...model.hop, re: Float64Array.from(model.hop.re), im: Float64Array.from(model.hop.im) }, cond: { ...model.cond, re: Float64Array.from(model.cond.re), im: Float64Array.from(model.cond.im) } };
        for (const part of [copy.hop, copy.cond]) {
          for (let k = 0; k < part.link.length; k++) {
            if (part.link[k] !== linkIndex) continue;
            const a = part.sign[k] * A; // along the link: e^{iA}; entries stored against it get e^{−iA}
            const [re, im] = [part.re[k], part.im[k]];
            part.re[k] = re * Math.cos(a) - im * Math.sin(a);
            part.im[k] = re * Math.sin(a) + im * Math.cos(a);
          }
        }
        return energyAt(copy, params, 0);
      };
      const dEdA = (shifted(h) - shifted(-h)) / (2 * h);
      expect(link.current).toBeCloseTo(-dEdA, 6);
    }
  });
});

describe('Gutzwiller mean-field: variational bound against exact diagonalisation', () => {
  // Condition: the ED cluster is periodic with a size that is a multiple of the supercell and
  // large enough that each of its bonds/paths is a distinct bond of the infinite lattice; then a
  // supercell-periodic product state is a legitimate state of the cluster. It is a superposition
  // of particle numbers, so ⟨H⟩ ≥ Σ_N p_N E₀(N) ≥ Ē(⟨N⟩), the lower convex envelope of the
  // sector ground energies E₀(N) at ⟨N⟩ = filling × sites (= E₀ itself where E₀(N) is convex).
  // Reference: dense diagonalisation of every sector with ml-matrix.
  const cases: { name: string; spec: ModelSpec; supercell: number[] | 'sqrt3' }[] = [
    { name: 'chain of 8, J–V', spec: xxzSpec('chain', [8], 1.2), supercell: [2] },
    { name: 'triangular 3×3 with complex and conditional hops', spec: richSpec(11, 'triangular', true), supercell: 'sqrt3' },
    { name: 'zigzag of 3 cells (6 sites) with conditional hops', spec: richSpec(12, 'zigzag', true), supercell: [1] },
  ];
  for (const c of cases) {
    it(`${c.name}: E_MF/site ≥ Ē_ED(N)/site`, () => {
      const { result } = solveMeanField(c.spec, { supercell: c.supercell, starts: 8 });
      const ed = compileModel(c.spec);
      const sectors = sectorGroundEnergies(ed);
      const bound = convexEnvelopeAt(sectors, (result.energyPerSite, (result.extras as { meanField: { density: number } }).meanField.density * ed.nSites));
      expect(result.energyPerSite).toBeGreaterThanOrEqual(bound / ed.nSites - 1e-9);
      // and the product state is not absurdly far above (sanity: within the bandwidth)
      expect(result.energyPerSite - bound / ed.nSites).toBeLessThan(1);
    });
  }
});

describe('Gutzwiller mean-field: gauge invariance', () => {
  it('a random site gauge transformation t_ij → t_ij e^{i(χ_to − χ_from)} leaves the minimum unchanged', () => {
    const problem = prepareMeanField(richSpec(21), { supercell: 'sqrt3' });
    const base = minimiseMeanField(problem, { mu: 0.3, starts: 6 });
    const r = mulberry32(99);
    const chi = Array.from({ length: problem.model.nSites }, () => 2 * Math.PI * r());
    const gauge = (part: { from: Int32Array; to: Int32Array; re: Float64Array; im: Float64Array }) => {
      const re = Float64Array.from(part.re);
      const im = Float64Array.from(part.im);
      for (let k = 0; k < re.length; k++) {
        const a = chi[part.to[k]] - chi[part.from[k]];
        [re[k], im[k]] = [part.re[k] * Math.cos(a) - part.im[k] * Math.sin(a), part.re[k] * Math.sin(a) + part.im[k] * Math.cos(a)];
      }
      return { re, im };
    };
    const model: SupercellModel = { ...problem.model, hop: { ...problem.model.hop, ...gauge(problem.model.hop) }, cond: { ...problem.model.cond, ...gauge(problem.model.cond) } };
    const transformed = minimiseMeanField({ ...problem, model }, { mu: 0.3, starts: 6 });
    expect(transformed.grandPotential).toBeCloseTo(base.grandPotential, 8);
  });

  it('a flux quantum through the supercell (twist 2π on a ring of the supercell length) changes nothing; on a shorter supercell it does', () => {
    const spec = (twist: number, size: number): ModelSpec => ({ ...xxzSpec('chain', [size], 0.7), lattice: { kind: 'chain', size: [size], boundary: ['periodic'], twist: [twist] } });
    const plain = solveMeanField(spec(0, 4), { supercell: [4], starts: 6 }).result.energy;
    const threaded = solveMeanField(spec(2 * Math.PI, 4), { supercell: [4], starts: 6 }).result.energy;
    expect(threaded).toBeCloseTo(plain, 8);
    // The same vector potential (π/2 per cell) on a one-cell supercell cannot be gauged away:
    // E/bond = −2J·¼·cos(π/2) + V/4.
    const oneCell = solveMeanField(spec(2 * Math.PI, 4), { supercell: [1], starts: 4 }).result;
    expect(oneCell.energyPerSite).toBeCloseTo(0.7 / 4, 8);
    expect(oneCell.energyPerSite).toBeGreaterThan(plain / 4 + 0.1);
  });

  it('a Peierls phase α·dx with α = 2π/3 is a pure gauge for a three-cell supercell', () => {
    const base = xxzSpec('square', [6, 6], 0.4);
    const withPhase: ModelSpec = { ...base, parameters: { ...base.parameters, a: '2*pi/3' }, terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J', phase: 'a*dx' }, base.terms[1]] };
    const e0 = solveMeanField(base, { supercell: [3, 1], starts: 6 }).result.energyPerSite;
    const e1 = solveMeanField(withPhase, { supercell: [3, 1], starts: 6 }).result.energyPerSite;
    expect(e1).toBeCloseTo(e0, 8);
  });
});

describe('Gutzwiller mean-field: ensemble, starts and options', () => {
  it('fixed filling inside the first-order region of the XXZ spin-flop transition warns about phase separation', () => {
    // Classical Ising-like XXZ (V > 2J) in a field: the Néel plateau ends in a first-order jump
    // of the magnetisation (spin flop), so a filling just off ½ is not reached by any μ.
    const spec = { ...xxzSpec('square', [4, 4], 4), particles: { kind: 'hardcore' as const, filling: 7 / 16 } };
    const { result } = solveMeanField(spec, { supercell: [2, 2], starts: 6 });
    expect(result.warnings?.join(' ')).toMatch(/phase separation/);
  });

  it('a fixed μ gives the grand-canonical minimum; a warm start from it reaches the same state', () => {
    const spec = richSpec(31);
    const first = solveMeanField(spec, { supercell: 'sqrt3', mu: 0.2, starts: 8 });
    const again = solveMeanField(spec, { supercell: 'sqrt3', mu: 0.2, starts: 1, warm: first.warm });
    expect(again.result.energy).toBeCloseTo(first.result.energy, 8);
    expect((again.result.extras as { meanField: { winners: string[] } }).meanField.winners).toEqual(['warm']);
    expect(again.result.convergence.iterations).toBeLessThan(first.result.convergence.iterations);
  });

  it('reports starts at the minimum, and warns when few agree', () => {
    const { result } = solveMeanField(richSpec(41), { supercell: 'sqrt3', starts: 8 });
    expect(result.convergence.starts).toBe(8);
    expect(result.convergence.startsAtMinimum).toBeGreaterThanOrEqual(1);
    expect(result.convergence.startsAtMinimum).toBeLessThanOrEqual(8);
    const low = (result.convergence.startsAtMinimum ?? 0) < 2;
    expect(Boolean(result.warnings?.some((w) => /starts reached/.test(w)))).toBe(low);
  });

  it('takes the filling as a density: 1/2 on a 3×3 triangular cluster (4.5 particles) is fine for mean-field', () => {
    const spec: ModelSpec = { ...xxzSpec('square', [4, 4], 1), lattice: { kind: 'triangular', size: [3, 3], boundary: ['periodic', 'periodic'] } };
    const { result } = solveMeanField(spec, { supercell: 'sqrt3', starts: 4 });
    expect((result.extras as { meanField: { density: number } }).meanField.density).toBeCloseTo(0.5, 6);
  });

  it('rejects bad options and supercells with the field named', () => {
    const spec = xxzSpec('chain', [8], 1);
    expect(() => solveMeanField(spec, { starts: 0 })).toThrow(/\$\.solver\.starts/);
    expect(() => solveMeanField(spec, { supercell: [2, 2] })).toThrow(/\$\.solver\.supercell/);
    expect(() => solveMeanField(xxzSpec('square', [4, 4], 1), { supercell: 'sqrt3' })).toThrow(/hexagonal/);
    expect(() => solveMeanField(spec, { warm: { params: [1, 2, 3] } })).toThrow(/warm\.params/);
  });
});
