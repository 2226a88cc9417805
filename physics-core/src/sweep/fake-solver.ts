/**
 * A deterministic stand-in for the solvers, for tests and benchmarks of the sweep machinery
 * (planning, executors, refinement, merge, CLI). Not physics: its energies and labels are simple
 * closed-form functions of the parameters, chosen so that the expected refinement and boundaries
 * are known exactly. Also the model and sweep of the chain with nearest-neighbour repulsion that
 * tests share.
 */
import type { ModelSpec } from '../model/types.js';
import type { Result } from '../result.js';
import { RESULT_SPEC_ID } from '../result.js';
import type { PointOutcome, PointRequest } from './segment.js';
import type { SweepSpec } from './spec.js';

/** Hardcore bosons on a periodic chain of L sites at half filling: −J hops and V n_i n_{i+1}. */
export function chainModel(L = 8, V = 1): ModelSpec {
  return {
    spec: 'phasewright.model/1',
    name: `chain L=${L}, nearest-neighbour repulsion`,
    lattice: { kind: 'chain', size: [L], boundary: ['periodic'] },
    particles: { kind: 'hardcore', filling: 0.5 },
    parameters: { J: 1, V },
    terms: [
      { kind: 'hop', neighbors: 1, amplitude: '-J' },
      { kind: 'interaction', neighbors: 1, amplitude: 'V' },
    ],
  };
}

/** A cut in V over the chain (method `ed` unless told otherwise). */
export function chainSweep(overrides: Partial<SweepSpec> = {}): SweepSpec {
  return {
    spec: 'phasewright.sweep/1',
    name: 'chain, V cut',
    model: chainModel(),
    axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 4, points: 9 }],
    method: 'ed',
    seed: 7,
    ...overrides,
  };
}

/** The fake's phase rule: density wave above V = 2J (with J = 1 unless swept), else superfluid; with `mu` swept, a disc of "mott" (FAKE_DISC) inside the density wave. */
export function fakeLabel(p: Record<string, number>): string {
  const V = p.V ?? 1;
  const J = p.J ?? 1;
  if (p.mu !== undefined && Math.hypot(V - FAKE_DISC.V, p.mu - FAKE_DISC.mu) < FAKE_DISC.r) return 'mott';
  return V > 2 * J ? 'density-wave' : 'superfluid';
}

/** The fake's "mott" disc in the (V, mu) plane. */
export const FAKE_DISC = { V: 3.2, mu: 0, r: 1 };

/** Centre of the fake's fidelity-susceptibility peak along V. */
export const FAKE_PEAK_V = 1.7;

/** The fake point solver: closed-form Result; counts warm starts in `convergence.iterations` (10 warm, 30 cold). */
export function fakeSolve(request: PointRequest, warm: unknown): PointOutcome {
  const p = request.parameters;
  const V = p.V ?? 1;
  const mu = p.mu ?? 0;
  const L = 8;
  const energy = -2 + 0.25 * V - 0.5 * mu + 0.01 * Math.sin(3 * V + mu);
  const label = fakeLabel(p);
  const dw = label === 'density-wave' ? 1 : 0;
  const result: Result = {
    spec: RESULT_SPEC_ID,
    method: request.method,
    energy,
    energyPerSite: energy / L,
    energies: [energy, energy + 0.5],
    gap: 0.5,
    degenerate: false,
    sites: Array.from({ length: L }, (_, i) => ({ index: i, x: i, y: 0, density: 0.5 + (i % 2 ? -0.25 : 0.25) * dw, condensate: [0, 0] as [number, number] })),
    bonds: [],
    plaquettes: [],
    structureFactor: [
      { q: [0, 0], value: 0 },
      { q: [Math.PI, 0], value: 0.25 + V / 4 },
    ],
    condensateFraction: 0.5 / (1 + V),
    label: { id: label, confidence: 0.9, evidence: { rule: 'fake' } },
    convergence: { converged: true, iterations: warm === undefined ? 30 : 10, residual: 1e-12 },
    timing: { buildMs: 0, solveMs: 0 },
    provenance: { modelHash: 'fake', version: 'fake' },
    extras: { fidelitySusceptibility: 1 / ((V - FAKE_PEAK_V) ** 2 + 0.05) },
  };
  return { result, warm: { from: request.key } };
}
