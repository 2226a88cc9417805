import { describe, expect, it } from 'vitest';
import type { ModelSpec } from '../model/types.js';
import type { Result } from '../result.js';
import { solveMeanField } from '../meanfield/gutzwiller.js';
import { xxzSpec } from '../meanfield/test-helpers.js';
import { classifyPoint } from './phases.js';
import { solve } from '../solve.js';

function synthetic(over: Partial<Result>): Result {
  return {
    spec: 'phasewright.result/1', method: 'meanfield', energy: 0, energyPerSite: 0, energies: [0], gap: null, degenerate: false,
    sites: Array.from({ length: 6 }, (_, i) => ({ index: i, x: i, y: 0, density: 0.5, condensate: [0, 0] as [number, number] })),
    bonds: [], plaquettes: [], structureFactor: [], condensateFraction: 0,
    convergence: { converged: true, iterations: 1, residual: 0 }, timing: { buildMs: 0, solveMs: 0 }, provenance: { modelHash: '', version: '' },
    ...over,
  };
}

describe('classifyPoint on mean-field points', () => {
  it('J–V hardcore bosons on the square lattice: superfluid below V = 2J, density wave at (π, π) above (Matsubara & Matsuda 1956)', () => {
    const sf = classifyPoint(solveMeanField(xxzSpec('square', [4, 4], 1), { supercell: [2, 2] }).result);
    expect(sf.label.id).toBe('superfluid');
    const dw = classifyPoint(solveMeanField(xxzSpec('square', [4, 4], 3), { supercell: [2, 2] }).result);
    expect(dw.label.id).toBe('density-wave');
    const q = dw.label.evidence.orderingVector as number[];
    expect(Math.abs(Math.cos(q[0]))).toBeCloseTo(1, 9);
    expect(Math.abs(Math.cos(q[1]))).toBeCloseTo(1, 9);
    expect(Math.cos(q[0]) * Math.cos(q[1])).toBeCloseTo(1, 9); // (π, π) up to reciprocal vectors
  });

  it('frustrated hopping (+J) on the triangular lattice orders in a 120° pattern on the √3×√3 cell (classical XY antiferromagnet, from memory: the standard three-sublattice ground state)', () => {
    const spec: ModelSpec = {
      spec: 'phasewright.model/1',
      lattice: { kind: 'triangular', size: [6, 6], boundary: ['periodic', 'periodic'] },
      particles: { kind: 'hardcore', filling: 0.5 },
      parameters: { J: 1 },
      terms: [{ kind: 'hop', neighbors: 1, amplitude: 'J' }],
    };
    const { result } = solveMeanField(spec, { supercell: 'sqrt3', starts: 8 });
    const c = classifyPoint(result);
    expect(c.label.id).toBe('phase-order-120');
    expect(c.label.evidence.meanVectorChirality as number).toBeCloseTo(1, 6);
    // classical energy per bond of the 120° state: 2J|β|² cos(120°) = −J/4 at half filling
    expect(result.energyPerSite / 3).toBeCloseTo(-0.25, 6);
  });
});

describe('classifyPoint on synthetic observables', () => {
  it('supersolid when both a condensate and a density wave are present', () => {
    const r = synthetic({ condensateFraction: 0.3, structureFactor: [{ q: [Math.PI, 0], value: 0.4 }, { q: [0, 0], value: 0 }] });
    const c = classifyPoint(r);
    expect(c.label.id).toBe('supersolid');
    expect(c.label.evidence.orderingVector).toEqual([Math.PI, 0]);
    expect(c.signals.map((s) => s.id).sort()).toEqual(['density-wave', 'superfluid']);
  });

  it('chiral superfluid for a uniform circulation, flux lattice for a staggered one', () => {
    const loops = (c: number[]) => c.map((v, i) => ({ sites: [i, i + 1, i + 2], circulation: v, flux: 0, chirality: 0 }));
    expect(classifyPoint(synthetic({ condensateFraction: 0.4, plaquettes: loops([0.1, 0.1, 0.1, 0.1]) })).label.id).toBe('chiral-superfluid');
    expect(classifyPoint(synthetic({ condensateFraction: 0.4, plaquettes: loops([0.1, -0.1, 0.1, -0.1]) })).label.id).toBe('flux-lattice');
  });

  it('ED points use larger finite-size thresholds; nothing found gives unresolved with the evidence', () => {
    const weak = synthetic({ method: 'ed', condensateFraction: 0.1, structureFactor: [{ q: [Math.PI, 0], value: 0.2 }] });
    const c = classifyPoint(weak);
    expect(c.label.id).toBe('unresolved');
    expect(c.label.evidence).toMatchObject({ condensateFraction: 0.1 });
    expect(classifyPoint({ ...weak, method: 'meanfield' }).label.id).toBe('superfluid');
  });

  it('halves confidence for unconverged points and rejects bad thresholds by name', () => {
    const good = classifyPoint(synthetic({ condensateFraction: 0.3 })).label.confidence;
    const bad = classifyPoint(synthetic({ condensateFraction: 0.3, convergence: { converged: false, iterations: 1, residual: 1 } })).label.confidence;
    expect(bad).toBeCloseTo(good / 2, 12);
    expect(() => classifyPoint(synthetic({}), { densityWave: -1 })).toThrow(/classify\.densityWave/);
  });
});

describe('classifyPoint on ED points', () => {
  // Periodic 12-site chain at half filling, H = −J Σ(b†b + h.c.) + V Σ n n: by the boson–spin
  // mapping (Matsubara & Matsuda, Prog. Theor. Phys. 1956) the XXZ chain with Δ = V/2J, a
  // critical (quasi-condensed) liquid for Δ ≤ 1 and a gapped Néel (density wave at q = π) for
  // Δ > 1 (Yang & Yang, Phys. Rev. 1966). Both signals are finite on 12 sites at moderate V.
  const chain = (V: number) => solve(xxzSpec('chain', [12], V), { method: 'ed' });

  it('free bosons are superfluid; strong repulsion gives a density wave at q = π, not a supersolid', () => {
    expect(chain(0).label?.id).toBe('superfluid');
    const dw = chain(8).label!;
    expect(dw.id).toBe('density-wave');
    expect((dw.evidence.orderingVector as number[])[0]).toBeCloseTo(Math.PI, 9);
  });

  it('a state without phase coherence is not superfluid, however small the cluster: the full lattice (one state) and a frozen crystal', () => {
    // Every site occupied: ρ = 1, so f = 1/N = 1/6 — above the 0.15 threshold, yet nothing can move.
    const full = solve({ ...xxzSpec('chain', [6], 1), particles: { kind: 'hardcore', filling: 1 } }, { method: 'ed' });
    expect(full.condensateFraction).toBeCloseTo(1 / 6, 12);
    expect(full.label?.id).toBe('unresolved');
    expect(full.label?.evidence).toMatchObject({ incoherentFraction: 1 / 6, coherentFraction: 0 });
    // No hopping at all (J = 0): the two crystal patterns, averaged; f = max n / N, no coherent excess.
    const frozen = solve({ ...xxzSpec('chain', [6], 1), parameters: { J: 0, V: 1 } }, { method: 'ed', ed: { states: 2 } });
    expect(frozen.label?.id).toBe('density-wave');
    expect(frozen.label?.evidence.secondary).toBeUndefined();
  });

  it('the label changes from superfluid to density wave between V = 2J and 4J on 8 and 12 sites, nearer 2J on the larger ring', () => {
    // The thermodynamic transition is at Δ = V/2J = 1 (Yang & Yang, Phys. Rev. 1966); it is of
    // Kosterlitz–Thouless type, so a small ring puts the change of label above it, closing in slowly.
    const crossing = (L: number) => {
      const Vs = [2, 2.5, 3, 3.5, 4];
      const ids = Vs.map((V) => solve(xxzSpec('chain', [L], V), { method: 'ed' }).label!.id);
      expect(ids[0]).toBe('superfluid');
      expect(ids.at(-1)).toBe('density-wave');
      return Vs[ids.indexOf('density-wave')];
    };
    expect(crossing(12)).toBeLessThanOrEqual(crossing(8));
  });

  it('never calls one cluster a supersolid: with both signals it names the stronger and keeps the other', () => {
    for (const V of [1, 2, 3, 4]) {
      const label = chain(V).label!;
      expect(label.id).not.toBe('supersolid');
      if (label.evidence.secondary !== undefined) expect(['superfluid', 'density-wave']).toContain(label.id);
    }
  });
});
