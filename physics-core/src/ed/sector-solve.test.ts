import { describe, expect, it } from 'vitest';
import { EdSolver } from './solve-ed.js';
import { compileModel } from '../model/compile.js';
import type { ModelSpec, CompiledModel } from '../model/types.js';

/**
 * The momentum-sector path of EdSolver against the full fixed-number basis on the same models
 * (an invariant: the block decomposition changes no physical number), and against a closed form:
 * one particle on a ring of L sites with a Peierls phase φ per bond has E(k) = −2J cos(k + φ),
 * k = 2πm/L (Bloch's theorem; e.g. Ashcroft & Mermin, Solid State Physics, 1976, ch. 8).
 */
const zigzag: ModelSpec = {
  spec: 'phasewright.model/1',
  name: 'zigzag',
  lattice: { kind: 'zigzag', size: [6], boundary: ['periodic'] },
  particles: { kind: 'hardcore', filling: 0.5 },
  parameters: { J: 1, g: 0.6, theta: 'pi/2', V: 0.8 },
  terms: [
    { kind: 'hop', class: 'zig', amplitude: '-J' },
    { kind: 'conditional-hop', class: 'leg', legs: 'zig', via: 'common-neighbor', when: 'empty', amplitude: '-g', phase: 'turn*theta' },
    { kind: 'interaction', neighbors: 1, amplitude: 'V' },
  ],
};

const honeycomb: ModelSpec = {
  spec: 'phasewright.model/1',
  name: 'honeycomb',
  lattice: { kind: 'honeycomb', size: [3, 3], boundary: ['periodic', 'periodic'] },
  particles: { kind: 'hardcore', count: 4 },
  parameters: { t1: 1, t2: 0.4, theta: 'pi/3', V: 1.2 },
  terms: [
    { kind: 'hop', neighbors: 1, amplitude: '-t1' },
    { kind: 'conditional-hop', neighbors: 2, legs: 'nn', via: 'common-neighbor', when: 'empty', amplitude: '-t2', phase: 'turn*theta' },
    { kind: 'interaction', neighbors: 1, amplitude: 'V' },
  ],
};

function both(model: CompiledModel, states = 2) {
  const sectors = new EdSolver({ states }).solve(model).result;
  const full = new EdSolver({ states, symmetry: 'none' }).solve(model).result;
  return { sectors, full };
}

describe('exact diagonalization in momentum sectors', () => {
  for (const [name, spec] of [
    ['zigzag strip of 12 sites with conditional hops of phase turn·θ', zigzag],
    ['honeycomb 3×3 cells (18 sites), 4 particles, conditional second-neighbour hops', honeycomb],
  ] as const) {
    it(`${name}: same energies, gap and observables as the full basis`, () => {
      const { sectors, full } = both(compileModel(spec));
      expect((sectors.extras?.symmetry as { kind: string }).kind).toBe('translations');
      expect(sectors.extras?.storage).toBe('momentum-sectors');
      expect((full.extras?.symmetry as { kind: string }).kind).toBe('none');
      expect(sectors.convergence.converged).toBe(true);
      expect(sectors.energies.length).toBe(2);
      for (let i = 0; i < 2; i++) expect(sectors.energies[i]).toBeCloseTo(full.energies[i], 9);
      expect(sectors.degenerate).toBe(full.degenerate);
      if (!full.degenerate) {
        // A non-degenerate ground state is unique up to a phase: every observable agrees.
        sectors.sites.forEach((s, i) => expect(s.density).toBeCloseTo(full.sites[i].density, 8));
        sectors.bonds.forEach((b, i) => expect(b.current).toBeCloseTo(full.bonds[i].current, 8));
        sectors.structureFactor.forEach((q, i) => expect(q.value).toBeCloseTo(full.structureFactor[i].value, 8));
        expect(sectors.condensateFraction).toBeCloseTo(full.condensateFraction, 8);
      }
    });
  }

  it('one particle on a 6-ring with flux π (phase π/6 per bond): E = −2J cos(π/6) twice, at two momenta, averaged like the full basis', () => {
    const ring: ModelSpec = {
      spec: 'phasewright.model/1',
      lattice: { kind: 'chain', size: [6], boundary: ['periodic'] },
      particles: { kind: 'hardcore', count: 1 },
      parameters: { J: 1 },
      terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J', phase: 'pi/6*dx' }],
    };
    const { sectors, full } = both(compileModel(ring), 3);
    const e = -2 * Math.cos(Math.PI / 6);
    expect(sectors.energies[0]).toBeCloseTo(e, 10);
    expect(sectors.energies[1]).toBeCloseTo(e, 10);
    expect(sectors.degenerate).toBe(true);
    const symmetry = sectors.extras?.symmetry as { momenta: number[][] };
    expect(symmetry.momenta[0][0]).not.toBe(symmetry.momenta[1][0]);
    // Averages over the degenerate pair do not depend on the basis chosen within it.
    sectors.bonds.forEach((b, i) => expect(b.current).toBeCloseTo(full.bonds[i].current, 9));
    sectors.sites.forEach((s) => expect(s.density).toBeCloseTo(1 / 6, 10));
    expect(sectors.energies[2]).toBeCloseTo(full.energies[2], 10);
  });

  it('falls back to the full basis when a twist breaks translation invariance, and says why', () => {
    const twisted = compileModel({ ...zigzag, lattice: { kind: 'zigzag', size: [6], boundary: ['periodic'], twist: [0.4] } });
    const r = new EdSolver({ states: 2 }).solve(twisted).result;
    const symmetry = r.extras?.symmetry as { kind: string; reason: string };
    expect(symmetry.kind).toBe('none');
    expect(symmetry.reason).toMatch(/translation/);
    expect(r.extras?.storage).not.toBe('momentum-sectors');
  });

  it('a sweep-style solver re-weights the sector structure when only amplitudes change', () => {
    const solver = new EdSolver({ states: 2 });
    const a = solver.solve(compileModel(zigzag)).result;
    const b = solver.solve(compileModel({ ...zigzag, parameters: { ...zigzag.parameters, g: 0.9 } })).result;
    expect(a.extras?.operatorRebuilt).toBe(true);
    expect(b.extras?.operatorRebuilt).toBe(false);
    const fresh = new EdSolver({ states: 2, symmetry: 'none' }).solve(compileModel({ ...zigzag, parameters: { ...zigzag.parameters, g: 0.9 } })).result;
    expect(b.energy).toBeCloseTo(fresh.energy, 9);
  });

  it('along a sweep, a warm-starting solver starts each solved sector from its previous ground state: same levels, fewer products', () => {
    const at = (g: number) => compileModel({ ...zigzag, parameters: { ...zigzag.parameters, g } });
    const warm = new EdSolver({ states: 2 }, true);
    warm.solve(at(0.6));
    const second = warm.solve(at(0.62)).result;
    const cold = new EdSolver({ states: 2 }).solve(at(0.62)).result;
    expect((second.extras?.symmetry as { warmStartedSectors: number }).warmStartedSectors).toBeGreaterThan(0);
    expect((second.provenance.solver as { warmStart: boolean }).warmStart).toBe(true);
    expect(second.energies[0]).toBeCloseTo(cold.energies[0], 9);
    expect(second.energies[1]).toBeCloseTo(cold.energies[1], 9);
    expect(second.convergence.iterations).toBeLessThan(cold.convergence.iterations);
  });

  it('the reorthogonalized solver (thick restart, full reorthogonalization) agrees with the default recurrence, in sectors and on the full basis', () => {
    const model = compileModel(zigzag);
    const plain = new EdSolver({ states: 3 }).solve(model).result;
    for (const symmetry of ['auto', 'none'] as const) {
      const r = new EdSolver({ states: 3, symmetry, reorthogonalize: true }).solve(model).result;
      expect(r.convergence.converged).toBe(true);
      expect((r.provenance.solver as { reorthogonalize: boolean }).reorthogonalize).toBe(true);
      for (let i = 0; i < 3; i++) expect(r.energies[i]).toBeCloseTo(plain.energies[i], 9);
    }
  });

  it('graphene (one particle on a 3×3 honeycomb torus): the 2-state sectors at K, where H_k = 0, are solved too; E0 = −3t at Γ (Wallace, Phys. Rev. 1947)', () => {
    const graphene: ModelSpec = {
      spec: 'phasewright.model/1',
      lattice: { kind: 'honeycomb', size: [3, 3], boundary: ['periodic', 'periodic'] },
      particles: { kind: 'hardcore', count: 1 },
      parameters: { t: 1 },
      terms: [{ kind: 'hop', neighbors: 1, amplitude: '-t' }],
    };
    const { sectors, full } = both(compileModel(graphene));
    expect(sectors.convergence.converged).toBe(true);
    expect(sectors.energies[0]).toBeCloseTo(-3, 12);
    for (let i = 0; i < 2; i++) expect(sectors.energies[i]).toBeCloseTo(full.energies[i], 10);
  });
});
