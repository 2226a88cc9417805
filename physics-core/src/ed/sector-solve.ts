import { lowestEigenpairs } from '../eigen/lowest-eigenpairs.js';
import {
  buildSector,
  expandSectorVector,
  sectorMatvec,
  sectorBytes,
  sectorMomenta,
  type OrbitStructure,
  type Sector,
} from '../symmetry/translation-sectors.js';

/**
 * The lowest `states` eigenpairs of H from its momentum sectors (symmetry/translation-sectors.ts).
 *
 * Sectors are solved one after another, zero momentum first, each for its own lowest `states`
 * levels (degeneracy check included). Once `states` levels are known, a later sector's run is
 * abandoned as soon as its lowest Ritz value lies, with its error estimate, above the highest
 * level kept (plus the degeneracy tolerance, so that degenerate partners in other sectors are
 * still found). The kept eigenvectors are expanded to the full basis for the observables.
 */
export interface SectorSolveOptions {
  states: number;
  tolerance: number;
  maxIterations: number;
  seed: number;
  windowSize?: number;
  verifyDegeneracy: boolean;
  vectorStoreBytes: number;
  /** Absolute energy within which levels count as degenerate (keeps degenerate partners from being abandoned). */
  degeneracyWindow: (energy: number) => number;
  /** Thick-restart Lanczos with full reorthogonalization (no early abandoning). */
  reorthogonalize?: boolean;
  /** Start vectors per sector (key: momentum joined by ','), e.g. the previous point's sector ground states along a sweep. */
  starts?: Map<string, Float64Array>;
}

export interface SectorSummary {
  /** Integers m_a: k_a = 2π m_a / L_a. */
  momentum: number[];
  dimension: number;
  iterations: number;
  /** Lowest level found (an upper bound when abandoned). */
  lowest: number | null;
  abandoned: boolean;
  converged: boolean;
}

export interface SectorSolveResult {
  values: number[];
  /** Full-basis eigenvectors (interleaved complex), ascending energy. */
  vectors: Float64Array[];
  /** Momentum (integers m_a) of each level. */
  momenta: number[][];
  residuals: number[];
  residual: number;
  converged: boolean;
  iterations: number;
  verificationIterations: number;
  recovered: number;
  fallbacks: number;
  secondPassIterations: number;
  restarts: number;
  sectors: SectorSummary[];
  /** Milliseconds spent building sector blocks. */
  sectorBuildMs: number;
  /** Largest sector block in bytes. */
  largestSectorBytes: number;
  /** Lowest vector of every sector solved to convergence (key: momentum joined by ','), for warm starts. */
  sectorVectors: Map<string, Float64Array>;
  /** Sectors that started from a given vector. */
  warmStarted: number;
  /** Milliseconds inside H·x on the sector blocks, and the stored entries those products visited. */
  matvecMs: number;
  matvecEntries: number;
}

interface Kept {
  value: number;
  vector: Float64Array;
  sector: Sector;
  residual: number;
  converged: boolean;
}

export function solveBySectors(
  orbits: OrbitStructure,
  table: Float64Array,
  fullDiagonal: Float64Array,
  o: SectorSolveOptions,
): SectorSolveResult {
  let kept: Kept[] = [];
  const sectors: SectorSummary[] = [];
  let iterations = 0;
  let verificationIterations = 0;
  let recovered = 0;
  let fallbacks = 0;
  let secondPassIterations = 0;
  let restarts = 0;
  let sectorBuildMs = 0;
  let largestSectorBytes = 0;
  let matvecMs = 0;
  let matvecEntries = 0;
  let warmStarted = 0;
  const sectorVectors = new Map<string, Float64Array>();
  const momenta = sectorMomenta(orbits.group);
  momenta.forEach((momentum, index) => {
    const t0 = now();
    const sector = buildSector(orbits, momentum, table, fullDiagonal);
    sectorBuildMs += now() - t0;
    largestSectorBytes = Math.max(largestSectorBytes, sectorBytes(sector));
    if (sector.dimension === 0) {
      sectors.push({ momentum, dimension: 0, iterations: 0, lowest: null, abandoned: false, converged: true });
      return;
    }
    const full = kept.length >= o.states;
    const highest = full ? kept[o.states - 1].value : Number.POSITIVE_INFINITY;
    const entries = sector.packed.length + sector.extraRow.length + sector.dimension;
    const matvec = (x: Float64Array, y: Float64Array): void => {
      const t = now();
      sectorMatvec(sector, x, y);
      matvecMs += now() - t;
      matvecEntries += entries;
    };
    const key = momentum.join(',');
    const given = o.starts?.get(key);
    const start = given && given.length === 2 * sector.dimension ? given : undefined;
    if (start) warmStarted++;
    const eig = lowestEigenpairs(matvec, sector.dimension, {
      startVector: start,
      states: Math.min(o.states, sector.dimension),
      tolerance: o.tolerance,
      maxIterations: o.maxIterations,
      windowSize: o.windowSize,
      seed: o.seed + 104729 * index,
      verifyDegeneracy: o.verifyDegeneracy,
      vectorStoreBytes: o.vectorStoreBytes,
      abandonAbove: full ? highest + o.degeneracyWindow(highest) : undefined,
      reorthogonalize: o.reorthogonalize,
    });
    iterations += eig.iterations;
    verificationIterations += eig.verificationIterations;
    recovered += eig.recovered;
    fallbacks += eig.fallbacks;
    secondPassIterations += eig.secondPassIterations;
    restarts += eig.restarts;
    sectors.push({
      momentum,
      dimension: sector.dimension,
      iterations: eig.iterations,
      lowest: eig.values.length ? eig.values[0] : null,
      abandoned: eig.abandoned,
      converged: eig.abandoned || eig.converged,
    });
    if (eig.abandoned) return;
    if (eig.vectors[0]) sectorVectors.set(key, eig.vectors[0]);
    const found: Kept[] = eig.values.map((value, i) => ({
      value,
      vector: eig.vectors[i],
      sector,
      residual: eig.residuals[i],
      converged: eig.converged,
    }));
    kept = kept.concat(found).sort((a, b) => a.value - b.value).slice(0, o.states);
  });
  const residuals = kept.map((k) => k.residual);
  const residual = residuals.reduce((a, b) => Math.max(a, b), 0);
  return {
    values: kept.map((k) => k.value),
    vectors: kept.map((k) => expandSectorVector(orbits, k.sector, k.vector)),
    momenta: kept.map((k) => k.sector.momentum),
    residuals,
    residual,
    converged: kept.length > 0 && kept.every((k) => k.converged) && sectors.every((s) => s.converged) && residual <= o.tolerance,
    iterations,
    verificationIterations,
    recovered,
    fallbacks,
    secondPassIterations,
    restarts,
    sectors,
    sectorBuildMs,
    largestSectorBytes,
    matvecMs,
    matvecEntries,
    sectorVectors,
    warmStarted,
  };
}

function now(): number {
  return globalThis.performance ? globalThis.performance.now() : Date.now();
}
