import type { CompiledModel } from '../model/types.js';
import type { BondResult } from '../result.js';
import { bit, transitionExpectation, type StateManifold } from './manifold.js';

/**
 * Bond currents as −∂H/∂A.
 *
 * Definition (design.md): for a directed pair from→to, multiply every hop term that moves a
 * particle from→to by e^{iA} (and its conjugate by e^{−iA}); the current is J = −⟨∂H/∂A⟩ at A = 0.
 *
 * Derivation. An entry t·b†_b P b_a + h.c. (P = 1, 1 − n_via or n_via, commuting with n_a, n_b)
 * aligned with the pair (a = from, b = to) becomes t e^{iA} b†_b P b_a + h.c., so
 *   ∂H/∂A = i t b†_b P b_a − i t* b†_a P b_b,  ⟨∂H/∂A⟩ = 2 Re(i t X) = −2 Im(t X),  X = ⟨b†_b P b_a⟩,
 * and J_{b←a} = +2 Im(t X). An entry written in the opposite orientation contributes with the
 * opposite sign (its amplitude for the move a→b is t*). The same expression follows from the
 * continuity equation: i[H, n_b] contains −i t b†_b P b_a + i t* b†_a P b_b, whose expectation is
 * 2 Im(t X); hence Σ_b J_{b←a} = −d⟨n_a⟩/dt = 0 at every site in an eigenstate (checked in tests).
 * Hellmann–Feynman: dE_0/dA = ⟨∂H/∂A⟩ = −J (checked by finite differences in tests).
 *
 * One result per unordered pair that any hop or conditional hop connects. Its orientation and
 * class come from the lattice bond joining the pair when there is one (the lattice-specific class
 * such as `zig` or `leg` is preferred over the shell classes `nn`/`nnn`); otherwise the
 * orientation of the first entry and class `path`.
 */
export interface PairCurrent extends BondResult {
  /** Lattice bond used for orientation, or −1. */
  bond: number;
}

export function pairKey(a: number, b: number): number {
  return a < b ? a * 65536 + b : b * 65536 + a;
}

export function bondCurrents(model: CompiledModel, m: StateManifold): PairCurrent[] {
  const lattice = model.lattice;
  const bondByPair = new Map<number, number>();
  for (const b of lattice.bonds) {
    const key = pairKey(b.from, b.to);
    if (!bondByPair.has(key)) bondByPair.set(key, b.index);
  }
  const pairs = new Map<number, PairCurrent>();
  const h = new Float64Array(2);
  const add = (from: number, to: number, via: number, when: 'empty' | 'occupied' | null, re: number, im: number): void => {
    const key = pairKey(from, to);
    let pair = pairs.get(key);
    if (!pair) {
      const bi = bondByPair.get(key);
      if (bi !== undefined) {
        const bond = lattice.bonds[bi];
        const special = bond.classes.find((c) => c !== 'nn' && c !== 'nnn');
        pair = { from: bond.from, to: bond.to, class: special ?? bond.classes[0] ?? 'nn', current: 0, bond: bi };
      } else {
        pair = { from, to, class: 'path', current: 0, bond: -1 };
      }
      pairs.set(key, pair);
    }
    if (re === 0 && im === 0) return;
    const viaBit = via >= 0 ? bit(via) : 0;
    const viaWant = when === 'occupied' ? viaBit : 0;
    transitionExpectation(m, bit(from) | bit(to) | viaBit, bit(from) | viaWant, bit(from) | bit(to), h);
    // J_{to←from} = 2 Im(t X)
    const j = 2 * (re * h[1] + im * h[0]);
    pair.current += pair.from === from ? j : -j;
  };
  for (const term of model.terms) {
    if (term.kind === 'hop') for (const e of term.entries) add(e.from, e.to, -1, null, e.re, e.im);
    else if (term.kind === 'conditional-hop') for (const e of term.entries) add(e.from, e.to, e.via, term.when, e.re, e.im);
  }
  return [...pairs.values()];
}
