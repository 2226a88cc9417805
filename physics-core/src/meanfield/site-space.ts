/**
 * Single-site variational spaces of the Gutzwiller product state. The energy is written in terms
 * of per-site moments (⟨n⟩, Re⟨b⟩, Im⟨b⟩), and a SiteSpace maps its own parameters to those
 * moments and pulls energy gradients back. A softcore space (complex Fock amplitudes up to a
 * maximum occupancy, with extra moments such as ⟨n(n−1)⟩ for an on-site `hubbard` term) can be
 * added by implementing the same interface with a larger `momentsPerSite`.
 */

/** Moment layout per site: index 0 = ⟨n⟩, 1 = Re⟨b⟩, 2 = Im⟨b⟩ (softcore spaces append more). */
export const MOMENT_N = 0;
export const MOMENT_BETA_RE = 1;
export const MOMENT_BETA_IM = 2;

export interface SiteSpace {
  readonly kind: 'hardcore';
  readonly paramsPerSite: number;
  readonly momentsPerSite: number;
  /** Fills `moments` (momentsPerSite × nSites) from `params` (paramsPerSite × nSites). */
  moments(params: Float64Array, moments: Float64Array, nSites: number): void;
  /** Given ∂E/∂moments, writes ∂E/∂params into `grad` (overwrites). */
  pullback(params: Float64Array, dMoments: Float64Array, grad: Float64Array, nSites: number): void;
  /** Parameters of a site with density `n` ∈ [0, 1] and condensate phase `phase`. */
  fromDensityPhase(n: number, phase: number, out: Float64Array, site: number): void;
}

/**
 * Hardcore site: cos(a/2)|0⟩ + e^{ib} sin(a/2)|1⟩, parameters (a, b).
 * ⟨n⟩ = sin²(a/2) = (1 − cos a)/2 and ⟨b⟩ = ⟨0|b|ψ⟩-weighted = cos(a/2)·sin(a/2)·e^{ib} = ½ sin a · e^{ib}.
 */
export const hardcoreSiteSpace: SiteSpace = {
  kind: 'hardcore',
  paramsPerSite: 2,
  momentsPerSite: 3,
  moments(params, moments, nSites) {
    for (let i = 0; i < nSites; i++) {
      const a = params[2 * i];
      const b = params[2 * i + 1];
      const half = 0.5 * Math.sin(a);
      moments[3 * i] = 0.5 * (1 - Math.cos(a));
      moments[3 * i + 1] = half * Math.cos(b);
      moments[3 * i + 2] = half * Math.sin(b);
    }
  },
  pullback(params, dM, grad, nSites) {
    for (let i = 0; i < nSites; i++) {
      const a = params[2 * i];
      const b = params[2 * i + 1];
      const sa = Math.sin(a);
      const ca = Math.cos(a);
      const cb = Math.cos(b);
      const sb = Math.sin(b);
      const dn = dM[3 * i];
      const du = dM[3 * i + 1];
      const dv = dM[3 * i + 2];
      // n = (1−cos a)/2, u = ½ sin a cos b, v = ½ sin a sin b
      grad[2 * i] = 0.5 * sa * dn + 0.5 * ca * (cb * du + sb * dv);
      grad[2 * i + 1] = 0.5 * sa * (-sb * du + cb * dv);
    }
  },
  fromDensityPhase(n, phase, out, site) {
    const c = Math.min(1, Math.max(0, n));
    out[2 * site] = Math.acos(1 - 2 * c);
    out[2 * site + 1] = phase;
  },
};
