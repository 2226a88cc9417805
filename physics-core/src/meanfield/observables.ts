/**
 * Observables of a Gutzwiller product state on its supercell → Result v1 (method 'meanfield').
 *
 * - sites: ⟨n_i⟩ and ⟨b_i⟩ = [Re, Im].
 * - bonds: one per link (translation class of bonds, oriented as the lattice bond from the home
 *   supercell); current = ⟨−∂H/∂A⟩ for a phase e^{iA} on every hop moving a particle from → to,
 *   plain or conditional: Σ 2·Im(t·w·conj(β_to)·β_from), w = 1 (plain), 1 − n_via (empty),
 *   n_via (occupied).
 * - effective link amplitude: t_eff = Σ t·w over the hops of a link (mean-field densities of the
 *   via sites inserted); effective Peierls phase φ_eff = arg(−t_eff), so a plain −J hop has phase 0;
 *   its density-dependent part is φ_eff − φ_static with t_static = Σ t (every conditional hop
 *   acting fully). Effective flux per plaquette = Σ_steps ±φ_eff wrapped to (−π, π]; `uniform` is
 *   the mean over the supercell's plaquettes, `staggered` the largest |Fourier component| at a
 *   nonzero ordering vector, and `byType` the mean per plaquette type of the unit cell.
 * - structure factor: S(q) = (1/Ns) Σ_ij e^{iq(r_i−r_j)} (⟨n_i n_j⟩ − n̄²) of the product state
 *   on the supercell's allowed momenta (with a multi-site basis also shifted by the first
 *   reciprocal vectors, where sublattice order shows), n̄ the mean density; for a product state this is
 *   (1/Ns)|Σ_i e^{iq·r_i}(n_i − n̄)|² + (1/Ns)Σ_i n_i(1 − n_i). It measures the classical
 *   density pattern the way ED's connected S(q) sees a symmetric superposition of the patterns.
 * - condensateFraction = Σ|β_i|² / Σ n_i (fraction of particles in the condensate of the product
 *   state; the one-body density matrix's largest eigenvalue per particle for a single-q condensate).
 * - chirality (triangles): s_i·(s_j × s_k) of the classical spins s = (Re β, −Im β, n − ½)
 *   (S⁺ = b†), sites counter-clockwise.
 */
import { RESULT_SPEC_ID, type PhaseLabel, type Result } from '../result.js';
import { supercellEnergy } from './energy.js';
import type { MeanFieldProblem, MinimiseOutcome } from './gutzwiller.js';
import { hardcoreSiteSpace } from './site-space.js';

export interface LinkObservable {
  from: number;
  to: number;
  dcell: number[];
  dx: number;
  dy: number;
  class: string;
  current: number;
  /** Effective amplitude along from → to with densities inserted, [re, im]. */
  tEff: [number, number];
  /** arg(−t_eff) in radians, null when t_eff vanishes. */
  phase: number | null;
  /** arg(−t_static). */
  staticPhase: number | null;
  /** phase − staticPhase wrapped to (−π, π]. */
  densityPhase: number | null;
}

export interface FluxSummary {
  uniform: number;
  staggered: { q: [number, number]; value: number } | null;
  byType: { type: string; flux: number; count: number }[];
}

const wrap = (x: number): number => {
  let y = x % (2 * Math.PI);
  if (y <= -Math.PI) y += 2 * Math.PI;
  if (y > Math.PI) y -= 2 * Math.PI;
  return y;
};

function pickClass(classes: string[]): string {
  return classes.find((c) => c !== 'nn' && c !== 'nnn') ?? classes[0] ?? 'path';
}

export function meanFieldObservables(
  problem: MeanFieldProblem,
  out: MinimiseOutcome,
  timing: { buildMs: number; solveMs: number },
  label?: PhaseLabel,
): Result {
  const { model } = problem;
  const n = model.nSites;
  const m = new Float64Array(3 * n);
  hardcoreSiteSpace.moments(out.params, m, n);
  const energy = supercellEnergy(model, m, 0);
  const density = (i: number): number => m[3 * i];

  // Links: currents and effective amplitudes.
  const L = model.links.length;
  const current = new Float64Array(L);
  const effRe = new Float64Array(L);
  const effIm = new Float64Array(L);
  const statRe = new Float64Array(L);
  const statIm = new Float64Array(L);
  const hasHop = new Uint8Array(L);
  const add = (link: number, sign: number, tr: number, ti: number, w: number, from: number, to: number): void => {
    const uf = m[3 * from + 1], vf = m[3 * from + 2], ut = m[3 * to + 1], vt = m[3 * to + 2];
    const pr = ut * uf + vt * vf;
    const pi = ut * vf - vt * uf;
    current[link] += sign * 2 * w * (tr * pi + ti * pr);
    // Along the link: the entry's t (sign +1) or its conjugate (sign −1).
    effRe[link] += w * tr;
    effIm[link] += sign * w * ti;
    statRe[link] += tr;
    statIm[link] += sign * ti;
    hasHop[link] = 1;
  };
  const { hop, cond } = model;
  for (let k = 0; k < hop.from.length; k++) add(hop.link[k], hop.sign[k], hop.re[k], hop.im[k], 1, hop.from[k], hop.to[k]);
  for (let k = 0; k < cond.from.length; k++) {
    const w = cond.alpha[k] + cond.gamma[k] * density(cond.via[k]);
    add(cond.link[k], cond.sign[k], cond.re[k], cond.im[k], w, cond.from[k], cond.to[k]);
  }
  const phaseOf = (re: number, im: number): number | null => (Math.hypot(re, im) < 1e-12 ? null : Math.atan2(-im, -re));
  const links: LinkObservable[] = model.links.map((l, k) => {
    const phase = phaseOf(effRe[k], effIm[k]);
    const staticPhase = phaseOf(statRe[k], statIm[k]);
    return {
      from: l.from, to: l.to, dcell: l.dcell, dx: l.dx, dy: l.dy, class: pickClass(l.classes),
      current: current[k], tEff: [effRe[k], effIm[k]], phase, staticPhase,
      densityPhase: phase !== null && staticPhase !== null ? wrap(phase - staticPhase) : null,
    };
  });

  // Plaquettes.
  const spin = (i: number): number[] => [m[3 * i + 1], -m[3 * i + 2], m[3 * i] - 0.5];
  const plaquettes = model.plaquettes.map((p) => {
    let circulation = 0;
    let flux = 0;
    let defined = true;
    for (const st of p.steps) {
      circulation += st.sign * current[st.link];
      const ph = links[st.link].phase;
      if (ph === null) defined = false;
      else flux += st.sign * ph;
    }
    let chirality = 0;
    if (p.sites.length === 3) {
      const [a, b, c] = p.sites.map(spin);
      chirality = a[0] * (b[1] * c[2] - b[2] * c[1]) - a[1] * (b[0] * c[2] - b[2] * c[0]) + a[2] * (b[0] * c[1] - b[1] * c[0]);
    }
    return { sites: p.sites, circulation, flux: defined ? wrap(flux) : 0, chirality, defined, p };
  });
  const fluxSummary = summariseFlux(plaquettes.filter((p) => p.defined).map((p) => ({ flux: p.flux, cx: p.p.cx, cy: p.p.cy, type: p.p.type })), problem.momenta);

  // Structure factor and condensate.
  let nbar = 0;
  let beta2 = 0;
  let diag = 0;
  for (let i = 0; i < n; i++) {
    nbar += density(i);
    beta2 += m[3 * i + 1] ** 2 + m[3 * i + 2] ** 2;
    diag += density(i) * (1 - density(i));
  }
  const total = nbar;
  nbar /= n;
  const structureFactor = problem.structureMomenta.map((q) => {
    let re = 0;
    let im = 0;
    for (let i = 0; i < n; i++) {
      const ph = q[0] * model.sites[i].x + q[1] * model.sites[i].y;
      re += Math.cos(ph) * (density(i) - nbar);
      im += Math.sin(ph) * (density(i) - nbar);
    }
    return { q: [q[0], q[1]] as [number, number], value: (re * re + im * im) / n + diag / n };
  });

  const warnings = [...problem.warnings, ...out.warnings];
  const result: Result = {
    spec: RESULT_SPEC_ID,
    method: 'meanfield',
    // Totals are over the spec's own lattice, like ED's: the periodic product state repeated on it.
    energy: (energy / n) * problem.clusterSites,
    energyPerSite: energy / n,
    energies: [(energy / n) * problem.clusterSites],
    gap: null,
    degenerate: false,
    sites: model.sites.map((s, i) => ({ index: i, x: s.x, y: s.y, density: density(i), condensate: [m[3 * i + 1], m[3 * i + 2]] as [number, number] })),
    bonds: links.filter((_, k) => hasHop[k]).map((l) => ({ from: l.from, to: l.to, class: l.class, current: l.current })),
    plaquettes: plaquettes.map((p) => ({ sites: p.sites, circulation: p.circulation, flux: p.flux, chirality: p.chirality })),
    structureFactor,
    condensateFraction: total > 1e-12 ? beta2 / total : 0,
    convergence: {
      converged: out.converged,
      iterations: out.iterations,
      residual: out.gradientNorm,
      startsAtMinimum: out.startsAtMinimum,
      starts: out.starts,
    },
    timing,
    provenance: { modelHash: '', version: '' },
    extras: {
      meanField: {
        supercell: problem.supercell.matrix,
        sites: n,
        supercellEnergy: energy,
        mu: out.mu,
        filling: problem.filling,
        density: nbar,
        grandPotential: out.grandPotential,
        muSteps: out.muSteps,
        winners: out.winners,
        params: Array.from(out.params),
        twistPerCell: problem.twistPerCell,
      },
      links: links.filter((_, k) => hasHop[k]),
      effectiveFlux: fluxSummary,
      plaquetteFluxDefined: plaquettes.map((p) => p.defined),
    },
  };
  if (label) result.label = label;
  if (warnings.length) result.warnings = warnings;
  return result;
}

function summariseFlux(ps: { flux: number; cx: number; cy: number; type: string }[], momenta: number[][]): FluxSummary {
  if (ps.length === 0) return { uniform: 0, staggered: null, byType: [] };
  const uniform = ps.reduce((s, p) => s + p.flux, 0) / ps.length;
  let staggered: FluxSummary['staggered'] = null;
  for (const q of momenta) {
    if (Math.hypot(q[0], q[1]) < 1e-9) continue;
    let re = 0;
    let im = 0;
    for (const p of ps) {
      re += p.flux * Math.cos(q[0] * p.cx + q[1] * p.cy);
      im += p.flux * Math.sin(q[0] * p.cx + q[1] * p.cy);
    }
    const value = Math.hypot(re, im) / ps.length;
    if (!staggered || value > staggered.value + 1e-12) staggered = { q: [q[0], q[1]], value };
  }
  const types = new Map<string, { sum: number; count: number }>();
  for (const p of ps) {
    const t = types.get(p.type) ?? { sum: 0, count: 0 };
    t.sum += p.flux;
    t.count++;
    types.set(p.type, t);
  }
  return { uniform, staggered, byType: [...types].map(([type, t]) => ({ type, flux: t.sum / t.count, count: t.count })) };
}
