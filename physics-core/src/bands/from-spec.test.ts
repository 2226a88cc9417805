import { describe, expect, it } from 'vitest';
import type { ModelSpec } from '../model/types.js';
import { bandsOfSpec, blochModelFromSpec } from './from-spec.js';
import { chernNumbers } from './chern.js';
import { haldaneBlochModel } from './haldane-fixture.js';
import { highSymmetryPoints, blochHamiltonian } from './bloch.js';
import { hermitianEigen } from './hermitian-eigen.js';

/** Haldane's model (Phys. Rev. Lett. 1988) written as a model spec: the nnn hop is a conditional hop through the common neighbour, which acts fully on one particle. */
function haldaneSpec(extra: Partial<ModelSpec> = {}): ModelSpec {
  return {
    spec: 'phasewright.model/1',
    lattice: { kind: 'honeycomb', size: [3, 3], boundary: ['periodic', 'periodic'] },
    particles: { kind: 'hardcore', count: 1 },
    parameters: { t1: 1, t2: 0.1, phi: 'pi/2', M: 0, V: 2 },
    terms: [
      { kind: 'hop', neighbors: 1, amplitude: 't1' },
      { kind: 'conditional-hop', neighbors: 2, via: 'common-neighbor', when: 'empty', amplitude: 't2', phase: 'turn*phi' },
      { kind: 'onsite', amplitude: 'M*(1-2*sublattice)' },
      { kind: 'interaction', neighbors: 1, amplitude: 'V' },
    ],
    ...extra,
  };
}

describe('bands of a model spec (Haldane, Phys. Rev. Lett. 1988)', () => {
  it('Chern numbers from the spec equal those of the hand-built Bloch model, across the boundary |M| = 3√3 t2 |sin φ|', () => {
    const t2 = 0.1;
    for (const phi of [Math.PI / 2, -Math.PI / 2, 1.0]) {
      const boundary = 3 * Math.sqrt(3) * t2 * Math.abs(Math.sin(phi));
      for (const M of [0, 0.6 * boundary, 1.4 * boundary]) {
        const { model } = blochModelFromSpec(haldaneSpec(), { phi, M });
        const fromSpec = chernNumbers(model, { mesh: 15 }).groups.map((g) => g.chern);
        const hand = chernNumbers(haldaneBlochModel(1, t2, phi, M), { mesh: 15 }).groups.map((g) => g.chern);
        expect(fromSpec).toEqual(hand);
        expect(Math.abs(fromSpec[0])).toBe(M < boundary ? 1 : 0);
      }
    }
  });

  it('energies at K and K′ are −3 t2 cos φ ± |M ∓ 3√3 t2 sin φ| (Haldane 1988); interactions are dropped with a warning', () => {
    const phi = 0.8;
    const M = 0.15;
    const t2 = 0.1;
    const { model, warnings } = blochModelFromSpec(haldaneSpec(), { phi, M });
    expect(warnings.join(' ')).toMatch(/interaction/);
    expect(model.nBands).toBe(2);
    const K = highSymmetryPoints(model.translations)[1].k;
    const re = new Float64Array(4);
    const im = new Float64Array(4);
    const found: number[] = [];
    for (const k of [K, [-K[0], -K[1]]]) {
      blochHamiltonian(model, k, re, im);
      found.push(...hermitianEigen(re, im, 2).values);
    }
    const s = 3 * Math.sqrt(3) * t2 * Math.sin(phi);
    const want = [-3 * t2 * Math.cos(phi) - Math.abs(M - s), -3 * t2 * Math.cos(phi) + Math.abs(M - s), -3 * t2 * Math.cos(phi) - Math.abs(M + s), -3 * t2 * Math.cos(phi) + Math.abs(M + s)];
    expect(found.sort((a, b) => a - b)).toEqual(want.sort((a, b) => a - b).map((v) => expect.closeTo(v, 10)));
  });

  it('the chain gives ε(k) = −2J cos k on 0..π, one band, no Chern number', () => {
    const spec: ModelSpec = {
      spec: 'phasewright.model/1',
      lattice: { kind: 'chain', size: [6], boundary: ['periodic'] },
      particles: { kind: 'hardcore', filling: 0.5 },
      parameters: { J: 1 },
      terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J' }],
    };
    const r = bandsOfSpec(spec, { path: { points: 11 } });
    expect(r.chern).toBeNull();
    expect(r.path.labels.map((l) => l.label)).toEqual(['Γ', 'X']);
    r.path.k.forEach((k, i) => expect(r.path.energies[0][i]).toBeCloseTo(-2 * Math.cos(Math.hypot(k[0], k[1])), 12));
  });

  it('reports the Haldane gap 2|M − 3√3 t2 sin φ| at the topological transition side', () => {
    const r = bandsOfSpec(haldaneSpec(), { chern: { mesh: 12 } }, { phi: Math.PI / 2, M: 0.2 });
    const s = 3 * Math.sqrt(3) * 0.1;
    expect(r.gaps).toHaveLength(1);
    expect(r.gaps[0].direct).toBeCloseTo(2 * Math.abs(0.2 - s), 8);
    expect(r.chern?.total).toBe(0);
  });
});
