import type { CompiledModel } from '../model/types.js';
import { RESULT_SPEC_ID, type Result, type SiteResult } from '../result.js';
import { CORE_VERSION } from '../version.js';
import {
  EdOperator,
  checkEdOperatorOptions,
  chooseStorage,
  estimateOperator,
  type OperatorStorage,
} from '../operators/ed-operator.js';
import { checkLanczosOptions, estimateLanczosBytes } from '../eigen/lanczos.js';
import { lowestEigenpairs } from '../eigen/lowest-eigenpairs.js';
import type { StateManifold } from '../observables/manifold.js';
import { densityCorrelations } from '../observables/densities.js';
import { structureFactor } from '../observables/structure-factor.js';
import { condensateFraction, momentumDistribution, oneBodyDensityMatrix } from '../observables/one-body.js';
import { bondCurrents } from '../observables/currents.js';
import { plaquetteObservables } from '../observables/plaquettes.js';
import { classifyPoint } from '../classify/phases.js';
import { compileDiagonalTerms, compileDirectedMoves, fillCoefficients, structureKey } from '../operators/directed-terms.js';
import { binomial, buildFixedNumberBasis, type FixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import { fillDiagonalSplit } from '../operators/matrix-free.js';
import { buildOrbitStructure, estimateOrbitBytes, translationGroup, type OrbitStructure } from '../symmetry/translation-sectors.js';
import { solveBySectors, type SectorSummary } from './sector-solve.js';

export type EdObservable = 'densities' | 'structure-factor' | 'one-body' | 'currents' | 'plaquettes';
export const ED_OBSERVABLES: readonly EdObservable[] = ['densities', 'structure-factor', 'one-body', 'currents', 'plaquettes'];

export interface EdOptions {
  /** Lowest eigenstates to compute (≥ 2 gives the gap). @default 2 */
  states?: number;
  /** Relative Lanczos residual ‖Hx − θx‖/‖H‖. @default 1e-10 */
  tolerance?: number;
  /** Largest number of H·x products. @default 3000 */
  maxIterations?: number;
  /** Basis vectors per restart window of the thick-restart fallback (the main solver, plain-lanczos.ts, has no window). @default max(16, 2·states + 10) (see lanczos.ts) */
  windowSize?: number;
  /** Seed of the random start vector. @default 1 */
  seed?: number;
  /** Warm-start vector (interleaved complex, length 2·dimension). */
  startVector?: Float64Array;
  /** Memory budget for basis, operator and Lanczos vectors. @default 1.5 GiB */
  memoryBudgetBytes?: number;
  /** Sparse storage of H. @default 'auto' (CSR when it fits the budget, else matrix-free) */
  storage?: 'auto' | OperatorStorage;
  /** States within this energy of E_0 (times max(1, |E_0|)) form the ground manifold. @default 1e-8 */
  degeneracyTolerance?: number;
  /** Observables to evaluate. @default all of ED_OBSERVABLES */
  observables?: readonly EdObservable[];
  /** After convergence, look for missed degenerate copies with a deflated second run (eigen/lowest-eigenpairs.ts). @default true */
  verifyDegeneracy?: boolean;
  /** Thick-restart Lanczos with full reorthogonalization for every run (slower; a cross-check of the default recurrence). @default false */
  reorthogonalize?: boolean;
  /**
   * 'auto': when H is invariant under the lattice translations of the periodic axes (checked
   * term by term), solve it in momentum sectors (symmetry/translation-sectors.ts) — a full-basis
   * start vector is then not used (a warm-starting solver starts each sector from its previous
   * ground state instead); 'none': always the full fixed-number basis. @default 'auto'
   */
  symmetry?: 'auto' | 'none';
}

export type ResolvedEdOptions = Required<Omit<EdOptions, 'startVector' | 'windowSize'>> & {
  startVector: Float64Array | undefined;
  windowSize: number | undefined;
};

export function checkEdOptions(options: EdOptions = {}): ResolvedEdOptions {
  const states = options.states ?? 2;
  const degeneracyTolerance = options.degeneracyTolerance ?? 1e-8;
  if (!(degeneracyTolerance >= 0)) throw new RangeError(`degeneracyTolerance must be ≥ 0, got ${degeneracyTolerance}`);
  const observables = options.observables ?? ED_OBSERVABLES;
  for (const o of observables) {
    if (!ED_OBSERVABLES.includes(o)) throw new RangeError(`unknown observable '${o}' (known: ${ED_OBSERVABLES.join(', ')})`);
  }
  const op = checkEdOperatorOptions({ storage: options.storage, memoryBudgetBytes: options.memoryBudgetBytes });
  return {
    states,
    tolerance: options.tolerance ?? 1e-10,
    maxIterations: options.maxIterations ?? 3000,
    windowSize: options.windowSize,
    seed: options.seed ?? 1,
    startVector: options.startVector,
    memoryBudgetBytes: op.memoryBudgetBytes,
    storage: op.storage,
    degeneracyTolerance,
    observables,
    verifyDegeneracy: options.verifyDegeneracy ?? true,
    symmetry: checkSymmetry(options.symmetry),
    reorthogonalize: options.reorthogonalize ?? false,
  };
}

function checkSymmetry(value: EdOptions['symmetry']): 'auto' | 'none' {
  const v = value ?? 'auto';
  if (v !== 'auto' && v !== 'none') throw new RangeError(`symmetry must be 'auto' or 'none', got ${String(v)}`);
  return v;
}

/** A solved point with the eigenvectors, for warm starts and fidelities. */
export interface EdSolution {
  result: Result;
  /** Lowest eigenvectors (interleaved complex), ascending energy. */
  vectors: Float64Array[];
  /** The ground manifold the observables were averaged over. */
  manifold: StateManifold;
  /** The full-basis operator (absent when the point was solved in momentum sectors). */
  operator?: EdOperator;
}

/** What the eigen-solve produced, on either path. */
interface Eigen {
  values: number[];
  vectors: Float64Array[];
  converged: boolean;
  iterations: number;
  residual: number;
  residuals: number[];
  restarts: number;
  verificationIterations: number;
  recovered: number;
  fallbacks: number;
  secondPassIterations: number;
  basis: FixedNumberBasis;
  nnz: number;
  storage: string;
  operatorBytes: number;
  rebuilt: boolean;
  operatorMs: number;
  warmStart: boolean;
  lanczosMs: number;
  symmetry: Record<string, unknown>;
  /** Site permutations leaving the ground manifold's ρ unchanged (sector path). */
  symmetries?: Int32Array[];
}

/** Cached per structure: sectors re-weight by refilling the table and the diagonal. */
interface SectorCache {
  structure: string;
  orbits: OrbitStructure;
  nnz: number;
}

/**
 * Exact diagonalization of a compiled hardcore-boson model; keeps its operator between calls so
 * that a sweep re-weights instead of rebuilding, and (with `warmStart`) starts Lanczos from the
 * previous ground state when the Hilbert space is unchanged.
 */
export class EdSolver {
  private operator: EdOperator | null = null;
  private sectors: SectorCache | null = null;
  /** Per momentum, the lowest sector vector of the previous solve (warm starts along a sweep). */
  private previousSectors: Map<string, Float64Array> | null = null;
  private symmetryReason: string | null = null;
  private previous: Float64Array | null = null;
  private readonly options: ResolvedEdOptions;

  /** @param warmStart start each solve from the previous ground state when the basis is unchanged */
  constructor(options: EdOptions = {}, private readonly warmStart = false) {
    this.options = checkEdOptions(options);
  }

  solve(model: CompiledModel): EdSolution {
    const o = this.options;
    const dimension = binomial(model.nSites, model.nParticles);
    // A Hilbert space smaller than the requested number of states (e.g. N = 0) gives all its states.
    const states = Math.min(o.states, dimension);
    const lanczosOptions = checkLanczosOptions(dimension, {
      states,
      tolerance: o.tolerance,
      maxIterations: o.maxIterations,
      windowSize: o.windowSize,
      seed: o.seed,
      startVector: o.startVector,
    });
    const eig = this.solveSectors(model, states, lanczosOptions.windowSize) ?? this.solveFull(model, states, lanczosOptions);
    const buildMs = eig.operatorMs;
    const solveStart = now() - eig.lanczosMs;
    const { rebuilt, lanczosMs } = eig;
    const energies = eig.values;
    const e0 = energies[0];
    const degTol = o.degeneracyTolerance * Math.max(1, Math.abs(e0));
    let g = 1;
    while (g < energies.length && energies[g] - e0 <= degTol) g++;
    const warnings: string[] = [];
    if (!eig.converged) {
      warnings.push(
        `Lanczos did not converge: residual ${eig.residual.toExponential(2)} > tolerance ${o.tolerance} after ${eig.iterations} products H·x`,
      );
    }
    if (g > 1) {
      warnings.push(
        `degenerate ground state: ${g} states within ${degTol.toExponential(1)} of E0; observables are averaged over them`,
      );
    }
    if (g === energies.length && energies.length < dimension) {
      warnings.push(`all ${g} computed states are degenerate; the ground manifold may be larger — raise states`);
    }
    // Sector vectors are momentum eigenstates: ρ of the manifold is translation invariant.
    const manifold: StateManifold = { basis: eig.basis, vectors: eig.vectors.slice(0, g), ...(eig.symmetries ? { symmetries: eig.symmetries } : {}) };

    const obsStart = now();
    const want = new Set(o.observables);
    const lattice = model.lattice;
    const extras: Record<string, unknown> = {};
    let densities: Float64Array = new Float64Array(model.nSites);
    let correlations: Float64Array = new Float64Array(0);
    if (want.has('densities') || want.has('structure-factor') || want.has('one-body')) {
      const dc = densityCorrelations(manifold);
      densities = dc.densities;
      correlations = dc.correlations;
      extras.densityCorrelations = Array.from(correlations);
    }
    const sites: SiteResult[] = lattice.sites.map((s) => ({
      index: s.index,
      x: s.x,
      y: s.y,
      density: want.has('densities') ? densities[s.index] : Number.NaN,
      condensate: [0, 0],
    }));
    const sq = want.has('structure-factor') ? structureFactor(lattice, densities, correlations) : [];
    let fraction = Number.NaN;
    if (want.has('one-body')) {
      const obdm = oneBodyDensityMatrix(manifold, densities);
      fraction = condensateFraction(obdm, model.nSites, model.nParticles);
      extras.momentumDistribution = momentumDistribution(lattice, obdm);
    } else warnings.push('condensate fraction not computed (one-body observables skipped)');
    const currents = want.has('currents') || want.has('plaquettes') ? bondCurrents(model, manifold) : [];
    let plaquettes: Result['plaquettes'] = [];
    if (want.has('plaquettes')) {
      const p = plaquetteObservables(model, manifold, currents);
      plaquettes = p.plaquettes;
      if (p.fluxUndefined.length) extras.fluxUndefined = p.fluxUndefined;
    }
    const observablesMs = now() - obsStart;
    extras.dimension = dimension;
    extras.nnz = eig.nnz;
    extras.storage = eig.storage;
    extras.operatorBytes = eig.operatorBytes;
    extras.operatorRebuilt = rebuilt;
    extras.symmetry = eig.symmetry;
    extras.groundDegeneracy = g;
    extras.residuals = eig.residuals;
    extras.restarts = eig.restarts;
    extras.verificationIterations = eig.verificationIterations;
    extras.recoveredStates = eig.recovered;
    extras.eigenFallbacks = eig.fallbacks;
    extras.secondPassIterations = eig.secondPassIterations;
    extras.timing = { operatorMs: eig.operatorMs, lanczosMs, observablesMs };

    const result: Result = {
      spec: RESULT_SPEC_ID,
      method: 'ed',
      energy: e0,
      energyPerSite: e0 / model.nSites,
      energies,
      gap: energies.length >= 2 ? energies[1] - e0 : null,
      degenerate: g > 1,
      sites,
      bonds: want.has('currents') ? currents.map(({ from, to, class: c, current }) => ({ from, to, class: c, current })) : [],
      plaquettes,
      structureFactor: sq,
      condensateFraction: fraction,
      convergence: { converged: eig.converged, iterations: eig.iterations, residual: eig.residual },
      timing: { buildMs, solveMs: now() - solveStart },
      provenance: {
        modelHash: '',
        version: CORE_VERSION,
        solver: {
          states: o.states,
          tolerance: o.tolerance,
          maxIterations: o.maxIterations,
          windowSize: lanczosOptions.windowSize,
          seed: o.seed,
          warmStart: eig.warmStart,
          degeneracyTolerance: o.degeneracyTolerance,
          verifyDegeneracy: o.verifyDegeneracy,
          symmetry: o.symmetry,
          reorthogonalize: o.reorthogonalize,
        },
      },
      extras,
      ...(warnings.length ? { warnings } : {}),
    };
    // Same classifier as mean-field points, with its ED thresholds (S(q), condensate fraction, currents, chirality).
    result.label = classifyPoint(result).label;
    return { result, vectors: eig.vectors, manifold, ...(this.operator && eig.storage !== 'momentum-sectors' ? { operator: this.operator } : {}) };
  }

  /** Full fixed-number basis: one operator (CSR or matrix-free), warm starts honoured. */
  private solveFull(model: CompiledModel, states: number, lanczosOptions: ReturnType<typeof checkLanczosOptions>): Eigen {
    const o = this.options;
    const dimension = binomial(model.nSites, model.nParticles);
    // Memory check before anything is allocated.
    const reserved = estimateLanczosBytes(dimension, lanczosOptions.windowSize, states);
    const operatorOptions = { storage: o.storage, memoryBudgetBytes: o.memoryBudgetBytes, reservedBytes: reserved };
    const estimate = estimateOperator(model);
    const storage = chooseStorage(estimate, checkEdOperatorOptions(operatorOptions));
    // What the budget leaves after the operator and the vectors that exist beside the kept Lanczos
    // vectors (the recurrence's three, the `states` Ritz vectors being summed, one spare) may
    // hold Lanczos vectors instead of recomputing them (plain-lanczos.ts releases them before
    // its Rayleigh–Ritz step and the degeneracy check keeps none).
    const operatorBytes = storage === 'csr' ? estimate.totalCsrBytes : estimate.totalMatrixFreeBytes;
    const vectorStoreBytes = Math.max(0, o.memoryBudgetBytes - operatorBytes - 16 * dimension * (states + 4));
    let rebuilt = true;
    if (this.operator) rebuilt = this.operator.update(model) === 'rebuilt';
    else this.operator = new EdOperator(model, operatorOptions);
    const op = this.operator;

    const solveStart = now();
    const start = o.startVector ?? (this.warmStart && !rebuilt && this.previous ? this.previous : undefined);
    const eig = lowestEigenpairs((x, y) => op.matvec(x, y), op.dimension, {
      ...lanczosOptions,
      startVector: start,
      verifyDegeneracy: o.verifyDegeneracy,
      vectorStoreBytes,
      reorthogonalize: o.reorthogonalize,
    });
    this.previous = eig.vectors[0] ?? null;
    return {
      ...eig,
      basis: op.basis,
      nnz: op.nnz,
      storage: op.storage,
      operatorBytes: op.bytes,
      rebuilt,
      operatorMs: op.buildMs,
      warmStart: start !== undefined,
      lanczosMs: now() - solveStart,
      symmetry: { kind: 'none', reason: this.symmetryReason ?? 'not requested (symmetry: none)' },
    };
  }

  /**
   * Momentum sectors when the model is translation invariant and `symmetry` allows; null
   * otherwise (the reason is kept for the result's extras).
   */
  private solveSectors(model: CompiledModel, states: number, windowSize: number): Eigen | null {
    const o = this.options;
    this.symmetryReason = null;
    if (o.symmetry === 'none') return null;
    const buildStart = now();
    const moves = compileDirectedMoves(model);
    const table = new Float64Array(2 * moves.coefficientCount);
    fillCoefficients(model, table);
    const diagonalTerms = compileDiagonalTerms(model);
    const check = translationGroup(model, moves, table, diagonalTerms);
    if (!check.group) {
      this.symmetryReason = check.reason;
      return null;
    }
    if (check.group.order < 2) {
      this.symmetryReason = 'a single cell along the periodic axes';
      return null;
    }
    const structure = structureKey(model);
    let rebuilt = false;
    if (!this.sectors || this.sectors.structure !== structure) {
      // Memory check before anything is allocated: basis, diagonal, orbit tables, two sector
      // blocks (the one being solved and one kept) and the sector's Lanczos vectors.
      const estimate = estimateOperator(model);
      const order = check.group.order;
      const sectorDim = Math.ceil(estimate.dimension / order);
      const needed =
        estimate.basisBytes +
        estimate.diagonalBytes +
        estimateOrbitBytes(estimate.dimension, estimate.nnz, order) +
        2 * (Math.ceil(estimate.nnz / order) * 4 + 24 * sectorDim) +
        estimateLanczosBytes(sectorDim, windowSize, states) +
        16 * estimate.dimension * (states + 1);
      if (needed > o.memoryBudgetBytes) {
        this.symmetryReason = `momentum sectors need about ${Math.round(needed / 2 ** 20)} MiB, above the memory budget`;
        return null;
      }
      const basis = buildFixedNumberBasis(model.nSites, model.nParticles);
      this.sectors = { structure, orbits: buildOrbitStructure(check.group, basis, moves), nnz: estimate.nnz };
      this.previousSectors = null;
      rebuilt = true;
    }
    const { orbits, nnz } = this.sectors;
    const diagonal = new Float64Array(orbits.basis.dimension);
    fillDiagonalSplit(orbits.basis, diagonalTerms, diagonal);
    const orbitMs = now() - buildStart;
    // Sector vectors are small: keep every Lanczos vector the budget allows.
    const sectorDim = Math.ceil(orbits.basis.dimension / check.group.order);
    const vectorStoreBytes = Math.max(16 * sectorDim * 2, o.memoryBudgetBytes / 4);
    const solveStart = now();
    const r = solveBySectors(orbits, table, diagonal, {
      states,
      tolerance: o.tolerance,
      maxIterations: o.maxIterations,
      seed: o.seed,
      windowSize: o.windowSize,
      verifyDegeneracy: o.verifyDegeneracy,
      vectorStoreBytes,
      degeneracyWindow: (e) => o.degeneracyTolerance * Math.max(1, Math.abs(e)),
      reorthogonalize: o.reorthogonalize,
      ...(this.warmStart && this.previousSectors ? { starts: this.previousSectors } : {}),
    });
    this.previousSectors = r.sectorVectors;
    const lanczosMs = now() - solveStart - r.sectorBuildMs;
    this.previous = null;
    const lengths = check.group.lengths;
    const symmetry: Record<string, unknown> = {
      kind: 'translations',
      axes: check.group.axes,
      lengths,
      sectors: r.sectors.length,
      momenta: r.momenta,
      groundMomentum: r.momenta[0]?.map((m, a) => `${m}/${lengths[a]}`),
      sectorRuns: r.sectors.map((s: SectorSummary) => ({ ...s })),
      matvecMs: r.matvecMs,
      matvecEntries: r.matvecEntries,
      warmStartedSectors: r.warmStarted,
      ...(o.startVector ? { note: 'a full-basis start vector is not used in momentum sectors (along a sweep each sector starts from its previous ground state)' } : {}),
    };
    return {
      values: r.values,
      vectors: r.vectors,
      converged: r.converged,
      iterations: r.iterations,
      residual: r.residual,
      residuals: r.residuals,
      restarts: r.restarts,
      verificationIterations: r.verificationIterations,
      recovered: r.recovered,
      fallbacks: r.fallbacks,
      secondPassIterations: r.secondPassIterations,
      basis: orbits.basis,
      nnz,
      storage: 'momentum-sectors',
      operatorBytes:
        orbits.basis.states.byteLength +
        orbits.reps.byteLength +
        orbits.stabilizer.byteLength +
        orbits.rowStart.byteLength +
        orbits.target.byteLength +
        orbits.element.byteLength +
        orbits.coefficient.byteLength +
        r.largestSectorBytes,
      rebuilt,
      operatorMs: orbitMs + r.sectorBuildMs,
      warmStart: r.warmStarted > 0,
      lanczosMs,
      symmetry,
      symmetries: check.group.sitePermutations,
    };
  }
}

/** Solves one model by exact diagonalization (see EdSolver). `provenance.modelHash` is left empty for the caller. */
export function solveEd(model: CompiledModel, options: EdOptions = {}): Result {
  return new EdSolver(options).solve(model).result;
}


function now(): number {
  return globalThis.performance ? globalThis.performance.now() : Date.now();
}
