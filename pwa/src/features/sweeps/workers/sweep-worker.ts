/**
 * A sweep web worker (module worker): runs path segments with physics-core's point solver and
 * streams every point back through a Comlink callback as soon as it is done. Warm starts (ED
 * solvers with their operator, mean-field solutions) stay inside this worker along a segment.
 * `solveDetail` re-solves one point with the full result (sites, bonds, plaquettes) for the
 * point-detail view; the ED ground state comes back as a transferred buffer.
 */
import { expose, transfer } from 'comlink';
import { EdSolver, compileModel, estimateHilbertDimension, hashModel, runSegment, solvePoint, type PointEvent, type PointRequest, type Result, type SegmentJob } from '@phasewright/physics-core';

export interface DetailAnswer {
  result: Result;
  /** ED: the ground state, interleaved complex (re, im) over the fixed-number basis. */
  groundState?: Float64Array;
}

export const sweepWorkerApi = {
  async runSegment(job: SegmentJob, onEvent: (event: PointEvent) => void): Promise<void> {
    await runSegment(job, solvePoint, onEvent);
  },

  /**
   * One point with every observable kept. With `startVector` (a ground state of the same cluster
   * and filling, e.g. of the point opened before), ED's Lanczos starts from it.
   */
  solveDetail(request: PointRequest, startVector?: Float64Array): DetailAnswer {
    if (request.method === 'ed') {
      const { fidelity: _f, seed: _s, startVector: _v, ...rest } = request.solver;
      const compiled = compileModel(request.model, request.parameters);
      const usable = startVector && startVector.length === 2 * estimateHilbertDimension(compiled.nSites, compiled.nParticles) ? startVector : undefined;
      const solution = new EdSolver({ ...rest, seed: request.seed, ...(usable ? { startVector: usable } : {}) }).solve(compiled);
      solution.result.provenance.modelHash = hashModel(compiled.spec);
      const groundState = solution.vectors[0];
      return transfer({ result: solution.result, groundState }, [groundState.buffer as ArrayBuffer]);
    }
    return { result: solvePoint(request, undefined).result };
  },
};

export type SweepWorkerApi = typeof sweepWorkerApi;

expose(sweepWorkerApi);
