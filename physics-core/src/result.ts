/** Result v1: what `solve` returns; the PWA, the server and maps use the same shape. */

export const RESULT_SPEC_ID = 'phasewright.result/1';

export type Method = 'ed' | 'meanfield';

export interface SiteResult {
  index: number;
  x: number;
  y: number;
  density: number;
  /** ⟨b_i⟩ as [re, im]; zero in ED at fixed particle number. */
  condensate: [number, number];
}

export interface BondResult {
  from: number;
  to: number;
  class: string;
  /** Expectation of −∂H/∂A for a phase e^{iA} on every hop moving a particle from → to. */
  current: number;
}

export interface PlaquetteResult {
  sites: number[];
  /** Sum of the bond currents around the loop, counter-clockwise. */
  circulation: number;
  /** Flux of the effective Peierls phases around the loop, in radians, wrapped to (−π, π]. */
  flux: number;
  /** Scalar chirality (triangles), see the observables docs. */
  chirality: number;
}

export interface PhaseLabel {
  id: string;
  confidence: number;
  evidence: Record<string, unknown>;
}

export interface Convergence {
  converged: boolean;
  iterations: number;
  residual: number;
  /** Mean-field: how many starts reached the lowest minimum, of how many. */
  startsAtMinimum?: number;
  starts?: number;
}

export interface Provenance {
  modelHash: string;
  version: string;
  [key: string]: unknown;
}

export interface Result {
  spec: typeof RESULT_SPEC_ID;
  method: Method;
  energy: number;
  energyPerSite: number;
  energies: number[];
  gap: number | null;
  degenerate: boolean;
  sites: SiteResult[];
  bonds: BondResult[];
  plaquettes: PlaquetteResult[];
  structureFactor: { q: [number, number]; value: number }[];
  condensateFraction: number;
  label?: PhaseLabel;
  convergence: Convergence;
  timing: { buildMs: number; solveMs: number };
  provenance: Provenance;
  /** Solver-specific extras (e.g. mean-field effective fluxes, momentum distribution). */
  extras?: Record<string, unknown>;
  warnings?: string[];
}
