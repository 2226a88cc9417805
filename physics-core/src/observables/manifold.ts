import type { FixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import { permuteMask } from '../symmetry/translation-sectors.js';

/**
 * The state observables are taken in: one ground state, or an equal-weight average over a
 * degenerate ground manifold, ρ = (1/g) Σ_a |ψ_a⟩⟨ψ_a| (basis independent, so any orthonormal
 * choice of the manifold's vectors gives the same averages). Vectors are interleaved complex.
 */
export interface StateManifold {
  basis: FixedNumberBasis;
  vectors: Float64Array[];
  /**
   * Site permutations that leave ρ unchanged (T ρ T† = ρ), when known: e.g. the lattice
   * translations when every vector is a momentum eigenstate. `transitionExpectation` then
   * computes one operator per orbit of (check, want, flip) and reuses it for the images.
   */
  symmetries?: Int32Array[];
}

/** Per manifold, expectations already computed, keyed by the orbit's canonical (check, want, flip). */
const known = new WeakMap<StateManifold, Map<string, [number, number]>>();

/** The smallest image of (check, want, flip) under the permutations, as a key. */
function canonicalKey(perms: Int32Array[], check: number, want: number, flip: number): string {
  let best: [number, number, number] = [check >>> 0, want >>> 0, flip >>> 0];
  for (const g of perms) {
    const c: [number, number, number] = [permuteMask(g, check) >>> 0, permuteMask(g, want) >>> 0, permuteMask(g, flip) >>> 0];
    if (c[0] < best[0] || (c[0] === best[0] && (c[1] < best[1] || (c[1] === best[1] && c[2] < best[2])))) best = c;
  }
  return best.join(':');
}

/**
 * Σ_a (1/g) Σ_{s : (s & check) = want} conj(ψ_a[rank(s ^ flip)]) ψ_a[s], written to out[0..1].
 * With check = bit(from)|bit(to)|bit(via), want = bit(from) [+ bit(via)], flip = bit(from)|bit(to)
 * this is ⟨b†_to P b_from⟩ with P = 1, (1 − n_via) or n_via.
 */
export function transitionExpectation(
  m: StateManifold,
  check: number,
  want: number,
  flip: number,
  out: Float64Array | number[],
): void {
  if (!m.symmetries?.length) {
    scanTransition(m, check, want, flip, out);
    return;
  }
  // ⟨g(O)⟩ = ⟨O⟩ when ρ is invariant under g: one scan per orbit of operators.
  let cache = known.get(m);
  if (!cache) {
    cache = new Map();
    known.set(m, cache);
  }
  const key = canonicalKey(m.symmetries, check, want, flip);
  const hit = cache.get(key);
  if (hit) {
    out[0] = hit[0];
    out[1] = hit[1];
    return;
  }
  scanTransition(m, check, want, flip, out);
  cache.set(key, [out[0], out[1]]);
}

function scanTransition(m: StateManifold, check: number, want: number, flip: number, out: Float64Array | number[]): void {
  const { states, dimension, nLow, lowMask, rankOfLow, offsetOfHigh } = m.basis;
  let re = 0;
  let im = 0;
  for (const psi of m.vectors) {
    for (let r = 0; r < dimension; r++) {
      const s = states[r] | 0;
      if ((s & check) !== want) continue;
      const t = s ^ flip;
      const c = (offsetOfHigh[t >>> nLow] + rankOfLow[t & lowMask]) << 1;
      const ar = psi[c];
      const ai = psi[c + 1];
      const br = psi[2 * r];
      const bi = psi[2 * r + 1];
      re += ar * br + ai * bi;
      im += ar * bi - ai * br;
    }
  }
  const g = m.vectors.length;
  out[0] = re / g;
  out[1] = im / g;
}

/** Probability of each basis state averaged over the manifold. */
export function probabilities(m: StateManifold): Float64Array {
  const p = new Float64Array(m.basis.dimension);
  const g = m.vectors.length;
  for (const psi of m.vectors) {
    for (let r = 0; r < p.length; r++) p[r] += (psi[2 * r] * psi[2 * r] + psi[2 * r + 1] * psi[2 * r + 1]) / g;
  }
  return p;
}

export function bit(i: number): number {
  return (1 << i) | 0;
}
