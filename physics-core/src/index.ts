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
export { type PlanOptions } from './sweep/plan.js';
export { keyAtCoords, type PointLookup, type RefinablePoint } from './sweep/refine.js';
export * from './maps/map-format.js';
export { estimateOperator, type OperatorEstimate } from './operators/ed-operator.js';
export { estimateLanczosBytes } from './eigen/lanczos.js';
export { canonicalJson, canonicalNumber, CanonicalJsonError } from './maps/canonical-json.js';
export { sha256Hex, mapIdentityDocument } from './maps/provenance.js';
export { mergeMaps, mergePoints, normaliseMap, edEnergiesAgree, MergeError, type MergeOptions } from './maps/merge.js';
export { compareMaps, type MapComparison, type PointComparison, type ObservableSummary } from './maps/compare.js';
export { chunkPlan, parseChunk, segmentPath, snakeCoords, type ChunkSpec } from './sweep/plan.js';
export { EdOperator, DEFAULT_MEMORY_BUDGET_BYTES, type EdOperatorOptions, type OperatorStorage } from './operators/ed-operator.js';
export { buildFixedNumberBasis, rankState, binomial, type FixedNumberBasis } from './hilbert/fixed-number-basis.js';
export { lanczos, type LanczosOptions, type LanczosResult } from './eigen/lanczos.js';
export { lowestEigenpairs, type LowestEigenpairsOptions, type LowestEigenpairsResult } from './eigen/lowest-eigenpairs.js';
export { tridiagonalQl } from './eigen/tridiagonal-ql.js';
export { denseSymmetricEigen } from './eigen/dense-symmetric.js';
export { mulberry32, gaussian } from './util/random.js';
export { densityCorrelations } from './observables/densities.js';
export { structureFactor } from './observables/structure-factor.js';
export { oneBodyDensityMatrix, momentumDistribution, condensateFraction, obdmEigenvalues } from './observables/one-body.js';
export { bondCurrents, type PairCurrent } from './observables/currents.js';
export { plaquetteObservables, triangleChirality } from './observables/plaquettes.js';
export { fidelity, fidelityAlong, overlapModulus, type FidelityResult } from './observables/fidelity.js';
export { type StateManifold } from './observables/manifold.js';
export { checkEdOptions, type ResolvedEdOptions } from './ed/solve-ed.js';
export { planSweep, pointKey, axisValue, type Plan, type WorkItem } from './sweep/plan.js';
export { runSegment, pointFromResult, type Executor, type PointEvent, type PointOutcome, type PointRequest, type PointSolver, type SegmentJob, type SweepContext } from './sweep/segment.js';
export { runSweep, createMap, InProcessExecutor, type Progress, type RunOptions, type RunOutcome } from './sweep/run.js';
export { refineItems, traceBoundaries, type Boundary, type BoundaryVertex } from './sweep/refine.js';
export { extractObservables, allObservables, structureFactorAt } from './sweep/observables.js';
export { solvePoint } from './sweep/solve-point.js';
export { hashModel, canonicalHash, mapIdentity, pointSeed } from './maps/provenance.js';
export { prepareMeanField, minimiseMeanField, checkMeanFieldOptions, type MeanFieldProblem } from './meanfield/gutzwiller.js';
export { lbfgs, checkLbfgsOptions, type LbfgsOptions, type LbfgsResult } from './meanfield/lbfgs.js';
export { resolveSupercell, supercellMomenta, type Supercell, type SupercellSpec } from './meanfield/supercell.js';
export { hardcoreSiteSpace, type SiteSpace } from './meanfield/site-space.js';
export type { LinkObservable, FluxSummary } from './meanfield/observables.js';
export { bandsOfSpec, blochModelFromSpec, type BandsOptions, type BandsReport } from './bands/from-spec.js';
export { bandPath, blochHamiltonian, highSymmetryPoints, type BlochModel, type BlochHop, type BandPath } from './bands/bloch.js';
export { chernNumbers, type ChernOptions, type ChernResult, type BandGroup } from './bands/chern.js';
export { hermitianEigen } from './bands/hermitian-eigen.js';
export { classifyPoint, checkClassifyOptions, type ClassifyOptions, type Classification, type PhaseId } from './classify/phases.js';
export { pointsCsv, csvField, exportFileStem, type PointsCsvOptions } from './maps/points-csv.js';
export { compareSpotCheck, samplePointKeys, SPOT_CHECK_TOLERANCE, spotCheckJobs } from './maps/spot-check.js';
export type { SpotCheckComparison, SpotCheckOutcome, SpotCheckPointResult } from './maps/spot-check.js';
