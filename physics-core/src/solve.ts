import type { CompiledModel, ModelSpec } from './model/types.js';
import type { Method, Result } from './result.js';
import { compileModel } from './model/compile.js';
import { hashModel } from './maps/provenance.js';
import { solveEd, type EdOptions } from './ed/solve-ed.js';
import { solveMeanField, type MeanFieldOptions } from './meanfield/gutzwiller.js';

/** Options of `solve`: the method and its solver options. */
export interface SolveOptions {
  /** Solver. @default 'ed' */
  method?: Method;
  /** Parameter overrides applied when a spec (not a compiled model) is given. @default {} */
  overrides?: Record<string, number>;
  /** Options of exact diagonalization (method 'ed'). */
  ed?: EdOptions;
  /** Options of the Gutzwiller mean-field solver (method 'meanfield'). */
  meanfield?: MeanFieldOptions;
}

/**
 * Solves a model spec or an already compiled model with the chosen method and fills
 * `provenance.modelHash` with the canonical hash of the (override-applied) spec.
 */
export function solve(model: ModelSpec | CompiledModel, options: SolveOptions = {}): Result {
  if (options.method === 'meanfield' && !isCompiled(model)) {
    // Mean-field compiles its own periodic cluster and takes the filling as a density.
    const overrides = options.overrides ?? {};
    const mf = solveMeanField(model, options.meanfield, overrides).result;
    mf.provenance.modelHash = hashModel({ ...model, parameters: { ...model.parameters, ...overrides } });
    return mf;
  }
  const compiled = isCompiled(model) ? model : compileModel(model, options.overrides ?? {});
  const method = options.method ?? 'ed';
  let result: Result;
  switch (method) {
    case 'ed':
      result = solveEd(compiled, options.ed);
      break;
    case 'meanfield':
      result = solveMeanField(compiled.spec, options.meanfield).result;
      break;
    default:
      throw new RangeError(`solve: method '${String(method)}' is not available`);
  }
  result.provenance.modelHash = hashModel(compiled.spec);
  return result;
}

function isCompiled(model: ModelSpec | CompiledModel): model is CompiledModel {
  return 'terms' in model && 'lattice' in model && 'nSites' in model;
}
