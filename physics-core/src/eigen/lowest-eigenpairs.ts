import { checkLanczosOptions, lanczos, type LanczosOptions, type LanczosResult } from './lanczos.js';
import { plainLanczos, type PlainLanczosResult } from './plain-lanczos.js';
import { hermitianEigen } from '../bands/hermitian-eigen.js';

/**
 * Lowest eigenpairs with a check for missed degenerate copies.
 *
 * The eigenpairs come from Lanczos without reorthogonalization (plain-lanczos.ts: one H·x and a
 * few vector passes per step, vectors kept in `vectorStoreBytes` or regenerated). If its
 * explicit residuals miss the tolerance (or the Krylov space closes before enough levels
 * appear), thick-restart Lanczos (lanczos.ts) refines from its lowest vector.
 *
 * Single-vector Lanczos sees only the component of its start vector in each eigenspace, so a
 * degenerate level appears once (in exact arithmetic) and the next distinct level takes the
 * second slot: the gap would read as finite where it is zero. After the main run, a second
 * Lanczos run with a fresh random start, kept orthogonal to the pairs found (deflation), looks
 * for a state below the highest one found; if there is one, it is converged to full tolerance,
 * swapped in, and the check repeats. The check stops at a looser tolerance (it only has to decide
 * whether such a state exists), so it costs less than the main run.
 */
export interface LowestEigenpairsOptions extends LanczosOptions {
  /** Look for missed degenerate copies after convergence. @default true */
  verifyDegeneracy?: boolean;
  /** Relative residual at which the check's Ritz value decides. @default max(tolerance, 1e-5) (measured: 1e-6 costs ~15% more H·x) */
  verifyTolerance?: number;
  /** Bytes for keeping Lanczos vectors instead of recomputing them (see plain-lanczos.ts). @default 256 MiB */
  vectorStoreBytes?: number;
  /** Stop early when the lowest eigenvalue is clearly above this energy (plain-lanczos.ts `abandonAbove`); the result is then `abandoned`. */
  abandonAbove?: number;
  /**
   * Use thick-restart Lanczos with full reorthogonalization in its window (lanczos.ts) for every
   * run instead of the three-term recurrence without it: slower, for cross-checks. `abandonAbove`
   * is then ignored. @default false
   */
  reorthogonalize?: boolean;
}

export interface LowestEigenpairsResult extends LanczosResult {
  /** H·x products spent in the degeneracy check (included in `iterations`). */
  verificationIterations: number;
  /** Eigenpairs the check added (missed degenerate copies or levels). */
  recovered: number;
  /** Thick-restart runs needed because Lanczos without reorthogonalization fell short. */
  fallbacks: number;
  /** H·x spent recomputing Lanczos vectors that did not fit in `vectorStoreBytes` (included in `iterations`). */
  secondPassIterations: number;
  /** The run stopped at `abandonAbove`: no vectors, values are unconverged upper bounds. */
  abandoned: boolean;
}

/**
 * Spaces this small (without locked vectors) are diagonalized densely: n products build H, and
 * Jacobi rotations (bands/hermitian-eigen.ts) give every level, degenerate ones included. A
 * Krylov method gains nothing there, and on a tiny block with a degenerate level (e.g. a 2-state
 * momentum sector with H_k = 0) single-vector Lanczos finds fewer levels than wanted.
 */
export const DENSE_DIMENSION = 16;

export function lowestEigenpairs(
  matvec: (x: Float64Array, y: Float64Array) => void,
  dimension: number,
  options: LowestEigenpairsOptions = {},
): LowestEigenpairsResult {
  const opts = checkLanczosOptions(dimension, options);
  if (dimension <= DENSE_DIMENSION && !(options.locked?.length)) return dense(matvec, dimension, opts.states);
  const verify = options.verifyDegeneracy ?? true;
  const verifyTolerance = options.verifyTolerance ?? Math.max(opts.tolerance, 1e-5);
  if (!(verifyTolerance > 0 && verifyTolerance < 1)) throw new RangeError(`verifyTolerance must be in (0, 1), got ${verifyTolerance}`);
  let fallbacks = 0;
  let secondPassIterations = 0;
  /** Plain Lanczos, then thick restart from its lowest vector if it did not converge. */
  let abandoned = false;
  const solve = (o: LanczosOptions, wantVectors = true, abandonAbove?: number): LanczosResult => {
    if (options.reorthogonalize) return lanczos(matvec, dimension, o);
    const first: PlainLanczosResult = plainLanczos(matvec, dimension, {
      ...o,
      vectorStoreBytes: options.vectorStoreBytes,
      wantVectors,
      abandonAbove,
    });
    secondPassIterations += first.secondPassIterations;
    if (first.abandoned) abandoned = true;
    if (first.converged || !wantVectors || first.abandoned) return first;
    fallbacks++;
    const rest = lanczos(matvec, dimension, {
      ...o,
      startVector: first.vectors[0] ?? o.startVector,
      maxIterations: Math.max(1, (o.maxIterations ?? opts.maxIterations) - first.iterations),
    });
    return { ...rest, iterations: first.iterations + rest.iterations };
  };
  const main = solve(options, true, options.abandonAbove);
  const k = main.values.length;
  let verificationIterations = 0;
  let recovered = 0;
  if (abandoned || !verify || k + (options.locked?.length ?? 0) >= dimension) {
    return { ...main, verificationIterations, recovered, fallbacks, secondPassIterations, abandoned };
  }
  let values = [...main.values];
  let vectors = [...main.vectors];
  let residuals = [...main.residuals];
  let converged = main.converged;
  let normEstimate = main.normEstimate;
  const budget = (): number => Math.max(1, opts.maxIterations - main.iterations - verificationIterations);
  for (let round = 0; round < k && k + (options.locked?.length ?? 0) < dimension; round++) {
    const locked = [...(options.locked ?? []), ...vectors];
    if (locked.length >= dimension) break;
    const probeOptions: LanczosOptions = {
      ...options,
      states: 1,
      locked,
      startVector: undefined,
      seed: opts.seed + 7919 * (round + 1),
      tolerance: verifyTolerance,
      maxIterations: budget(),
    };
    // Only its lowest value matters: no vectors, one pass.
    const probe = solve(probeOptions, false);
    verificationIterations += probe.iterations;
    normEstimate = Math.max(normEstimate, probe.normEstimate);
    const highest = values[k - 1];
    if (!(probe.values[0] < highest - opts.tolerance * normEstimate)) break;
    // A state below the highest one found was missed: converge it fully and swap it in.
    const refined = solve({ ...probeOptions, tolerance: opts.tolerance, maxIterations: budget() });
    verificationIterations += refined.iterations;
    recovered++;
    const merged = values
      .map((value, i) => ({ value, vector: vectors[i], residual: residuals[i] }))
      .concat([{ value: refined.values[0], vector: refined.vectors[0], residual: refined.residuals[0] }])
      .sort((a, b) => a.value - b.value)
      .slice(0, k);
    values = merged.map((x) => x.value);
    vectors = merged.map((x) => x.vector);
    residuals = merged.map((x) => x.residual);
    converged = converged && refined.converged;
  }
  const residual = residuals.reduce((a, b) => Math.max(a, b), 0);
  return {
    values,
    vectors,
    converged: converged && residual <= opts.tolerance,
    iterations: main.iterations + verificationIterations,
    restarts: main.restarts,
    residuals,
    residual,
    normEstimate,
    verificationIterations,
    recovered,
    fallbacks,
    secondPassIterations,
    abandoned: false,
  };
}

/** Dense complex matrix of a matvec on interleaved (re, im) vectors, column by column; row-major re/im. */
export function denseFromMatvec(matvec: (x: Float64Array, y: Float64Array) => void, n: number): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  const x = new Float64Array(2 * n);
  const y = new Float64Array(2 * n);
  for (let c = 0; c < n; c++) {
    x.fill(0);
    x[2 * c] = 1;
    matvec(x, y);
    for (let r = 0; r < n; r++) {
      re[r * n + c] = y[2 * r];
      im[r * n + c] = y[2 * r + 1];
    }
  }
  return { re, im };
}

/** The lowest `states` eigenpairs of a small H built column by column from `matvec`. */
function dense(matvec: (x: Float64Array, y: Float64Array) => void, n: number, states: number): LowestEigenpairsResult {
  const { re, im } = denseFromMatvec(matvec, n);
  let norm = 0;
  for (let q = 0; q < n * n; q++) norm = Math.max(norm, Math.hypot(re[q], im[q]));
  const y = new Float64Array(2 * n);
  const eig = hermitianEigen(re, im, n);
  const values: number[] = [];
  const vectors: Float64Array[] = [];
  const residuals: number[] = [];
  for (let j = 0; j < states; j++) {
    const v = new Float64Array(2 * n);
    for (let r = 0; r < n; r++) {
      v[2 * r] = eig.vectorsRe[r * n + j];
      v[2 * r + 1] = eig.vectorsIm[r * n + j];
    }
    // Explicit residual ‖Hv − θv‖/‖H‖, as the Lanczos paths report it.
    matvec(v, y);
    let r2 = 0;
    for (let q = 0; q < 2 * n; q++) r2 += (y[q] - eig.values[j] * v[q]) ** 2;
    values.push(eig.values[j]);
    vectors.push(v);
    residuals.push(Math.sqrt(r2) / Math.max(norm, Number.MIN_VALUE));
  }
  const residual = residuals.reduce((a, b) => Math.max(a, b), 0);
  return {
    values,
    vectors,
    // Jacobi rotations converge to rounding; the residual relative to ‖H‖ is reported but not a test,
    // since for a (numerically) zero block the ratio of two rounding errors means nothing.
    converged: eig.converged,
    iterations: n + states,
    restarts: 0,
    residuals,
    residual,
    normEstimate: norm,
    verificationIterations: 0,
    recovered: 0,
    fallbacks: 0,
    secondPassIterations: 0,
    abandoned: false,
  };
}
