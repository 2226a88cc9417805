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
