/**
 * The real point solver of sweeps: compiles the model with the swept parameters and solves it by
 * ED or mean-field, warm-starting along a segment.
 *
 * Sweep `solver` options — ED: the `EdOptions` of ed/solve-ed.ts (`states`, `tolerance`,
 * `maxIterations`, `windowSize`, `storage`, `memoryBudgetBytes`, `degeneracyTolerance`,
 * `observables`) plus `fidelity`: `false`, or `{ parameter?, delta? }` (@default along the first
 * swept parameter, delta 1e-3): a second solve at λ+δ gives F = |⟨ψ0(λ)|ψ0(λ+δ)⟩| and
 * χ_F = −2 ln F / (Ns δ²) in `extras.fidelity`, `extras.fidelitySusceptibility` (a forward
 * difference: its error is O(δ)). Mean-field: the `MeanFieldOptions` of meanfield/gutzwiller.ts
 * (without `warm`). The start-vector / random-start seed is the point's own seed.
 *
 * Warm state (stays inside one worker): ED keeps its solvers (operator re-weighted, not rebuilt;
 * Lanczos starts from the previous ground state); mean-field passes the previous solution.
 */
import { PhasewrightError } from '../errors.js';
import { compileModel } from '../model/compile.js';
import { EdSolver, type EdOptions } from '../ed/solve-ed.js';
import { overlapModulus } from '../observables/fidelity.js';
import { solveMeanField, type MeanFieldOptions, type MeanFieldWarmStart } from '../meanfield/gutzwiller.js';
import { hashModel } from '../maps/provenance.js';
import type { PointOutcome, PointRequest } from './segment.js';

interface EdWarm {
  kind: 'ed';
  main: EdSolver;
  shifted?: EdSolver;
}

interface MeanFieldWarm {
  kind: 'meanfield';
  solution: MeanFieldWarmStart;
}

interface FidelityOptions {
  parameter?: string;
  delta?: number;
}

function fidelityOptions(solver: Record<string, unknown>, axes: string[]): { parameter: string; delta: number } | undefined {
  const f = solver.fidelity;
  if (f === false) return undefined;
  const o = (typeof f === 'object' && f !== null ? f : {}) as FidelityOptions;
  const parameter = o.parameter ?? axes[0];
  const delta = o.delta ?? 1e-3;
  if (typeof parameter !== 'string') throw new PhasewrightError('must name a parameter', 'options', '$.solver.fidelity.parameter');
  if (!(typeof delta === 'number' && Number.isFinite(delta) && delta !== 0)) {
    throw new PhasewrightError(`must be a non-zero number (got ${JSON.stringify(delta)})`, 'options', '$.solver.fidelity.delta');
  }
  return { parameter, delta };
}

function solveEdPoint(request: PointRequest, warm: EdWarm | undefined): PointOutcome {
  const { fidelity: _f, seed: _s, startVector: _v, ...rest } = request.solver;
  const edOptions = { ...(rest as EdOptions), seed: request.seed };
  const fid = fidelityOptions(request.solver, request.axes);
  const state: EdWarm = warm ?? { kind: 'ed', main: new EdSolver(edOptions, true) };
  const compiled = compileModel(request.model, request.parameters);
  const solution = state.main.solve(compiled);
  const result = solution.result;
  result.provenance.modelHash = hashModel(compiled.spec);
  if (fid) {
    if (!(fid.parameter in compiled.parameters)) {
      throw new PhasewrightError(`"${fid.parameter}" is not a parameter of the model`, 'options', '$.solver.fidelity.parameter');
    }
    state.shifted ??= new EdSolver({ ...edOptions, observables: [] }, true);
    const lambda = compiled.parameters[fid.parameter];
    const shifted = state.shifted.solve(compileModel(request.model, { ...request.parameters, [fid.parameter]: lambda + fid.delta }));
    const f = Math.min(1, overlapModulus(solution.vectors[0], shifted.vectors[0]));
    const extras = (result.extras ??= {});
    extras.fidelity = f;
    extras.fidelitySusceptibility = (-2 * Math.log(f)) / (compiled.nSites * fid.delta * fid.delta);
    extras.fidelityParameter = fid.parameter;
    extras.fidelityDelta = fid.delta;
    if (result.degenerate || shifted.result.degenerate) {
      result.warnings = [...(result.warnings ?? []), 'degenerate ground state: the fidelity of one chosen vector is basis dependent'];
    }
    if (!shifted.result.convergence.converged) {
      result.warnings = [...(result.warnings ?? []), 'the shifted solve for the fidelity did not converge'];
    }
  }
  return { result, warm: state };
}

function solveMeanFieldPoint(request: PointRequest, warm: MeanFieldWarm | undefined): PointOutcome {
  const { warm: _w, seed: _s, ...rest } = request.solver;
  const options: MeanFieldOptions = { ...(rest as MeanFieldOptions), seed: request.seed };
  if (warm) options.warm = warm.solution;
  const solution = solveMeanField(request.model, options, request.parameters);
  solution.result.provenance.modelHash = hashModel({ ...request.model, parameters: { ...request.model.parameters, ...request.parameters } });
  return { result: solution.result, warm: { kind: 'meanfield', solution: solution.warm } satisfies MeanFieldWarm };
}

/** The point solver used by the CLI's workers and by `InProcessExecutor` in real runs. */
export function solvePoint(request: PointRequest, warm: unknown): PointOutcome {
  const w = warm as EdWarm | MeanFieldWarm | undefined;
  if (request.method === 'ed') return solveEdPoint(request, w?.kind === 'ed' ? w : undefined);
  return solveMeanFieldPoint(request, w?.kind === 'meanfield' ? w : undefined);
}
