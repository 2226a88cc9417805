import type { CompiledModel } from '../model/types.js';
import { EdSolver, type EdOptions } from '../ed/solve-ed.js';
import { dotc } from '../eigen/complex-vector.js';

/** |⟨a|b⟩| of two normalized interleaved complex vectors. */
export function overlapModulus(a: Float64Array, b: Float64Array): number {
  const h = new Float64Array(2);
  dotc(a, b, h);
  return Math.hypot(h[0], h[1]);
}

export interface FidelityResult {
  /** |⟨ψ_0(λ)|ψ_0(λ+δ)⟩| */
  fidelity: number;
  /** χ_F per site = −2 ln F / (Ns δ²). */
  susceptibility: number;
  energies: [number, number];
  converged: boolean;
  /** Set when either ground state is degenerate: the overlap of one chosen vector is then basis dependent. */
  warning?: string;
}

/**
 * Ground-state fidelity F = |⟨ψ_0(λ)|ψ_0(λ+δ)⟩| and fidelity susceptibility per site
 * χ_F = −2 ln F / (Ns δ²) (Zanardi & Paunković, Phys. Rev. E 2006; You, Li & Gu, Phys. Rev. E 2007),
 * along any parameter: pass the compiled models at λ and λ+δ. The second solve reuses the
 * operator (re-weighting) and starts from the first ground state. A peak of χ_F indicates, but
 * does not prove, a transition on a finite cluster.
 */
export function fidelity(
  atLambda: CompiledModel,
  atLambdaPlusDelta: CompiledModel,
  delta: number,
  options: EdOptions = {},
): FidelityResult {
  if (!(delta !== 0 && Number.isFinite(delta))) throw new RangeError(`fidelity: delta must be a non-zero number, got ${delta}`);
  const solver = new EdSolver({ ...options, observables: [] }, true);
  const a = solver.solve(atLambda);
  const b = solver.solve(atLambdaPlusDelta);
  const f = Math.min(1, overlapModulus(a.vectors[0], b.vectors[0]));
  const degenerate = a.result.degenerate || b.result.degenerate;
  return {
    fidelity: f,
    susceptibility: (-2 * Math.log(f)) / (atLambda.nSites * delta * delta),
    energies: [a.result.energy, b.result.energy],
    converged: a.result.convergence.converged && b.result.convergence.converged,
    ...(degenerate ? { warning: 'degenerate ground state: the fidelity of one chosen vector is basis dependent' } : {}),
  };
}

/** Same as `fidelity` with a closure giving the compiled model at each λ. */
export function fidelityAlong(
  modelAt: (lambda: number) => CompiledModel,
  lambda: number,
  delta: number,
  options: EdOptions = {},
): FidelityResult {
  return fidelity(modelAt(lambda), modelAt(lambda + delta), delta, options);
}
