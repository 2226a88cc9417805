import { describe, expect, it } from 'vitest';
import { Matrix, solve as solveLinear } from 'ml-matrix';
import { solveEd, EdSolver } from './solve-ed.js';
import { solve } from '../solve.js';
import { compileModel } from '../model/compile.js';
import type { CompiledModel, ModelSpec } from '../model/types.js';
import { EdOperator } from '../operators/ed-operator.js';
import { chainModel, denseFromMatvec, denseHermitianEigen } from './test-models.js';

function chainSpec(L: number, o: { periodic: boolean; N: number; V?: number; twist?: string }): ModelSpec {
  return {
    spec: 'phasewright.model/1',
    lattice: { kind: 'chain', size: [L], boundary: [o.periodic ? 'periodic' : 'open'], twist: [o.twist ?? 0] },
    particles: { kind: 'hardcore', count: o.N },
    parameters: { J: 1, V: o.V ?? 0 },
    terms: [
      { kind: 'hop', neighbors: 1, amplitude: '-J' },
      ...(o.V ? [{ kind: 'interaction' as const, neighbors: 1, amplitude: 'V' }] : []),
    ],
  };
}

/**
 * Ground energy of H = Σ_i S_i·S_{i+1} on a periodic chain of even L from the Bethe ansatz
 * (Bethe, Z. Phys. 1931). With M = L/2 flipped spins and rapidities λ_j, magnon momenta obey
 * e^{ik} = (λ + i/2)/(λ − i/2), each magnon lowers the ferromagnetic energy L/4 by
 * 1 − cos k = 2/(1 + 4λ²), and the logarithmic Bethe equations read
 *   2L·arctan(2λ_j) = 2π I_j + Σ_{k≠j} 2·arctan(λ_j − λ_k),
 * with the ground state's I_j = −(M−1)/2, …, (M−1)/2. Solved by Newton's method (ml-matrix for the
 * linear solves). E = L/4 − Σ_j 2/(1 + 4λ_j²).
 */
function betheGroundEnergy(L: number): number {
  const M = L / 2;
  const I = Array.from({ length: M }, (_, j) => j - (M - 1) / 2);
  const lam = I.map((i) => 0.5 * Math.tan((Math.PI * i) / L));
  for (let iter = 0; iter < 100; iter++) {
    const F = new Matrix(M, 1);
    const Jac = Matrix.zeros(M, M);
    for (let j = 0; j < M; j++) {
      let f = 2 * L * Math.atan(2 * lam[j]) - 2 * Math.PI * I[j];
      let diag = (4 * L) / (1 + 4 * lam[j] ** 2);
      for (let k = 0; k < M; k++) {
        if (k === j) continue;
        const d = lam[j] - lam[k];
        f -= 2 * Math.atan(d);
        diag -= 2 / (1 + d * d);
        Jac.set(j, k, 2 / (1 + d * d));
      }
      Jac.set(j, j, diag);
      F.set(j, 0, f);
    }
    const step = solveLinear(Jac, F);
    let size = 0;
    for (let j = 0; j < M; j++) {
      lam[j] -= step.get(j, 0);
      size = Math.max(size, Math.abs(step.get(j, 0)));
    }
    if (size < 1e-14) break;
  }
  return L / 4 - lam.reduce((s, x) => s + 2 / (1 + 4 * x * x), 0);
}

describe('exact diagonalization against exact results', () => {
  it('open chain, N free hardcore bosons = free fermions: E0 = −2J Σ_{n=1..N} cos(nπ/(L+1)) (Jordan–Wigner; Lieb, Schultz & Mattis, Ann. Phys. 1961)', () => {
    const L = 12;
    for (const N of [1, 3, 6, 8]) {
      const r = solveEd(compileModel(chainSpec(L, { periodic: false, N })), { observables: [] });
      let exact = 0;
      for (let n = 1; n <= N; n++) exact -= 2 * Math.cos((n * Math.PI) / (L + 1));
      expect(r.convergence.converged).toBe(true);
      expect(r.energy).toBeCloseTo(exact, 10);
    }
  });

  it('Bethe-ansatz helper reproduces L = 4 → −2 and L = 6 → −2.8028 (from memory) and approaches Hulthén 1/4 − ln 2 per site (Hulthén 1938)', () => {
    expect(betheGroundEnergy(4)).toBeCloseTo(-2, 12);
    expect(betheGroundEnergy(6)).toBeCloseTo(-2.8028, 4);
    const hulthen = 0.25 - Math.LN2;
    let previous = Infinity;
    for (const L of [16, 32, 64, 128, 256]) {
      const gap = Math.abs(betheGroundEnergy(L) / L - hulthen);
      expect(gap).toBeLessThan(previous);
      previous = gap;
    }
    // leading finite-size correction π²/(12L²) (conformal field theory, common knowledge; checked loosely)
    expect(previous).toBeLessThan(2 * (Math.PI ** 2 / 12) / 256 ** 2);
  });

  it('periodic chain at V = 2J, half filling = isotropic Heisenberg ring: E_boson = 2J(E_Heis + L/4) (Matsubara & Matsuda, Prog. Theor. Phys. 1956; Bethe, Z. Phys. 1931)', () => {
    // Mapping (derived in the ED docs): b† = S⁺, n = S^z + ½ gives
    //   −J(b†_i b_j + h.c.) = −2J(S^x S^x + S^y S^y),  V n_i n_j = V S^z S^z + (V/2)(S^z_i + S^z_j) + V/4;
    // Σ S^z = 0 at half filling and the sublattice rotation of an even ring flips the xy part:
    //   H = 2J Σ (S^xS^x + S^yS^y) + V Σ S^zS^z + V L/4  →  at V = 2J:  2J (Σ S·S + L/4).
    for (const L of [4, 6, 8, 10, 12, 14, 16]) {
      const r = solveEd(compileModel(chainSpec(L, { periodic: true, N: L / 2, V: 2 })), { observables: [] });
      expect(r.convergence.converged).toBe(true);
      expect(r.energy).toBeCloseTo(2 * (betheGroundEnergy(L) + L / 4), 9);
    }
  });

  it('one flux quantum (twist 2π) through a ring returns the same spectrum; twist π changes it', () => {
    const levels = (twist: string): number[] => {
      const op = new EdOperator(compileModel(chainSpec(6, { periodic: true, N: 3, V: 0.7, twist })));
      const { re, im } = denseFromMatvec((x, y) => op.matvec(x, y), op.dimension);
      return denseHermitianEigen(re, im, op.dimension).values;
    };
    const a = levels('0');
    const b = levels('2*pi');
    const c = levels('pi');
    for (let i = 0; i < a.length; i++) expect(b[i]).toBeCloseTo(a[i], 11);
    expect(Math.abs(c[0] - a[0])).toBeGreaterThan(1e-3);
  });

  it('reports a degenerate ground manifold and averages over it (free 4-ring, 1 particle, twist π: E = −√2 twice)', () => {
    const r = solveEd(chainModel({ L: 4, N: 1, periodic: true, twist: Math.PI }), { states: 3 });
    expect(r.energies[0]).toBeCloseTo(-Math.SQRT2, 12);
    expect(r.energies[1]).toBeCloseTo(-Math.SQRT2, 12);
    expect(r.degenerate).toBe(true);
    expect(r.gap).toBeCloseTo(0, 12);
    expect(r.warnings?.some((w) => w.includes('degenerate'))).toBe(true);
    for (const s of r.sites) expect(s.density).toBeCloseTo(0.25, 12);
  });

  it('sum rules: Σ_q n(q) = N and Σ_q S(q) = Σ_i (⟨n_i⟩ − ⟨n_i⟩²) on a periodic chain; condensate fraction 1 for one particle', () => {
    const model = compileModel(chainSpec(10, { periodic: true, N: 4, V: 1.3 }));
    const r = solveEd(model);
    const nq = r.extras?.momentumDistribution as { value: number }[];
    expect(nq.reduce((s, x) => s + x.value, 0)).toBeCloseTo(4, 10);
    const sq = r.structureFactor.reduce((s, x) => s + x.value, 0);
    const local = r.sites.reduce((s, x) => s + x.density - x.density ** 2, 0);
    expect(sq).toBeCloseTo(local, 10);
    expect(r.condensateFraction).toBeGreaterThan(1 / 4);
    expect(r.condensateFraction).toBeLessThanOrEqual(1);
    const one = solveEd(compileModel(chainSpec(7, { periodic: false, N: 1 })));
    expect(one.condensateFraction).toBeCloseTo(1, 10);
  });

  it('an empty or full lattice (dimension 1) gives its single state without error', () => {
    const r = solveEd(chainModel({ L: 5, N: 5, V: 0.5, periodic: true }));
    expect(r.energies).toHaveLength(1);
    expect(r.energy).toBeCloseTo(2.5, 12);
    expect(r.gap).toBeNull();
  });

  it('dispatcher fills the model hash; EdSolver re-weights its operator along a sweep', () => {
    const spec = chainSpec(8, { periodic: true, N: 4, V: 1 });
    const r = solve(spec, { overrides: { V: 0.5 } });
    expect(r.provenance.modelHash).toMatch(/^[0-9a-f]{64}$/);
    expect(r.provenance.version).toBeTruthy();
    const solver = new EdSolver({ observables: [] }, true);
    const first = solver.solve(compileModel(spec, { V: 0.5 }));
    const second = solver.solve(compileModel(spec, { V: 0.6 }));
    expect(first.result.extras?.operatorRebuilt).toBe(true);
    expect(second.result.extras?.operatorRebuilt).toBe(false);
    const fresh = solveEd(compileModel(spec, { V: 0.6 }), { observables: [] });
    expect(second.result.energy).toBeCloseTo(fresh.energy, 10);
  });
});

export type { CompiledModel };
