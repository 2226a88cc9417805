import { describe, expect, it } from 'vitest';
import { fidelityAlong } from './fidelity.js';
import { EdOperator } from '../operators/ed-operator.js';
import { denseFromMatvec, denseHermitianEigen, handModel, randomModel } from '../ed/test-models.js';
import type { CompiledModel } from '../model/types.js';

describe('fidelity susceptibility', () => {
  it('finite differences equal the perturbative sum Σ_n |⟨n|∂λH|0⟩|²/(E_n − E_0)² / Ns from a dense diagonalization (You, Li & Gu, Phys. Rev. E 2007; Zanardi & Paunković, Phys. Rev. E 2006)', () => {
    // H(λ) = H_a + λ·H_b with H_a a random complex model with conditional hops and H_b = Σ n_i n_{i+1} on a ring.
    const base = randomModel(31, 8, 3);
    const L = 8;
    const perturbation = handModel({
      nSites: L,
      nParticles: 3,
      interactions: Array.from({ length: L }, (_, i) => [i, (i + 1) % L, 1] as [number, number, number]),
    });
    const at = (lambda: number): CompiledModel => ({
      ...base,
      terms: [
        ...base.terms,
        { termIndex: 99, kind: 'interaction', entries: perturbation.terms[0].kind === 'interaction' ? perturbation.terms[0].entries.map((e) => ({ ...e, value: lambda * e.value })) : [] },
      ],
    });
    const lambda = 0.8;
    const delta = 1e-3;
    const fd = fidelityAlong(at, lambda, delta, { tolerance: 1e-12 });
    expect(fd.converged).toBe(true);

    const opA = new EdOperator(at(lambda));
    const n = opA.dimension;
    const { re, im } = denseFromMatvec((x, y) => opA.matvec(x, y), n);
    const { values, vectors } = denseHermitianEigen(re, im, n);
    const opB = new EdOperator(perturbation);
    const psi0 = vectors[0];
    const dpsi = new Float64Array(2 * n);
    opB.matvec(psi0, dpsi);
    let chi = 0;
    for (let k = 1; k < n; k++) {
      let mr = 0;
      let mi = 0;
      const v = vectors[k];
      for (let r = 0; r < n; r++) {
        mr += v[2 * r] * dpsi[2 * r] + v[2 * r + 1] * dpsi[2 * r + 1];
        mi += v[2 * r] * dpsi[2 * r + 1] - v[2 * r + 1] * dpsi[2 * r];
      }
      chi += (mr * mr + mi * mi) / (values[k] - values[0]) ** 2;
    }
    chi /= L;
    expect(chi).toBeGreaterThan(1e-3);
    expect(Math.abs(fd.susceptibility - chi) / chi).toBeLessThan(1e-2);
  });

  it('is 1 and χ_F = 0 when only an overall constant changes (ground state unchanged)', () => {
    const at = (mu: number): CompiledModel =>
      handModel({
        nSites: 6,
        nParticles: 3,
        hops: [[0, 1, -1, 0], [1, 2, -1, 0], [2, 3, -1, 0], [3, 4, -1, 0], [4, 5, -1, 0], [5, 0, -1, 0.2]],
        onsite: Array.from({ length: 6 }, (_, i) => [i, mu] as [number, number]),
      });
    const r = fidelityAlong(at, 0.1, 0.01);
    expect(r.fidelity).toBeCloseTo(1, 10);
    expect(Math.abs(r.susceptibility)).toBeLessThan(1e-5);
  });
});
