import { mulberry32, gaussian } from '../util/random.js';
import { denseSymmetricEigen } from './dense-symmetric.js';
import { dotc, norm2, projectOut, scale, subtractScaled } from './complex-vector.js';

/**
 * Lowest eigenpairs of a complex Hermitian operator given only as y = H x (interleaved complex
 * Float64Arrays of length 2·dimension), by thick-restart Lanczos (Wu & Simon, SIAM J. Matrix
 * Anal. Appl. 2000) with full reorthogonalization inside the restart window.
 *
 * Each window grows an orthonormal basis V of at most `windowSize` vectors; the projected matrix
 * T = V†HV is real symmetric (tridiagonal, plus an arrowhead after a restart) and is solved by
 * Householder + implicit QL. A restart keeps the lowest Ritz vectors and the last Lanczos vector.
 * Convergence: every wanted pair has ‖Hx − θx‖ ≤ tolerance·‖H‖, where ‖H‖ is estimated by the
 * largest |Ritz value| seen; the returned residuals are recomputed explicitly with H.
 * Memory: (windowSize + 1) vectors plus one work vector. The ED path uses Lanczos without
 * reorthogonalization (plain-lanczos.ts, ~1 H·x and 4 vector passes per step against ~2·window
 * passes here) and falls back to this solver only when that one misses the tolerance.
 */
export interface LanczosOptions {
  /** Number of lowest eigenpairs wanted. @default 2 */
  states?: number;
  /** Relative residual ‖Hx − θx‖ / ‖H‖ for convergence. @default 1e-10 */
  tolerance?: number;
  /** Largest number of products H·x. @default 3000 */
  maxIterations?: number;
  /** Basis vectors per restart window (capped at the dimension). @default max(16, 2·states + 10) (measured in bench/ed.bench.ts) */
  windowSize?: number;
  /** Seed of the random start vector and of random vectors added after an invariant subspace. @default 1 */
  seed?: number;
  /** Start vector (warm start), interleaved complex; need not be normalized. */
  startVector?: Float64Array;
  /**
   * Orthonormal vectors to stay orthogonal to (deflation): the iteration then works with
   * P H P, P = 1 − Σ|x⟩⟨x|, and finds the lowest eigenpairs of H in their complement.
   */
  locked?: Float64Array[];
  /** Ritz vectors kept at a restart (≥ states + 1, < windowSize). @default states + ⌊(windowSize − states)/4⌋ (fewer kept vectors make each restart cheaper; measured in bench/ed.bench.ts) */
  restartKeep?: number;
}

export interface LanczosResult {
  values: number[];
  /** Orthonormal Ritz vectors, interleaved complex. */
  vectors: Float64Array[];
  converged: boolean;
  /** Products H·x performed (including the explicit residual check). */
  iterations: number;
  restarts: number;
  /** Explicit ‖Hx − θx‖ / ‖H‖ for each pair. */
  residuals: number[];
  /** Largest entry of `residuals`. */
  residual: number;
  /** Estimate of ‖H‖ (largest |Ritz value| seen) used to make residuals relative. */
  normEstimate: number;
}

export function checkLanczosOptions(
  dimension: number,
  options: LanczosOptions = {},
): Required<Omit<LanczosOptions, 'startVector' | 'locked'>> & { startVector: Float64Array | undefined; locked: Float64Array[] } {
  const states = options.states ?? 2;
  const locked = options.locked ?? [];
  for (const x of locked) {
    if (x.length !== 2 * dimension) throw new RangeError(`locked vector has length ${x.length}, expected ${2 * dimension}`);
  }
  const free = dimension - locked.length;
  if (!Number.isInteger(states) || states < 1) throw new RangeError(`states must be an integer ≥ 1, got ${states}`);
  if (states > free) throw new RangeError(`states (${states}) exceeds the Hilbert-space dimension (${free}${locked.length ? ' outside the locked vectors' : ''})`);
  const tolerance = options.tolerance ?? 1e-10;
  if (!(tolerance > 0 && tolerance < 1)) throw new RangeError(`tolerance must be in (0, 1), got ${tolerance}`);
  const maxIterations = options.maxIterations ?? 3000;
  if (!Number.isInteger(maxIterations) || maxIterations < 1) throw new RangeError(`maxIterations must be an integer ≥ 1, got ${maxIterations}`);
  const requested = options.windowSize ?? Math.max(16, 2 * states + 10);
  if (!Number.isInteger(requested) || requested < Math.min(states + 2, free)) {
    throw new RangeError(`windowSize must be an integer ≥ states + 2 (${states + 2}), got ${requested}`);
  }
  const windowSize = Math.min(requested, free);
  const seed = options.seed ?? 1;
  if (!Number.isInteger(seed)) throw new RangeError(`seed must be an integer, got ${seed}`);
  const restartKeep = Math.min(windowSize - 1, options.restartKeep ?? Math.max(states + 1, states + Math.floor((windowSize - states) / 4)));
  if (!Number.isInteger(restartKeep) || restartKeep < Math.min(states + 1, windowSize - 1)) {
    throw new RangeError(`restartKeep must be an integer in ${states + 1}..${windowSize - 1}, got ${restartKeep}`);
  }
  const startVector = options.startVector;
  if (startVector && startVector.length !== 2 * dimension) {
    throw new RangeError(`startVector has length ${startVector.length}, expected ${2 * dimension} (interleaved complex)`);
  }
  return { states, tolerance, maxIterations, windowSize, seed, startVector, restartKeep, locked };
}

/** Bytes of the vectors Lanczos allocates for a given dimension and window. */
export function estimateLanczosBytes(dimension: number, windowSize: number, states: number): number {
  const w = Math.min(windowSize, dimension);
  // window + 1 Lanczos vectors, the wanted Ritz vectors, a work vector, and (degeneracy check
  // in lowest-eigenpairs.ts) the probe's own Ritz vector and one vector of slack.
  return 16 * dimension * (w + 4 + states);
}

export function lanczos(
  matvec: (x: Float64Array, y: Float64Array) => void,
  dimension: number,
  options: LanczosOptions = {},
): LanczosResult {
  const opts = checkLanczosOptions(dimension, options);
  const { states: k, tolerance, maxIterations, seed } = opts;
  const m = opts.windowSize;
  const len = 2 * dimension;
  const normal = gaussian(mulberry32(seed));
  const randomVector = (v: Float64Array): void => {
    for (let q = 0; q < len; q++) v[q] = normal();
  };

  const V: Float64Array[] = [];
  const vector = (i: number): Float64Array => {
    while (V.length <= i) V.push(new Float64Array(len));
    return V[i];
  };
  const T = new Float64Array(m * m);
  const h = new Float64Array(2);
  const hRe = new Float64Array(m + 1);
  const hIm = new Float64Array(m + 1);
  const locked = opts.locked;
  const lRe = new Float64Array(locked.length);
  const lIm = new Float64Array(locked.length);
  const free = dimension - locked.length;

  /** Orthogonalizes w against V[0..count−1] (one classical Gram–Schmidt pass, repeated if the norm drops a lot). */
  const orthogonalize = (w: Float64Array, count: number): number => {
    let before = norm2(w);
    for (let pass = 0; pass < 3; pass++) {
      if (locked.length) projectOut(w, locked, locked.length, lRe, lIm);
      projectOut(w, V, count, hRe, hIm);
      const after = norm2(w);
      if (!Number.isFinite(after)) throw new Error('Lanczos: a vector became NaN or infinite (check the operator)');
      if (after > 0.7 * before) return after;
      before = after;
    }
    return before;
  };

  // Start vector.
  const v0 = vector(0);
  if (opts.startVector) v0.set(opts.startVector);
  else randomVector(v0);
  const startNorm = norm2(v0);
  if (!Number.isFinite(startNorm)) throw new Error('Lanczos: start vector contains NaN or infinite entries');
  let n0 = orthogonalize(v0, 0);
  if (n0 <= 1e-8 * startNorm || n0 === 0) {
    randomVector(v0);
    n0 = orthogonalize(v0, 0);
  }
  scale(v0, 1 / n0);

  let iterations = 0;
  let restarts = 0;
  let normEstimate = 0;
  let j = 0; // next column of T to fill
  let lastBeta = 0;
  let ritzValues: Float64Array;
  let ritzVectors: Float64Array;
  let size: number;

  for (;;) {
    // Extend the window.
    while (j < m && iterations < maxIterations) {
      const w = vector(j + 1);
      matvec(V[j], w);
      iterations++;
      // Local recurrence first (T column j above the diagonal is known), then full reorthogonalization.
      dotc(V[j], w, h);
      const alpha = h[0];
      if (!Number.isFinite(alpha)) throw new Error('Lanczos: H·v produced NaN or infinite entries (check the operator)');
      subtractScaled(w, V[j], alpha, 0);
      for (let i = 0; i < j; i++) {
        const tij = T[i * m + j];
        if (tij !== 0) subtractScaled(w, V[i], tij, 0);
      }
      let beta = orthogonalize(w, j + 1);
      T[j * m + j] = alpha;
      normEstimate = Math.max(normEstimate, Math.abs(alpha), beta);
      j++;
      if (beta <= 1e-13 * Math.max(normEstimate, 1e-300)) {
        // Invariant subspace: continue with a random vector orthogonal to the basis (coupling 0).
        if (j >= free) {
          lastBeta = 0;
          break;
        }
        randomVector(w);
        orthogonalize(w, j);
        beta = orthogonalize(w, j);
        scale(w, 1 / beta);
        lastBeta = 0;
        if (j < m) {
          T[(j - 1) * m + j] = 0;
          T[j * m + j - 1] = 0;
        }
        continue;
      }
      scale(w, 1 / beta);
      lastBeta = beta;
      if (j < m) {
        T[(j - 1) * m + j] = beta;
        T[j * m + j - 1] = beta;
      }
    }
    size = j;
    // Rayleigh–Ritz on the window.
    const sub = new Float64Array(size * size);
    for (let r = 0; r < size; r++) for (let c = 0; c < size; c++) sub[r * size + c] = T[r * m + c];
    const eig = denseSymmetricEigen(sub, size);
    ritzValues = eig.values;
    ritzVectors = eig.vectors;
    for (let i = 0; i < size; i++) normEstimate = Math.max(normEstimate, Math.abs(ritzValues[i]));
    const scaleH = Math.max(normEstimate, Number.MIN_VALUE);
    const want = Math.min(k, size);
    let done = size >= free || size >= k;
    for (let i = 0; i < want && done; i++) {
      const est = Math.abs(lastBeta * ritzVectors[(size - 1) * size + i]);
      if (est > tolerance * scaleH) done = false;
    }
    if (size < k) done = false;
    if (done || iterations >= maxIterations) break;

    // Thick restart: keep the lowest `keep` Ritz vectors, then the last Lanczos vector.
    const keep = Math.min(size - 1, opts.restartKeep);
    combineInPlace(V, size, ritzVectors, keep, len);
    const last = V[size];
    V[size] = V[keep];
    V[keep] = last;
    T.fill(0);
    for (let i = 0; i < keep; i++) {
      T[i * m + i] = ritzValues[i];
      const coupling = lastBeta * ritzVectors[(size - 1) * size + i];
      T[i * m + keep] = coupling;
      T[keep * m + i] = coupling;
    }
    j = keep;
    restarts++;
  }

  // Ritz vectors and explicit residuals.
  const want = Math.min(k, size);
  const vectors: Float64Array[] = [];
  for (let i = 0; i < want; i++) {
    const x = new Float64Array(len);
    for (let l = 0; l < size; l++) {
      const c = ritzVectors[l * size + i];
      if (c === 0) continue;
      const vl = V[l];
      for (let q = 0; q < len; q++) x[q] += c * vl[q];
    }
    const nx = norm2(x);
    scale(x, 1 / nx);
    vectors.push(x);
  }
  V.length = 0; // release the window before the residual check
  const values: number[] = [];
  const residuals: number[] = [];
  const work = new Float64Array(len);
  const rq = new Float64Array(2);
  for (let i = 0; i < want; i++) {
    const x = vectors[i];
    matvec(x, work);
    iterations++;
    dotc(x, work, rq);
    const theta = rq[0];
    subtractScaled(work, x, theta, 0);
    const r = norm2(work);
    if (!Number.isFinite(r) || !Number.isFinite(theta)) throw new Error('Lanczos: NaN in the final residual check');
    values.push(theta);
    residuals.push(r / Math.max(normEstimate, Number.MIN_VALUE));
  }
  const residual = residuals.reduce((a, b) => Math.max(a, b), 0);
  const converged = want === k && residual <= tolerance;
  return { values, vectors, converged, iterations, restarts, residuals, residual, normEstimate };
}

/** V[i] ← Σ_l V[l]·Y[l][i] for i < keep, in place, a block of components at a time (Y real, size×size). */
function combineInPlace(V: Float64Array[], size: number, Y: Float64Array, keep: number, len: number): void {
  const block = 2048;
  const tmp = new Float64Array(keep * block);
  for (let start = 0; start < len; start += block) {
    const end = Math.min(len, start + block);
    const b = end - start;
    tmp.fill(0, 0, keep * b);
    for (let l = 0; l < size; l++) {
      const vl = V[l];
      for (let i = 0; i < keep; i++) {
        const c = Y[l * size + i];
        if (c === 0) continue;
        const off = i * b;
        for (let q = 0; q < b; q++) tmp[off + q] += c * vl[start + q];
      }
    }
    for (let i = 0; i < keep; i++) V[i].set(tmp.subarray(i * b, i * b + b), start);
  }
}
