import type { CompiledModel } from '../model/types.js';
import type { PlaquetteResult } from '../result.js';
import { bit, transitionExpectation, type StateManifold } from './manifold.js';
import { pairKey, type PairCurrent } from './currents.js';

/**
 * Per plaquette (sites counter-clockwise, steps with the traversal sign):
 *
 * - circulation: Σ over the loop's steps of the pair current in the direction of travel.
 * - flux: arg Π_steps(−τ_step) wrapped to (−π, π], where τ_step is the amplitude for one particle
 *   to move along the step with the other plaquette sites empty: the plain hops on that bond plus
 *   conditional hops with `when: 'empty'` whose via site lies on the plaquette (a conditional hop
 *   needing an occupied via cannot complete a one-particle loop and is left out). The sign
 *   convention makes −|t| hopping flux-free, so a triangle of positive amplitudes has flux π
 *   (frustration). Conditional phases depend on density: this is the flux seen by one particle
 *   on an otherwise empty plaquette. If some step has τ = 0 the flux is undefined: 0 is
 *   reported and the plaquette's index is listed by `plaquetteObservables` in `fluxUndefined`.
 * - chirality (triangles only, else 0): ⟨S_1·(S_2 × S_3)⟩ under the hardcore-boson ↔ spin-½
 *   mapping S⁺ = b†, S^z = n − ½, sites in counter-clockwise order. Expanding the triple product
 *   by the site that carries S^z, and (S_b × S_c)^z = (i/2)(S⁺_b S⁻_c − S⁻_b S⁺_c), gives
 *     χ = −Σ_{(a,b,c) cyclic} Im⟨(n_a − ½) b†_b b_c⟩,
 *   odd under time reversal (complex conjugation) and under reversing the orientation.
 */
export function plaquetteObservables(
  model: CompiledModel,
  m: StateManifold,
  currents: PairCurrent[],
): { plaquettes: PlaquetteResult[]; fluxUndefined: number[] } {
  const lattice = model.lattice;
  const byPair = new Map<number, PairCurrent>();
  for (const c of currents) byPair.set(pairKey(c.from, c.to), c);
  const fluxUndefined: number[] = [];
  const plaquettes = lattice.plaquettes.map((p) => {
    const onLoop = new Set(p.sites);
    let circulation = 0;
    let loopRe = 1;
    let loopIm = 0;
    let defined = true;
    for (const step of p.steps) {
      const bond = lattice.bonds[step.bond];
      const a = step.sign === 1 ? bond.from : bond.to;
      const b = step.sign === 1 ? bond.to : bond.from;
      const pc = byPair.get(pairKey(a, b));
      if (pc) circulation += pc.from === a ? pc.current : -pc.current;
      // τ for moving a → b
      let tr = 0;
      let ti = 0;
      for (const term of model.terms) {
        if (term.kind === 'hop') {
          for (const e of term.entries) {
            if (e.bond === step.bond || (e.bond < 0 && pairKey(e.from, e.to) === pairKey(a, b))) {
              if (e.from === a && e.to === b) {
                tr += e.re;
                ti += e.im;
              } else if (e.from === b && e.to === a) {
                tr += e.re;
                ti -= e.im;
              }
            }
          }
        } else if (term.kind === 'conditional-hop' && term.when === 'empty') {
          for (const e of term.entries) {
            if (!onLoop.has(e.via)) continue;
            if (e.from === a && e.to === b) {
              tr += e.re;
              ti += e.im;
            } else if (e.from === b && e.to === a) {
              tr += e.re;
              ti -= e.im;
            }
          }
        }
      }
      if (tr === 0 && ti === 0) defined = false;
      // multiply the loop product by −τ
      const nr = -(loopRe * tr - loopIm * ti);
      const ni = -(loopRe * ti + loopIm * tr);
      loopRe = nr;
      loopIm = ni;
    }
    let flux = 0;
    if (defined) {
      flux = Math.atan2(loopIm, loopRe);
      if (flux <= -Math.PI) flux += 2 * Math.PI;
    } else fluxUndefined.push(p.index);
    const chirality = p.sites.length === 3 ? triangleChirality(m, p.sites[0], p.sites[1], p.sites[2]) : 0;
    return { sites: [...p.sites], circulation, flux, chirality };
  });
  return { plaquettes, fluxUndefined };
}

/** χ = −Σ_cyc Im⟨(n_a − ½) b†_b b_c⟩ for the triangle (s1, s2, s3); see plaquetteObservables. */
export function triangleChirality(m: StateManifold, s1: number, s2: number, s3: number): number {
  const h = new Float64Array(2);
  let chi = 0;
  for (const [a, b, c] of [
    [s1, s2, s3],
    [s2, s3, s1],
    [s3, s1, s2],
  ]) {
    // ⟨n_a b†_b b_c⟩: move c → b with a occupied
    transitionExpectation(m, bit(a) | bit(b) | bit(c), bit(c) | bit(a), bit(b) | bit(c), h);
    const withN = h[1];
    transitionExpectation(m, bit(b) | bit(c), bit(c), bit(b) | bit(c), h);
    chi -= withN - 0.5 * h[1];
  }
  return chi;
}
