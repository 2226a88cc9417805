import type { CompiledModel } from '../model/types.js';
import { SizeError } from '../errors.js';
import {
  buildFixedNumberBasis,
  estimateBasisBytes,
  binomial,
  formatBytes,
  type FixedNumberBasis,
} from '../hilbert/fixed-number-basis.js';
import {
  compileDiagonalTerms,
  compileDirectedMoves,
  countMoves,
  fillCoefficients,
  structureKey,
  type DiagonalTerms,
  type DirectedMoves,
} from './directed-terms.js';
import { buildCsr, csrBytes, csrMatvec, type CsrComplex } from './csr-complex.js';
import { buildSplitPlan, fillDiagonalSplit, matrixFreeMatvec, splitPlanBytes, type SplitPlan } from './matrix-free.js';

export type OperatorStorage = 'csr' | 'matrix-free';

export interface EdOperatorOptions {
  /** Sparse storage: CSR when it fits the budget, else matrix-free. @default 'auto' */
  storage?: 'auto' | OperatorStorage;
  /** Largest number of bytes the operator plus `reservedBytes` may take. @default 1.5 GiB */
  memoryBudgetBytes?: number;
  /** Bytes the caller will allocate besides the operator (e.g. Lanczos vectors). @default 0 */
  reservedBytes?: number;
}

export const DEFAULT_MEMORY_BUDGET_BYTES = 1.5 * 2 ** 30;

export function checkEdOperatorOptions(options: EdOperatorOptions = {}): Required<EdOperatorOptions> {
  const storage = options.storage ?? 'auto';
  if (storage !== 'auto' && storage !== 'csr' && storage !== 'matrix-free') {
    throw new RangeError(`storage must be 'auto', 'csr' or 'matrix-free', got ${String(storage)}`);
  }
  const memoryBudgetBytes = options.memoryBudgetBytes ?? DEFAULT_MEMORY_BUDGET_BYTES;
  if (!(memoryBudgetBytes > 0)) throw new RangeError(`memoryBudgetBytes must be positive, got ${memoryBudgetBytes}`);
  const reservedBytes = options.reservedBytes ?? 0;
  if (!(reservedBytes >= 0)) throw new RangeError(`reservedBytes must be ≥ 0, got ${reservedBytes}`);
  return { storage, memoryBudgetBytes, reservedBytes };
}

/** What an operator will cost, computed from the model alone before any allocation. */
export interface OperatorEstimate {
  dimension: number;
  /** Off-diagonal elements of H (exact); CSR stores the half above the diagonal. */
  nnz: number;
  basisBytes: number;
  diagonalBytes: number;
  csrBytes: number;
  /** Total bytes for each storage choice (basis + diagonal + sparse part). */
  totalCsrBytes: number;
  totalMatrixFreeBytes: number;
}

export function estimateOperator(model: CompiledModel): OperatorEstimate {
  const dimension = binomial(model.nSites, model.nParticles);
  const moves = compileDirectedMoves(model);
  const nnz = countMoves(moves, model.nSites, model.nParticles);
  const basisBytes = estimateBasisBytes(model.nSites, model.nParticles);
  const diagonalBytes = 8 * dimension;
  const sparse = csrBytes(dimension, nnz, moves.coefficientCount);
  return {
    dimension,
    nnz,
    basisBytes,
    diagonalBytes,
    csrBytes: sparse,
    totalCsrBytes: basisBytes + diagonalBytes + sparse,
    totalMatrixFreeBytes: basisBytes + diagonalBytes,
  };
}

/** Picks the storage for a budget or throws SizeError saying what it would take. */
export function chooseStorage(
  estimate: OperatorEstimate,
  options: Required<EdOperatorOptions>,
): OperatorStorage {
  const { memoryBudgetBytes: budget, reservedBytes } = options;
  const csrTotal = estimate.totalCsrBytes + reservedBytes;
  const freeTotal = estimate.totalMatrixFreeBytes + reservedBytes;
  if (options.storage === 'csr' ? csrTotal <= budget : options.storage === 'auto' && csrTotal <= budget) return 'csr';
  if (options.storage !== 'csr' && freeTotal <= budget) return 'matrix-free';
  const needed = options.storage === 'csr' ? csrTotal : freeTotal;
  throw new SizeError(
    `exact diagonalization needs about ${formatBytes(needed)} (${estimate.dimension} states, ` +
      `${estimate.nnz} off-diagonal elements, ${options.storage === 'csr' ? 'CSR' : 'matrix-free'} storage, ` +
      `${formatBytes(reservedBytes)} for eigenvectors), above the memory budget of ${formatBytes(budget)}; ` +
      `raise memoryBudgetBytes (CLI: --memory-budget <bytes>) or use a smaller cluster`,
    undefined,
    { ...estimate, reservedBytes, budget, storage: options.storage },
  );
}

/**
 * H of a compiled model on the fixed-number hardcore-boson basis, Hermitian by construction
 * (every hop entry brings its conjugate). Vectors are interleaved complex Float64Arrays of
 * length 2·dimension. `update` re-weights in place when only amplitudes changed.
 */
export class EdOperator {
  basis: FixedNumberBasis;
  storage: OperatorStorage;
  nnz: number;
  diagonal: Float64Array;
  /** Interleaved complex coefficients of the hop entries: 2 per entry (t, conj t). */
  table: Float64Array;
  private moves: DirectedMoves;
  private diagonalTerms: DiagonalTerms;
  private csr: CsrComplex | null;
  private plan: SplitPlan | null;
  private structure: string;
  private readonly options: Required<EdOperatorOptions>;
  /** Milliseconds spent building (basis + sparse structure + diagonal). */
  buildMs: number;

  constructor(model: CompiledModel, options: EdOperatorOptions = {}) {
    this.options = checkEdOperatorOptions(options);
    const started = now();
    const estimate = estimateOperator(model);
    this.storage = chooseStorage(estimate, this.options);
    this.basis = buildFixedNumberBasis(model.nSites, model.nParticles);
    this.moves = compileDirectedMoves(model);
    this.diagonalTerms = compileDiagonalTerms(model);
    this.nnz = estimate.nnz;
    this.table = new Float64Array(2 * this.moves.coefficientCount);
    fillCoefficients(model, this.table);
    this.diagonal = new Float64Array(this.basis.dimension);
    fillDiagonalSplit(this.basis, this.diagonalTerms, this.diagonal);
    const plan = buildSplitPlan(this.basis, this.moves);
    this.csr = this.storage === 'csr' ? buildCsr(this.basis, plan, this.moves.coefficientCount, this.nnz) : null;
    this.plan = this.storage === 'matrix-free' ? plan : null;
    this.structure = structureKey(model);
    this.buildMs = now() - started;
  }

  get dimension(): number {
    return this.basis.dimension;
  }

  /** Bytes held by the operator (basis, diagonal, sparse structure, tables). */
  get bytes(): number {
    const b = this.basis;
    let total = b.states.byteLength + b.rankOfLow.byteLength + b.offsetOfHigh.byteLength;
    total += this.diagonal.byteLength + this.table.byteLength;
    const csr = this.csr;
    if (csr) total += csr.rowStart.byteLength + (csr.packed ?? csr.column ?? new Int32Array(0)).byteLength + (csr.coefficient?.byteLength ?? 0);
    if (this.plan) total += splitPlanBytes(this.plan);
    return total;
  }

  /** y = H x (interleaved complex; x and y must not alias). */
  matvec(x: Float64Array, y: Float64Array): void {
    if (this.csr) csrMatvec(this.csr, this.table, this.diagonal, x, y);
    else matrixFreeMatvec(this.basis, this.plan as SplitPlan, this.table, this.diagonal, x, y);
  }

  /**
   * Takes the amplitudes of `model`. When its structure (sites, particles, terms and their
   * entries' sites) is unchanged, rewrites the coefficient table and the diagonal in place
   * ('reweighted' — any change of amplitudes, not only a common factor per family); else
   * rebuilds everything ('rebuilt').
   */
  update(model: CompiledModel): 'reweighted' | 'rebuilt' {
    const started = now();
    if (structureKey(model) === this.structure) {
      fillCoefficients(model, this.table);
      this.diagonalTerms = compileDiagonalTerms(model);
      fillDiagonalSplit(this.basis, this.diagonalTerms, this.diagonal);
      this.buildMs = now() - started;
      return 'reweighted';
    }
    const fresh = new EdOperator(model, this.options);
    this.basis = fresh.basis;
    this.storage = fresh.storage;
    this.nnz = fresh.nnz;
    this.diagonal = fresh.diagonal;
    this.table = fresh.table;
    this.moves = fresh.moves;
    this.diagonalTerms = fresh.diagonalTerms;
    this.csr = fresh.csr;
    this.plan = fresh.plan;
    this.structure = fresh.structure;
    this.buildMs = now() - started;
    return 'rebuilt';
  }
}

function now(): number {
  return globalThis.performance ? globalThis.performance.now() : Date.now();
}
