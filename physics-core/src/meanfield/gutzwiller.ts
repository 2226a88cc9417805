/**
 * Gutzwiller mean-field solver for hardcore bosons: product states ⊗_i (cos(a_i/2)|0⟩ +
 * e^{i b_i} sin(a_i/2)|1⟩) periodic on a supercell (see supercell-model.ts for how the model is
 * mapped onto the supercell and how images are treated), minimised by L-BFGS from several
 * starts.
 *
 * Ensemble. Product states do not conserve N. At a fixed chemical potential (`mu`) we minimise
 * Ω = E − μ⟨N⟩. For a filling we search μ so that the lowest Ω state has mean density equal to the
 * filling (secant steps inside a bracket). Inside a first-order region of mean-field theory the
 * density jumps across the filling at some μ: no homogeneous state has that density, the true
 * mean-field answer is phase separation, and the solver reports the state on the nearer side
 * of the jump with a warning.
 *
 * Starts: the warm start (if given), the uniform state, density waves and phase windings for
 * every ordering vector the supercell allows, a sublattice-staggered phase pattern, then seeded
 * random states. Starts are chained along the μ search (each continues from its own previous
 * minimum). The result counts how many starts end within `energyTolerance` of the lowest.
 */
import { PhasewrightError } from '../errors.js';
import { evaluateConstant } from '../model/expressions.js';
import { compileOnSupercellCluster } from './cluster.js';
import type { CompiledModel, ModelSpec } from '../model/types.js';
import type { Result } from '../result.js';
import { mulberry32 } from '../util/random.js';
import { supercellEnergy } from './energy.js';
import { lbfgs, type LbfgsOptions } from './lbfgs.js';
import { hardcoreSiteSpace, type SiteSpace } from './site-space.js';
import { reciprocal, supercellMomenta, type Supercell, type SupercellSpec } from './supercell.js';
import { buildSupercellModel, type SupercellModel } from './supercell-model.js';
import { parameterValues, reweightSupercellModel, termEvaluators, type TermEvaluators } from './reweight.js';
import { meanFieldObservables } from './observables.js';
import { classifyPoint } from '../classify/phases.js';
import { CORE_VERSION } from '../index.js';

export interface MeanFieldOptions {
  /** Supercell in unit cells: counts per axis, integer vectors, or 'sqrt3'. @default one unit cell */
  supercell?: SupercellSpec;
  /** Fixed chemical potential (grand-canonical). When absent, the spec's filling is matched. */
  mu?: number;
  /** Total number of starts (patterns first, at least a quarter seeded random). @default 8 */
  starts?: number;
  /** Seed of the random starts. @default 1 */
  seed?: number;
  /** Tolerance on the mean density when matching the filling. @default 1e-7 */
  densityTolerance?: number;
  /** Starts whose Ω per site is within this of the lowest count as reaching the minimum. @default 1e-6 */
  energyTolerance?: number;
  /**
   * Warn when fewer than this fraction of starts reach the minimum. @default 0.25
   * (a rule of thumb, common practice: one start in four should find the same state).
   */
  minimumFraction?: number;
  /** Smallest length (unit cells per axis) of the periodic cluster the model is compiled on. @default 7 */
  clusterCells?: number;
  /** Options of the L-BFGS minimiser. @default { gradientTolerance: 1e-9, maxIterations: 400 } */
  lbfgs?: LbfgsOptions;
  /** Previous solution on the same supercell (e.g. the neighbouring point of a sweep). */
  warm?: MeanFieldWarmStart;
}

/** A mean-field solution as a warm start: site parameters (a, b per site) and μ. */
export interface MeanFieldWarmStart {
  params: number[];
  mu?: number;
}

export interface MeanFieldSolution {
  result: Result;
  /** Feed to `options.warm` of the next point. */
  warm: MeanFieldWarmStart;
}

interface Resolved {
  supercell?: SupercellSpec;
  mu?: number;
  starts: number;
  seed: number;
  densityTolerance: number;
  energyTolerance: number;
  minimumFraction: number;
  clusterCells: number;
  lbfgs: LbfgsOptions;
  warm?: MeanFieldWarmStart;
}

export function checkMeanFieldOptions(options: MeanFieldOptions = {}): Resolved {
  const o: Resolved = {
    supercell: options.supercell,
    mu: options.mu,
    starts: options.starts ?? 8,
    seed: options.seed ?? 1,
    densityTolerance: options.densityTolerance ?? 1e-7,
    energyTolerance: options.energyTolerance ?? 1e-6,
    minimumFraction: options.minimumFraction ?? 0.25,
    clusterCells: options.clusterCells ?? 7,
    lbfgs: { gradientTolerance: 1e-9, maxIterations: 400, ...options.lbfgs },
    warm: options.warm,
  };
  const bad = (field: string, why: string, value: unknown): never => {
    throw new PhasewrightError(`${why} (got ${JSON.stringify(value)})`, 'options', `$.solver.${field}`);
  };
  if (o.mu !== undefined && !Number.isFinite(o.mu)) bad('mu', 'must be a finite number', o.mu);
  if (!Number.isInteger(o.starts) || o.starts < 1 || o.starts > 1000) bad('starts', 'must be an integer from 1 to 1000', o.starts);
  if (!Number.isInteger(o.seed)) bad('seed', 'must be an integer', o.seed);
  if (!(o.densityTolerance > 0)) bad('densityTolerance', 'must be > 0', o.densityTolerance);
  if (!(o.energyTolerance > 0)) bad('energyTolerance', 'must be > 0', o.energyTolerance);
  if (!(o.minimumFraction >= 0 && o.minimumFraction <= 1)) bad('minimumFraction', 'must be in [0, 1]', o.minimumFraction);
  if (!Number.isInteger(o.clusterCells) || o.clusterCells < 3 || o.clusterCells > 64) bad('clusterCells', 'must be an integer from 3 to 64', o.clusterCells);
  if (o.warm !== undefined && (!Array.isArray(o.warm.params) || o.warm.params.some((x) => !Number.isFinite(x)))) {
    bad('warm.params', 'must be a list of finite numbers', '…');
  }
  return o;
}

/** The model prepared for mean-field: supercell operator entries, target filling, twist. */
export interface MeanFieldProblem {
  model: SupercellModel;
  supercell: Supercell;
  /** Target mean density (sites of the user's cluster), or null when μ is fixed. */
  filling: number;
  /** Sites of the user's lattice (the spec's size): totals in the result are per site × this. */
  clusterSites: number;
  /** Phase per unit-cell step along each axis (from the spec's twist). */
  twistPerCell: number[];
  /**
   * The periodic cluster the supercell was cut from. Cached per model structure: use it for
   * geometry only — its entry values belong to the first parameter values seen.
   */
  compiled: CompiledModel;
  warnings: string[];
  /** Allowed ordering vectors of the supercell (Cartesian). */
  momenta: number[][];
  /** Momenta at which S(q) is reported (see structureMomenta). */
  structureMomenta: number[][];
}

/**
 * Compiles `spec` (with parameter `overrides`) on a periodic cluster that is a multiple of the
 * supercell and at least `clusterCells` long per axis, and reduces it to the supercell.
 */
export function prepareMeanField(spec: ModelSpec, options: MeanFieldOptions = {}, overrides: Record<string, number> = {}): MeanFieldProblem {
  const o = checkMeanFieldOptions(options);
  const structure = cachedStructure(spec, o, overrides);
  const values = parameterValues(spec, overrides);
  const dim = structure.supercell.dim;
  const userSize = spec.lattice.size;
  const twist = (spec.lattice.twist ?? []).map((t, a) => evaluateConstant(t, values, `$.lattice.twist[${a}]`));
  const twistPerCell = new Array<number>(dim).fill(0).map((_, a) => (spec.lattice.boundary[a] === 'periodic' ? (twist[a] ?? 0) / userSize[a] : 0));
  const model = reweightSupercellModel(structure.model, structure.compiled, structure.evaluators.build(values), twistPerCell);
  const warnings = [...structure.warnings];
  if (spec.lattice.boundary.some((b) => b === 'open')) {
    warnings.push('open boundaries are ignored by mean-field: the product state is periodic on the supercell of an infinite lattice');
  }
  const nUser = userSize.reduce((p, q) => p * q, 1) * structure.compiled.lattice.basis.length;
  const particles = spec.particles;
  const filling = particles.count !== undefined ? particles.count / nUser : (particles.filling ?? 0);
  return {
    model,
    supercell: structure.supercell,
    filling,
    clusterSites: nUser,
    twistPerCell,
    compiled: structure.compiled,
    warnings,
    momenta: structure.momenta,
    structureMomenta: structure.structureMomenta,
  };
}

interface Structure {
  compiled: CompiledModel;
  supercell: Supercell;
  model: SupercellModel;
  evaluators: TermEvaluators;
  momenta: number[][];
  structureMomenta: number[][];
  warnings: string[];
}

/** Structures (cluster geometry, entry selection, compiled expressions) by what they depend on. */
const structures = new Map<string, Structure>();
const MAX_STRUCTURES = 16;

function cachedStructure(spec: ModelSpec, o: Resolved, overrides: Record<string, number>): Structure {
  const key = JSON.stringify([spec.lattice.kind, spec.lattice.custom ?? null, spec.lattice.size, spec.particles, spec.terms, Object.keys(spec.parameters), o.supercell ?? null, o.clusterCells]);
  const hit = structures.get(key);
  if (hit) {
    structures.delete(key);
    structures.set(key, hit);
    return hit;
  }
  const { compiled, supercell } = compileOnSupercellCluster(spec, o.supercell, o.clusterCells, overrides);
  const translations = compiled.lattice.translations;
  const model = buildSupercellModel(compiled, supercell, new Array<number>(supercell.dim).fill(0));
  const warnings: string[] = [];
  const periodic = checkPeriodicity(compiled, model);
  if (periodic) warnings.push(periodic);
  const structure: Structure = {
    compiled,
    supercell,
    model,
    evaluators: termEvaluators(spec),
    momenta: supercellMomenta(supercell, translations),
    structureMomenta: structureMomenta(supercell, translations, compiled.lattice.basis.length),
    warnings,
  };
  structures.set(key, structure);
  if (structures.size > MAX_STRUCTURES) structures.delete(structures.keys().next().value as string);
  return structure;
}

/**
 * Momenta for S(q): the supercell's allowed momenta, and with a multi-site basis also their
 * images shifted by the first reciprocal vectors (sublattice order, e.g. the honeycomb
 * charge-density wave, appears only there).
 */
function structureMomenta(supercell: Supercell, translations: number[][], nBasis: number): number[][] {
  const base = supercellMomenta(supercell, translations);
  if (nBasis === 1) return base;
  const G = reciprocal(translations);
  const shifts = G.length === 1 ? [[-1], [0], [1]] : [-1, 0, 1].flatMap((a) => [-1, 0, 1].map((b) => [a, b]));
  const out: number[][] = [];
  for (const sh of shifts) {
    for (const q of base) {
      out.push([q[0] + sh.reduce((s, c, a) => s + c * G[a][0], 0), q[1] + sh.reduce((s, c, a) => s + c * G[a][1], 0)]);
    }
  }
  return out;
}

/** Returns a warning when the compiled entries are not periodic under the supercell translations. */
function checkPeriodicity(compiled: CompiledModel, model: SupercellModel): string | undefined {
  // Compare per-supercell sums of |amplitude| and of values by kind: a cheap necessary check.
  const copies = compiled.nSites / model.nSites;
  let total = 0;
  let home = 0;
  for (const t of compiled.terms) {
    if (t.kind === 'hop' || t.kind === 'conditional-hop') for (const e of t.entries) total += Math.hypot(e.re, e.im);
    else if (t.kind === 'interaction') for (const e of t.entries) total += Math.abs(e.value);
    else for (const e of t.entries) total += Math.abs(e.value);
  }
  for (let k = 0; k < model.hop.re.length; k++) home += Math.hypot(model.hop.re[k], model.hop.im[k]);
  for (let k = 0; k < model.cond.re.length; k++) home += Math.hypot(model.cond.re[k], model.cond.im[k]);
  for (const v of model.inter.value) home += Math.abs(v);
  for (const v of model.onsite) home += Math.abs(v);
  if (Math.abs(total - copies * home) > 1e-9 * Math.max(1, total)) {
    return 'the model is not periodic under the supercell translations (position-dependent terms?): the ansatz uses the entries of the home supercell';
  }
  return undefined;
}

/** Solves the mean-field problem for `spec` with parameter `overrides`. */
export function solveMeanField(spec: ModelSpec, options: MeanFieldOptions = {}, overrides: Record<string, number> = {}): MeanFieldSolution {
  const t0 = now();
  const o = checkMeanFieldOptions(options);
  const problem = prepareMeanField(spec, options, overrides);
  const t1 = now();
  const out = minimiseProblem(problem, o);
  const result = meanFieldObservables(problem, out, {
    buildMs: t1 - t0,
    solveMs: now() - t1,
  });
  result.label = classifyPoint(result).label;
  result.provenance.version = CORE_VERSION;
  return { result, warm: { params: Array.from(out.params), mu: out.mu } };
}

/** What the minimisation returns to the observables stage. */
export interface MinimiseOutcome {
  params: Float64Array;
  mu: number;
  grandPotential: number;
  converged: boolean;
  iterations: number;
  gradientNorm: number;
  startsAtMinimum: number;
  starts: number;
  /** Labels of the starts that reached the minimum (e.g. `uniform`, `dw:1`, `random:3`). */
  winners: string[];
  warnings: string[];
  /** μ evaluations of the filling search (0 at fixed μ). */
  muSteps: number;
}

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

interface Candidate {
  label: string;
  origin: Float64Array;
  x: Float64Array;
  omega: number;
  density: number;
  converged: boolean;
  iterations: number;
  gradientNorm: number;
}

/** Start states (see the module comment). */
function startStates(problem: MeanFieldProblem, o: Resolved, space: SiteSpace = hardcoreSiteSpace): { label: string; x: Float64Array }[] {
  const { model } = problem;
  const n = model.nSites;
  const np = space.paramsPerSite * n;
  const rand = mulberry32(o.seed);
  const fill = o.mu === undefined ? Math.min(0.95, Math.max(0.05, problem.filling)) : 0.5;
  const amp = 0.9 * Math.min(fill, 1 - fill);
  const make = (density: (s: number) => number, phase: (s: number) => number): Float64Array => {
    const x = new Float64Array(np);
    for (let s = 0; s < n; s++) space.fromDensityPhase(density(s), phase(s), x, s);
    // A small seeded perturbation keeps starts off symmetric saddle points.
    for (let k = 0; k < np; k++) x[k] += 1e-3 * (rand() - 0.5);
    return x;
  };
  const patterns: { label: string; x: Float64Array }[] = [];
  if (o.warm) {
    if (o.warm.params.length !== np) {
      throw new PhasewrightError(`has ${o.warm.params.length} parameters; this supercell needs ${np}`, 'options', '$.solver.warm.params');
    }
    patterns.push({ label: 'warm', x: Float64Array.from(o.warm.params) });
  }
  patterns.push({ label: 'uniform', x: make(() => fill, () => 0) });
  const qs = problem.momenta.filter((q) => Math.hypot(q[0], q[1]) > 1e-9);
  const dot = (q: number[], s: number): number => q[0] * model.sites[s].x + q[1] * model.sites[s].y;
  qs.forEach((q, k) => {
    patterns.push({ label: `density-wave:${k}`, x: make((s) => fill + amp * Math.cos(dot(q, s)), () => 0) });
    patterns.push({ label: `winding:${k}`, x: make(() => fill, (s) => dot(q, s)) });
  });
  if (model.sites.some((s) => s.sublattice % 2 === 1)) {
    patterns.push({ label: 'staggered', x: make(() => fill, (s) => Math.PI * (model.sites[s].sublattice % 2)) });
  }
  // The warm start is always kept; at least a quarter of the starts are random.
  const nRandom = Math.max(o.starts - patterns.length, Math.ceil(o.starts / 4));
  const warmFirst = o.warm ? 1 : 0;
  const kept = patterns.slice(0, Math.max(warmFirst, o.starts - nRandom));
  const out = [...kept];
  for (let r = 0; out.length < o.starts; r++) {
    const x = new Float64Array(np);
    for (let s = 0; s < n; s++) space.fromDensityPhase(0.05 + 0.9 * rand(), 2 * Math.PI * rand() - Math.PI, x, s);
    out.push({ label: `random:${r}`, x });
  }
  return out;
}

/** Minimises a prepared problem (all starts; μ search unless `options.mu` is set). */
export function minimiseMeanField(problem: MeanFieldProblem, options: MeanFieldOptions = {}): MinimiseOutcome {
  return minimiseProblem(problem, checkMeanFieldOptions(options));
}

function minimiseProblem(problem: MeanFieldProblem, o: Resolved, space: SiteSpace = hardcoreSiteSpace): MinimiseOutcome {
  const { model } = problem;
  const n = model.nSites;
  const moments = new Float64Array(space.momentsPerSite * n);
  const dm = new Float64Array(space.momentsPerSite * n);
  let mu = 0;
  const objective = (x: Float64Array, g: Float64Array): number => {
    space.moments(x, moments, n);
    const e = supercellEnergy(model, moments, mu, dm);
    space.pullback(x, dm, g, n);
    return e;
  };
  const densityOf = (x: Float64Array): number => {
    space.moments(x, moments, n);
    let s = 0;
    for (let i = 0; i < n; i++) s += moments[space.momentsPerSite * i];
    return s / n;
  };
  const starts = startStates(problem, o, space);
  const candidates: Candidate[] = starts.map((s) => ({
    label: s.label, origin: s.x, x: Float64Array.from(s.x), omega: Infinity, density: 0, converged: false, iterations: 0, gradientNorm: Infinity,
  }));
  let totalIterations = 0;
  const runOne = (c: Candidate, muValue: number): Candidate => {
    mu = muValue;
    if (isPolarised(c.x, space, n)) c.x.set(c.origin);
    const r = lbfgs(objective, c.x, o.lbfgs);
    c.x.set(r.x);
    c.omega = r.f;
    c.density = densityOf(r.x);
    c.converged = r.converged;
    c.iterations = r.iterations;
    c.gradientNorm = r.gradientNorm;
    totalIterations += r.iterations;
    return c;
  };
  const runAll = (muValue: number): Candidate => {
    let best = candidates[0];
    for (const c of candidates) {
      runOne(c, muValue);
      if (c.omega < best.omega) best = c;
    }
    return best;
  };
  const warnings: string[] = [];
  let best: Candidate;
  let muSteps = 0;
  if (o.mu !== undefined) {
    best = runAll(o.mu);
  } else {
    const f = problem.filling;
    const bound = couplingBound(model);
    if (f <= 0 || f >= 1) {
      best = runAll(f <= 0 ? -bound : bound);
    } else {
      // Follow the lowest start alone through the μ search, then check all starts at the μ found;
      // if another start is lower there, follow it instead. Fall back to searching with all
      // starts at every μ when that does not settle (first-order jumps).
      const tolOmega = o.energyTolerance * n;
      let muNow = o.warm?.mu ?? uniformMuGuess(model, f);
      if (!(Math.abs(muNow) < bound)) muNow = 0;
      // With a warm start (the previous point of a sweep) follow it first; every start is still
      // compared at the μ found.
      let champion = o.warm ? runOne(candidates[0], muNow) : runAll(muNow);
      muSteps = 1;
      let settled: Candidate | undefined;
      for (let round = 0; round < 3 && !settled; round++) {
        const follow = champion;
        const search = findMu((m) => runOne(follow, m), f, o, problem, bound, mu);
        muSteps += search.steps;
        if (search.warning) break;
        const atMu = mu;
        const lowest = runAll(atMu);
        muSteps++;
        if (lowest === follow || lowest.omega >= follow.omega - tolOmega) settled = follow;
        else champion = lowest;
      }
      if (settled) {
        best = settled;
      } else {
        const search = findMu(runAll, f, o, problem, bound, mu);
        best = search.best;
        muSteps += search.steps;
        if (search.warning) warnings.push(search.warning);
      }
    }
  }
  const tol = o.energyTolerance * n;
  const winners = candidates.filter((c) => c.omega - best.omega <= tol * Math.max(1, Math.abs(best.omega) / n));
  const converged = best.converged;
  if (!converged) warnings.push(`the lowest state did not converge (gradient ${best.gradientNorm.toExponential(2)})`);
  if (winners.length < o.minimumFraction * candidates.length || (winners.length === 1 && candidates.length > 1)) {
    warnings.push(`only ${winners.length} of ${candidates.length} starts reached the lowest state: the minimum may not be global; add starts or try other supercells`);
  }
  return {
    params: Float64Array.from(best.x),
    mu,
    grandPotential: best.omega,
    converged,
    iterations: totalIterations,
    gradientNorm: best.gradientNorm,
    startsAtMinimum: winners.length,
    starts: candidates.length,
    winners: winners.map((c) => c.label),
    warnings,
    muSteps,
  };
}

/** True when every site is (numerically) empty or full: a stationary point starts cannot leave. */
function isPolarised(x: Float64Array, space: SiteSpace, n: number): boolean {
  const m = new Float64Array(space.momentsPerSite * n);
  space.moments(x, m, n);
  for (let i = 0; i < n; i++) {
    const d = m[space.momentsPerSite * i];
    if (d > 1e-8 && d < 1 - 1e-8) return false;
  }
  return true;
}

/** Σ|couplings| per supercell: beyond ±this μ the empty or the full state is the minimum. */
function couplingBound(model: SupercellModel): number {
  let b = 1;
  for (let k = 0; k < model.hop.re.length; k++) b += 2 * Math.hypot(model.hop.re[k], model.hop.im[k]);
  for (let k = 0; k < model.cond.re.length; k++) b += 2 * Math.hypot(model.cond.re[k], model.cond.im[k]);
  for (const v of model.inter.value) b += Math.abs(v);
  for (const v of model.onsite) b += Math.abs(v);
  return b;
}

/** μ of the uniform state with density f (dΩ/dn = 0 for the uniform real-β ansatz). */
function uniformMuGuess(model: SupercellModel, f: number): number {
  // E_uniform(n) = Σ_hop 2 Re t · n(1−n) + Σ_cond 2 Re t · n(1−n)(α + γ n) + Σ V n² + Σ ε n
  let dE = 0;
  const d1 = 1 - 2 * f;
  for (let k = 0; k < model.hop.re.length; k++) dE += 2 * model.hop.re[k] * d1;
  for (let k = 0; k < model.cond.re.length; k++) {
    const a = model.cond.alpha[k];
    const g = model.cond.gamma[k];
    // d/dn [n(1−n)(a + g n)] = (1−2n)(a + g n) + g n(1−n)
    dE += 2 * model.cond.re[k] * (d1 * (a + g * f) + g * f * (1 - f));
  }
  for (const v of model.inter.value) dE += 2 * v * f;
  for (const v of model.onsite) dE += v;
  return dE / model.nSites;
}

function findMu(
  runAll: (mu: number) => Candidate,
  f: number,
  o: Resolved,
  problem: MeanFieldProblem,
  bound: number,
  mu0: number,
): { best: Candidate; steps: number; warning?: string } {
  const tolN = o.densityTolerance;
  const scale = Math.max(1e-3, bound / problem.model.nSites);
  const tolMu = 1e-12 * scale;
  let lo = -bound; // density(lo) ≤ f
  let hi = bound; // density(hi) ≥ f
  let gLo = -f;
  let gHi = 1 - f;
  let loState: { best: Candidate; x: Float64Array; mu: number; density: number } | undefined;
  let hiState: { best: Candidate; x: Float64Array; mu: number; density: number } | undefined;
  let steps = 0;
  let mu = mu0;
  if (!(mu > lo && mu < hi)) mu = 0;
  let prev: { mu: number; g: number } | undefined;
  let step = 0.05 * scale;
  let side = 0; // Illinois: which end was kept last
  for (let iter = 0; iter < 100; iter++) {
    const best = runAll(mu);
    steps++;
    const g = best.density - f;
    if (Math.abs(g) <= tolN) return { best, steps };
    const snap = { best, x: Float64Array.from(best.x), mu, density: best.density };
    if (g < 0) {
      lo = mu;
      gLo = g;
      loState = snap;
      if (side === -1) gHi /= 2;
      side = -1;
    } else {
      hi = mu;
      gHi = g;
      hiState = snap;
      if (side === 1) gLo /= 2;
      side = 1;
    }
    if (hi - lo <= tolMu * Math.max(1, Math.abs(mu))) break;
    let next: number;
    const bracketed = loState !== undefined && hiState !== undefined;
    if (!bracketed) {
      // Walk from the first probe towards the target, doubling the step, until bracketed.
      if (prev && prev.g !== g && Math.sign(prev.g) === Math.sign(g)) {
        const secant = mu - (g * (mu - prev.mu)) / (g - prev.g);
        next = Number.isFinite(secant) && Math.abs(secant - mu) < 4 * step ? secant : mu - Math.sign(g) * step;
      } else {
        next = mu - Math.sign(g) * step;
      }
      step *= 2;
    } else {
      next = lo - (gLo * (hi - lo)) / (gHi - gLo);
    }
    if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
    prev = { mu, g };
    mu = next;
  }
  // The density jumps across the filling: first-order transition in μ (phase separation).
  const pick = loState && hiState ? (Math.abs(loState.density - f) <= Math.abs(hiState.density - f) ? loState : hiState) : (loState ?? hiState)!;
  const final = runAll(pick.mu);
  const dLo = loState?.density ?? 0;
  const dHi = hiState?.density ?? 1;
  return {
    best: final,
    steps: steps + 1,
    warning: `the mean density jumps from ${dLo.toFixed(4)} to ${dHi.toFixed(4)} at μ ≈ ${pick.mu.toPrecision(6)}, across the filling ${f}: mean-field predicts phase separation here (first-order region); the reported state has density ${final.density.toFixed(4)}`,
  };
}
