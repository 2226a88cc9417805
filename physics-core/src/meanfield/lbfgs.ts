/**
 * Limited-memory BFGS minimiser (Nocedal & Wright, Numerical Optimization, 2nd ed. 2006,
 * Algorithm 7.4 two-loop recursion, Algorithms 3.5/3.6 strong-Wolfe line search with zoom).
 * Unconstrained, dense Float64Array variables. Throws on a non-finite objective or gradient
 * instead of silently stopping.
 */
import { PhasewrightError } from '../errors.js';

/**
 * Objective: writes the gradient into `grad` and returns the value at `x`.
 * It must not keep references to `x` or `grad`.
 */
export type Objective = (x: Float64Array, grad: Float64Array) => number;

export interface LbfgsOptions {
  /** Number of stored correction pairs. @default 8 */
  memory?: number;
  /** Stop when the largest gradient component is below this. @default 1e-8 */
  gradientTolerance?: number;
  /** Stop when the relative decrease of f in one step is below this. @default 1e-14 */
  valueTolerance?: number;
  /** Maximum number of iterations. @default 500 */
  maxIterations?: number;
  /** Sufficient-decrease constant of the Wolfe conditions. @default 1e-4 */
  c1?: number;
  /** Curvature constant of the strong Wolfe conditions. @default 0.9 */
  c2?: number;
  /** Maximum function evaluations per line search. @default 30 */
  maxLineSearch?: number;
}

export interface LbfgsResult {
  x: Float64Array;
  f: number;
  /** Largest absolute gradient component at `x`. */
  gradientNorm: number;
  iterations: number;
  evaluations: number;
  converged: boolean;
  /** Why it stopped: `gradient`, `value` (no further decrease possible), `iterations`, `line-search`. */
  reason: 'gradient' | 'value' | 'iterations' | 'line-search';
}

type ResolvedOptions = Required<LbfgsOptions>;

/** Resolves defaults and rejects nonsensical option values. */
export function checkLbfgsOptions(options: LbfgsOptions = {}): ResolvedOptions {
  const o: ResolvedOptions = {
    memory: options.memory ?? 8,
    gradientTolerance: options.gradientTolerance ?? 1e-8,
    valueTolerance: options.valueTolerance ?? 1e-14,
    maxIterations: options.maxIterations ?? 500,
    c1: options.c1 ?? 1e-4,
    c2: options.c2 ?? 0.9,
    maxLineSearch: options.maxLineSearch ?? 30,
  };
  const bad = (field: string, why: string): never => {
    throw new PhasewrightError(`${why} (got ${String(o[field as keyof ResolvedOptions])})`, 'options', `lbfgs.${field}`);
  };
  if (!Number.isInteger(o.memory) || o.memory < 1) bad('memory', 'must be an integer ≥ 1');
  if (!(o.gradientTolerance > 0)) bad('gradientTolerance', 'must be > 0');
  if (!(o.valueTolerance >= 0)) bad('valueTolerance', 'must be ≥ 0');
  if (!Number.isInteger(o.maxIterations) || o.maxIterations < 0) bad('maxIterations', 'must be an integer ≥ 0');
  if (!(o.c1 > 0 && o.c1 < o.c2 && o.c2 < 1)) bad('c1', 'need 0 < c1 < c2 < 1');
  if (!Number.isInteger(o.maxLineSearch) || o.maxLineSearch < 1) bad('maxLineSearch', 'must be an integer ≥ 1');
  return o;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

function maxAbs(a: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) {
    const v = Math.abs(a[i]);
    if (v > m) m = v;
  }
  return m;
}

function assertFinite(f: number, g: Float64Array, where: string): void {
  let ok = Number.isFinite(f);
  for (let i = 0; ok && i < g.length; i++) ok = Number.isFinite(g[i]);
  if (!ok) {
    throw new PhasewrightError(`objective or gradient is not finite ${where}`, 'convergence', 'lbfgs');
  }
}

/** Minimises `fn` from `x0` (not modified). */
export function lbfgs(fn: Objective, x0: ArrayLike<number>, options: LbfgsOptions = {}): LbfgsResult {
  const o = checkLbfgsOptions(options);
  const n = x0.length;
  const x = Float64Array.from(x0);
  const g = new Float64Array(n);
  let f = fn(x, g);
  let evaluations = 1;
  assertFinite(f, g, 'at the starting point');

  const m = o.memory;
  const S = new Float64Array(m * n);
  const Y = new Float64Array(m * n);
  const rho = new Float64Array(m);
  const alpha = new Float64Array(m);
  let stored = 0;
  let head = 0; // next slot to write

  const d = new Float64Array(n);
  const xt = new Float64Array(n);
  const gt = new Float64Array(n);
  let iterations = 0;
  let gnorm = maxAbs(g);
  if (gnorm < o.gradientTolerance) {
    return { x, f, gradientNorm: gnorm, iterations, evaluations, converged: true, reason: 'gradient' };
  }

  while (iterations < o.maxIterations) {
    // Two-loop recursion: d = −H·g.
    for (let i = 0; i < n; i++) d[i] = -g[i];
    for (let k = 0; k < stored; k++) {
      const slot = (head - 1 - k + m) % m;
      let a = 0;
      for (let i = 0; i < n; i++) a += S[slot * n + i] * d[i];
      a *= rho[slot];
      alpha[slot] = a;
      for (let i = 0; i < n; i++) d[i] -= a * Y[slot * n + i];
    }
    if (stored > 0) {
      const last = (head - 1 + m) % m;
      let sy = 0;
      let yy = 0;
      for (let i = 0; i < n; i++) {
        sy += S[last * n + i] * Y[last * n + i];
        yy += Y[last * n + i] * Y[last * n + i];
      }
      const gamma = sy / yy;
      for (let i = 0; i < n; i++) d[i] *= gamma;
    } else {
      // First step: scale so the trial step has unit length at most.
      const s = 1 / Math.max(1, Math.sqrt(dot(g, g)));
      for (let i = 0; i < n; i++) d[i] *= s;
    }
    for (let k = stored - 1; k >= 0; k--) {
      const slot = (head - 1 - k + m) % m;
      let b = 0;
      for (let i = 0; i < n; i++) b += Y[slot * n + i] * d[i];
      b *= rho[slot];
      const c = alpha[slot] - b;
      for (let i = 0; i < n; i++) d[i] += c * S[slot * n + i];
    }
    let dg = dot(d, g);
    if (!(dg < 0)) {
      // Not a descent direction (curvature information went stale): restart from steepest descent.
      stored = 0;
      const s = 1 / Math.max(1, Math.sqrt(dot(g, g)));
      for (let i = 0; i < n; i++) d[i] = -g[i] * s;
      dg = dot(d, g);
    }

    // Strong-Wolfe line search (Nocedal & Wright Alg. 3.5 with zoom, Alg. 3.6).
    const f0 = f;
    let fLast = f0;
    const phi = (t: number): [number, number] => {
      for (let i = 0; i < n; i++) xt[i] = x[i] + t * d[i];
      const ft = fn(xt, gt);
      fLast = ft;
      evaluations++;
      assertFinite(ft, gt, `in the line search (step ${t})`);
      return [ft, dot(gt, d)];
    };
    let accepted = false;
    let tPrev = 0;
    let fPrev = f0;
    let dPrev = dg;
    let t = 1;
    let evals = 0;
    let acceptedT = 0;
    const zoom = (lo: number, flo: number, dlo: number, hi: number, fhi: number): boolean => {
      for (; evals < o.maxLineSearch; evals++) {
        // Safeguarded quadratic interpolation in [lo, hi] using f(lo), f'(lo), f(hi).
        const width = hi - lo;
        let tj = lo - (dlo * width * width) / (2 * (fhi - flo - dlo * width));
        const a = Math.min(lo, hi);
        const b = Math.max(lo, hi);
        if (!(tj > a + 0.1 * (b - a) && tj < b - 0.1 * (b - a))) tj = 0.5 * (lo + hi);
        const [fj, dj] = phi(tj);
        if (fj > f0 + o.c1 * tj * dg || fj >= flo) {
          hi = tj;
          fhi = fj;
        } else {
          if (Math.abs(dj) <= -o.c2 * dg) {
            acceptedT = tj;
            return true;
          }
          if (dj * (hi - lo) >= 0) {
            hi = lo;
            fhi = flo;
          }
          lo = tj;
          flo = fj;
          dlo = dj;
        }
        if (Math.abs(hi - lo) < 1e-16 * Math.max(1, Math.abs(lo))) break;
      }
      // Accept the best Armijo point found, if any.
      if (lo > 0 && flo < f0) {
        phi(lo);
        acceptedT = lo;
        return true;
      }
      return false;
    };
    for (; evals < o.maxLineSearch; evals++) {
      const [ft, dt] = phi(t);
      if (ft > f0 + o.c1 * t * dg || (evals > 0 && ft >= fPrev)) {
        evals++;
        accepted = zoom(tPrev, fPrev, dPrev, t, ft);
        break;
      }
      if (Math.abs(dt) <= -o.c2 * dg) {
        accepted = true;
        acceptedT = t;
        break;
      }
      if (dt >= 0) {
        evals++;
        accepted = zoom(t, ft, dt, tPrev, fPrev);
        break;
      }
      tPrev = t;
      fPrev = ft;
      dPrev = dt;
      t *= 2;
    }
    if (!accepted) {
      gnorm = maxAbs(g);
      if (gnorm < o.gradientTolerance) {
        return { x, f, gradientNorm: gnorm, iterations, evaluations, converged: true, reason: 'gradient' };
      }
      // The predicted decrease of a full step is below the rounding of f: nothing left to gain.
      const stuck = -dg <= 1e-13 * Math.max(1, Math.abs(f));
      return { x, f, gradientNorm: gnorm, iterations, evaluations, converged: stuck, reason: stuck ? 'value' : 'line-search' };
    }
    // xt/gt hold the accepted point (phi was last called at acceptedT).
    iterations++;
    const slot = head;
    let sy = 0;
    for (let i = 0; i < n; i++) {
      const s = acceptedT * d[i];
      const y = gt[i] - g[i];
      S[slot * n + i] = s;
      Y[slot * n + i] = y;
      sy += s * y;
    }
    const fNew = fLast;
    if (sy > 1e-300) {
      rho[slot] = 1 / sy;
      head = (head + 1) % m;
      if (stored < m) stored++;
    }
    x.set(xt);
    g.set(gt);
    const decrease = f - fNew;
    f = fNew;
    gnorm = maxAbs(g);
    if (gnorm < o.gradientTolerance) {
      return { x, f, gradientNorm: gnorm, iterations, evaluations, converged: true, reason: 'gradient' };
    }
    if (decrease <= o.valueTolerance * Math.max(1, Math.abs(f))) {
      return { x, f, gradientNorm: gnorm, iterations, evaluations, converged: true, reason: 'value' };
    }
  }
  return { x, f, gradientNorm: gnorm, iterations, evaluations, converged: false, reason: 'iterations' };
}
