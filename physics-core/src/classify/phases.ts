/**
 * Phase labels from observables, with the evidence behind them. Works on mean-field and ED
 * points (Result v1). Labels are data ({ id, confidence, evidence }), never UI strings.
 *
 * Signals:
 * - superfluid: condensateFraction ≥ `superfluidFraction` (ED: its coherent excess over the value
 *   f₀ = max_i n_i / N that a state without phase coherence has, (f − f₀)/(1 − f₀));
 * - density wave: (max_{q≠0} S(q) − min_q S(q))/Ns ≥ `densityWave` (ordering vector = the q of the
 *   maximum; subtracting the minimum removes the q-independent local part);
 * - supersolid: both (mean-field only: on one ED cluster both signals are always finite, so ED
 *   labels the stronger one relative to its threshold and keeps the other under `secondary`);
 * - chiral superfluid: superfluid with a uniform loop circulation |mean circulation| ≥ `current`;
 * - flux/vortex lattice: staggered circulation (rms deviation from the mean) ≥ `current`, or a
 *   staggered effective flux (mean-field extras) ≥ `flux`;
 * - 120°-type phase order (mean-field, triangular plaquettes): the vector chirality of the
 *   condensate phases κ = (2/3√3) Σ_{ij∈△} sin(φ_j − φ_i) has |κ| ≥ `vectorChirality` on at least
 *   `coverage` of the triangles; ED points carry no condensate phases and never get this label;
 * - unresolved: none of the above.
 * The thresholds are rules of thumb (common practice), not derived values: finite ED clusters have
 * S(q)/Ns and condensate fractions of order 1/Ns even without order, hence the larger ED defaults.
 * Confidence grows with the margin over the threshold and is halved for unconverged points or
 * when fewer than half of the mean-field starts reached the minimum.
 */
import { PhasewrightError } from '../errors.js';
import type { PhaseLabel, Result } from '../result.js';

export interface ClassifyOptions {
  /** Condensate fraction (ED: its coherent excess, see above) above which a point is superfluid. @default 0.02 (mean-field), 0.15 (ED) */
  superfluidFraction?: number;
  /** S(q)/Ns at q ≠ 0 above which a point has density-wave order. @default 0.02 (mean-field), 0.08 (ED) */
  densityWave?: number;
  /** Loop circulation (energy × current units of the model) counted as nonzero. @default 1e-4 */
  current?: number;
  /** Staggered effective flux (radians) counted as nonzero. @default 0.05 */
  flux?: number;
  /** |κ| per triangle counted as 120°-type phase order. @default 0.5 */
  vectorChirality?: number;
  /** Fraction of triangles that must show it. @default 0.8 */
  coverage?: number;
}

export type PhaseId =
  | 'superfluid'
  | 'density-wave'
  | 'supersolid'
  | 'chiral-superfluid'
  | 'flux-lattice'
  | 'phase-order-120'
  | 'unresolved';

export interface Classification {
  /** The label of the point (combined). */
  label: PhaseLabel;
  /** Every signal found, strongest first. */
  signals: PhaseLabel[];
}

export function checkClassifyOptions(method: Result['method'], options: ClassifyOptions = {}): Required<ClassifyOptions> {
  const ed = method === 'ed';
  const o = {
    superfluidFraction: options.superfluidFraction ?? (ed ? 0.15 : 0.02),
    densityWave: options.densityWave ?? (ed ? 0.08 : 0.02),
    current: options.current ?? 1e-4,
    flux: options.flux ?? 0.05,
    vectorChirality: options.vectorChirality ?? 0.5,
    coverage: options.coverage ?? 0.8,
  };
  for (const [k, v] of Object.entries(o)) {
    if (!(typeof v === 'number' && v > 0 && Number.isFinite(v))) throw new PhasewrightError(`must be a positive number (got ${String(v)})`, 'options', `classify.${k}`);
  }
  return o;
}

const margin = (value: number, threshold: number): number => Math.min(1, 0.5 + 0.5 * Math.tanh((value - threshold) / threshold));

export function classifyPoint(result: Result, options: ClassifyOptions = {}): Classification {
  const o = checkClassifyOptions(result.method, options);
  const ns = Math.max(1, result.sites.length);
  let reliability = result.convergence.converged ? 1 : 0.5;
  const { startsAtMinimum, starts } = result.convergence;
  if (starts !== undefined && startsAtMinimum !== undefined && startsAtMinimum < starts / 2) reliability *= 0.5;

  const signals: PhaseLabel[] = [];
  const f = result.condensateFraction;
  // ED: the largest eigenvalue of ρ_ij = ⟨b†_i b_j⟩ is at least its largest diagonal element, so even
  // a state without any phase coherence (a crystal of localized particles, a full lattice) has
  // f ≥ f₀ = max_i n_i / N — 1/N for a frozen pattern, 1/Ns for a uniform one — which on a small
  // cluster is above any sensible threshold. The superfluid signal is the coherent excess
  // (f − f₀)/(1 − f₀). Mean-field fractions are taken as they are (their thresholds are set for them).
  const nTotal = result.sites.reduce((a, x) => a + x.density, 0);
  const f0 = result.method === 'ed' && nTotal > 0 ? Math.min(1, Math.max(...result.sites.map((x) => x.density)) / nTotal) : 0;
  const sf = f0 < 1 ? Math.max(0, (f - f0) / (1 - f0)) : 0;
  const sfEvidence = result.method === 'ed' ? { condensateFraction: f, incoherentFraction: f0, coherentFraction: sf } : { condensateFraction: f };
  const isSf = sf >= o.superfluidFraction;
  if (isSf) signals.push({ id: 'superfluid', confidence: reliability * margin(sf, o.superfluidFraction), evidence: { ...sfEvidence, threshold: o.superfluidFraction } });

  let peak = { q: [0, 0] as [number, number], value: 0 };
  let floor = Infinity;
  for (const s of result.structureFactor) {
    floor = Math.min(floor, s.value);
    if (Math.hypot(s.q[0], s.q[1]) < 1e-9) continue;
    if (s.value > peak.value + 1e-12) peak = s;
  }
  // Contrast over the q-independent local part (a product state's Σ n(1−n)/Ns, a liquid's background).
  const dw = result.structureFactor.length ? (peak.value - Math.min(floor, peak.value)) / ns : 0;
  const isDw = dw >= o.densityWave;
  if (isDw) signals.push({ id: 'density-wave', confidence: reliability * margin(dw, o.densityWave), evidence: { orderingVector: peak.q, structureFactorPerSite: dw, threshold: o.densityWave } });

  const circ = result.plaquettes.map((p) => p.circulation);
  const mean = circ.length ? circ.reduce((a, b) => a + b, 0) / circ.length : 0;
  const rms = circ.length ? Math.sqrt(circ.reduce((a, b) => a + (b - mean) ** 2, 0) / circ.length) : 0;
  const uniform = Math.abs(mean);
  const fluxInfo = (result.extras?.effectiveFlux as { staggered?: { q: number[]; value: number } | null } | undefined)?.staggered ?? null;
  const staggeredFlux = fluxInfo?.value ?? 0;
  const isStaggered = rms >= o.current || staggeredFlux >= o.flux;
  if (isStaggered) {
    const c = Math.max(rms >= o.current ? margin(rms, o.current) : 0, staggeredFlux >= o.flux ? margin(staggeredFlux, o.flux) : 0);
    signals.push({ id: 'flux-lattice', confidence: reliability * c, evidence: { staggeredCirculation: rms, staggeredFlux, fluxOrderingVector: fluxInfo?.q ?? null, threshold: { current: o.current, flux: o.flux } } });
  }
  const isChiral = isSf && uniform >= o.current;
  if (isChiral) signals.push({ id: 'chiral-superfluid', confidence: reliability * margin(uniform, o.current), evidence: { meanCirculation: mean, threshold: o.current } });

  let is120 = false;
  if (result.method === 'meanfield' && isSf) {
    const tri = result.plaquettes.filter((p) => p.sites.length === 3);
    const kappas = tri.map((p) => vectorChirality(result, p.sites));
    const strong = kappas.filter((k) => Math.abs(k) >= o.vectorChirality);
    if (tri.length > 0 && strong.length >= o.coverage * tri.length) {
      is120 = true;
      const meanAbs = strong.reduce((a, b) => a + Math.abs(b), 0) / strong.length;
      const staggeredSign = strong.some((k) => k > 0) && strong.some((k) => k < 0);
      signals.push({ id: 'phase-order-120', confidence: reliability * margin(meanAbs, o.vectorChirality), evidence: { meanVectorChirality: meanAbs, triangles: tri.length, ordered: strong.length, staggeredChirality: staggeredSign, threshold: o.vectorChirality } });
    }
  }

  signals.sort((a, b) => b.confidence - a.confidence);
  const find = (id: string): PhaseLabel | undefined => signals.find((s) => s.id === id);
  let label: PhaseLabel;
  if (isSf && isDw && result.method === 'ed') {
    // One finite cluster at fixed N always shows some condensate and some density correlation;
    // without finite-size scaling a supersolid cannot be told apart, so ED names the stronger
    // signal (relative to its threshold) and keeps the other as evidence.
    const sfStronger = sf / o.superfluidFraction >= dw / o.densityWave;
    const main = find(sfStronger ? 'superfluid' : 'density-wave')!;
    const other = find(sfStronger ? 'density-wave' : 'superfluid')!;
    label = { ...main, evidence: { ...main.evidence, secondary: { id: other.id, ...other.evidence }, note: 'both signals present on a finite cluster; supersolid needs finite-size scaling' } };
  } else if (isSf && isDw) {
    const a = find('superfluid')!;
    const b = find('density-wave')!;
    label = { id: 'supersolid', confidence: Math.min(a.confidence, b.confidence), evidence: { ...a.evidence, ...b.evidence } };
  } else if (isDw) label = find('density-wave')!;
  else if (is120) label = { ...find('phase-order-120')!, evidence: { ...find('phase-order-120')!.evidence, ...sfEvidence } };
  else if (isChiral) label = { ...find('chiral-superfluid')!, evidence: { ...find('chiral-superfluid')!.evidence, ...sfEvidence } };
  else if (isStaggered) label = find('flux-lattice')!;
  else if (isSf) label = find('superfluid')!;
  else {
    label = { id: 'unresolved', confidence: reliability * 0.5, evidence: { ...sfEvidence, structureFactorPerSite: dw, meanCirculation: mean, staggeredCirculation: rms, thresholds: o } };
  }
  return { label, signals };
}

/** κ = (2/3√3) Σ sin(φ_j − φ_i) over the triangle's edges, counter-clockwise; ±1 for 120° order. */
function vectorChirality(result: Result, sites: number[]): number {
  const phase = (i: number): number => Math.atan2(result.sites[i].condensate[1], result.sites[i].condensate[0]);
  let s = 0;
  for (let k = 0; k < 3; k++) s += Math.sin(phase(sites[(k + 1) % 3]) - phase(sites[k]));
  return (2 / (3 * Math.sqrt(3))) * s;
}
