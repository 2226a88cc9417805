/** Public entry of physics-core: named exports only. */
export * from './model/types.js';
export * from './result.js';
export * from './errors.js';
export const CORE_VERSION = '0.1.0';
export * from './model/validate.js';
export * from './model/compile.js';
export * from './model/describe.js';
export * from './model/expressions.js';
export {
  LATTICE_KINDS,
  buildLattice,
  clusterMomenta,
  latticeClasses,
  latticeDimension,
  shellDistancesOf,
  type BuildLatticeOptions,
} from './lattice/lattices.js';
export { solve, type SolveOptions } from './solve.js';
export { solveEd, EdSolver, ED_OBSERVABLES, type EdOptions, type EdObservable, type EdSolution } from './ed/solve-ed.js';
export { solveMeanField, type MeanFieldOptions, type MeanFieldWarmStart, type MeanFieldSolution } from './meanfield/gutzwiller.js';
export * from './sweep/spec.js';
export { planSweep, pointKey, axisValue, type Plan, type WorkItem, type PlanOptions } from './sweep/plan.js';
export { runSweep, createMap, runSegment, pointFromResult, InProcessExecutor, type Executor, type PointEvent, type PointOutcome, type PointRequest, type PointSolver, type SegmentJob, type SweepContext, type Progress, type RunOptions, type RunOutcome } from './sweep/run.js';
export { traceBoundaries, refineItems, keyAtCoords, type Boundary, type BoundaryVertex, type PointLookup, type RefinablePoint } from './sweep/refine.js';
export { allObservables, extractObservables, structureFactorAt } from './sweep/observables.js';
export * from './maps/map-format.js';
export { mapIdentity, hashModel, canonicalHash, pointSeed } from './maps/provenance.js';
export { solvePoint } from './sweep/solve-point.js';
