import type { CompiledModel, CompiledTerm } from '../model/types.js';
import { binomial, popcount32 } from '../hilbert/fixed-number-basis.js';

/**
 * The off-diagonal part of a hardcore-boson Hamiltonian as "directed moves" on bit strings.
 * Every hop entry t·b†_to P b_from + h.c. (P = 1, 1−n_via or n_via) gives two moves:
 *
 *   forward  (from → to): applies to a ket |s⟩ with (s & check) == want, want = bit(from) [+ bit(via)]
 *   backward (to → from): the same with want = bit(to) [+ bit(via)]
 *
 * and both produce |s ^ flip⟩ with flip = bit(from) | bit(to). Hardcore bosons carry no fermion
 * sign, so ⟨s^flip|H|s⟩ is t for the forward move and conj(t) for the backward one.
 *
 * Rows of H are built from the kets they act on: if move d applies to |s_r⟩ and sends it to
 * |s_c⟩, then H[r, c] = conj(⟨s_c|H|s_r⟩), i.e. the amplitude of d's partner move. Each move
 * therefore stores the index of its partner's coefficient: forward → conj(t), backward → t.
 * Coefficient k lives at table[2k] (re), table[2k+1] (im); entry e of the whole model owns
 * coefficients 2e (t) and 2e+1 (conj t). Amplitudes can change without touching the structure.
 */
export interface DirectedMoves {
  count: number;
  check: Int32Array;
  want: Int32Array;
  flip: Int32Array;
  /** Index into the coefficient table of the matrix element stored in a row reached by this move. */
  coefficient: Uint32Array;
  /** Number of complex coefficients (2 per hop entry). */
  coefficientCount: number;
}

/** The diagonal: value·n_i n_j (i ≠ j) and value·n_i, flattened over all terms. */
export interface DiagonalTerms {
  count: number;
  /** Bit mask of the sites involved (one or two bits). */
  mask: Int32Array;
  value: Float64Array;
}

/** A fingerprint of everything but the amplitudes; equal fingerprints share an operator structure. */
export function structureKey(model: CompiledModel): string {
  const parts: string[] = [`${model.nSites}/${model.nParticles}`];
  for (const term of model.terms) parts.push(termStructure(term));
  return parts.join('|');
}

function termStructure(term: CompiledTerm): string {
  switch (term.kind) {
    case 'hop':
      return `h${term.termIndex}:` + term.entries.map((e) => `${e.from}>${e.to}`).join(',');
    case 'conditional-hop':
      return (
        `c${term.termIndex}${term.when}:` + term.entries.map((e) => `${e.from}>${e.via}>${e.to}`).join(',')
      );
    case 'interaction':
      return `i${term.termIndex}:` + term.entries.map((e) => `${e.i}.${e.j}`).join(',');
    case 'onsite':
      return `o${term.termIndex}:` + term.entries.map((e) => `${e.i}`).join(',');
  }
}

function bit(i: number): number {
  return (1 << i) | 0;
}

function checkSite(i: number, nSites: number, what: string): void {
  if (!Number.isInteger(i) || i < 0 || i >= nSites) {
    throw new RangeError(`compiled model: ${what} site ${i} is outside 0..${nSites - 1}`);
  }
}

export function compileDirectedMoves(model: CompiledModel): DirectedMoves {
  const check: number[] = [];
  const want: number[] = [];
  const flip: number[] = [];
  const coefficient: number[] = [];
  let entry = 0;
  for (const term of model.terms) {
    if (term.kind !== 'hop' && term.kind !== 'conditional-hop') continue;
    for (const e of term.entries) {
      checkSite(e.from, model.nSites, 'hop');
      checkSite(e.to, model.nSites, 'hop');
      if (e.from === e.to) throw new RangeError(`compiled model: hop from site ${e.from} to itself`);
      let viaBit = 0;
      let viaWant = 0;
      if (term.kind === 'conditional-hop') {
        const via = (e as { via: number }).via;
        checkSite(via, model.nSites, 'conditional-hop via');
        if (via === e.from || via === e.to) {
          throw new RangeError(`compiled model: conditional hop ${e.from}→${e.to} through one of its ends`);
        }
        viaBit = bit(via);
        viaWant = term.when === 'occupied' ? viaBit : 0;
      }
      const ends = bit(e.from) | bit(e.to);
      // forward: from occupied, to empty; the row reached stores conj(t)
      check.push(ends | viaBit);
      want.push(bit(e.from) | viaWant);
      flip.push(ends);
      coefficient.push(2 * entry + 1);
      // backward: to occupied, from empty; the row reached stores t
      check.push(ends | viaBit);
      want.push(bit(e.to) | viaWant);
      flip.push(ends);
      coefficient.push(2 * entry);
      entry++;
    }
  }
  return {
    count: check.length,
    check: Int32Array.from(check),
    want: Int32Array.from(want),
    flip: Int32Array.from(flip),
    coefficient: Uint32Array.from(coefficient),
    coefficientCount: 2 * entry,
  };
}

/** Fills `table` (interleaved complex, 2 per hop entry) with the model's current amplitudes. */
export function fillCoefficients(model: CompiledModel, table: Float64Array): void {
  let k = 0;
  for (const term of model.terms) {
    if (term.kind !== 'hop' && term.kind !== 'conditional-hop') continue;
    for (const e of term.entries) {
      if (!Number.isFinite(e.re) || !Number.isFinite(e.im)) {
        throw new RangeError(`compiled model: term ${term.termIndex} has a non-finite amplitude`);
      }
      table[k++] = e.re;
      table[k++] = e.im;
      table[k++] = e.re;
      table[k++] = -e.im;
    }
  }
}

export function compileDiagonalTerms(model: CompiledModel): DiagonalTerms {
  const mask: number[] = [];
  const value: number[] = [];
  for (const term of model.terms) {
    if (term.kind === 'interaction') {
      for (const e of term.entries) {
        checkSite(e.i, model.nSites, 'interaction');
        checkSite(e.j, model.nSites, 'interaction');
        if (!Number.isFinite(e.value)) throw new RangeError(`compiled model: term ${term.termIndex} has a non-finite value`);
        // n_i n_i = n_i for hardcore bosons
        mask.push(bit(e.i) | bit(e.j));
        value.push(e.value);
      }
    } else if (term.kind === 'onsite') {
      for (const e of term.entries) {
        checkSite(e.i, model.nSites, 'onsite');
        if (!Number.isFinite(e.value)) throw new RangeError(`compiled model: term ${term.termIndex} has a non-finite value`);
        mask.push(bit(e.i));
        value.push(e.value);
      }
    }
  }
  return { count: mask.length, mask: Int32Array.from(mask), value: Float64Array.from(value) };
}

/** Fills `diagonal[r]` = Σ value over diagonal terms whose sites are all occupied in states[r]. */
export function fillDiagonal(states: Uint32Array, terms: DiagonalTerms, diagonal: Float64Array): void {
  const { count, mask, value } = terms;
  for (let r = 0; r < states.length; r++) {
    const s = states[r] | 0;
    let d = 0;
    for (let k = 0; k < count; k++) {
      const m = mask[k];
      if ((s & m) === m) d += value[k];
    }
    diagonal[r] = d;
  }
}

/** Exact number of stored off-diagonal elements (one per applicable move per state). */
export function countMoves(moves: DirectedMoves, nSites: number, nParticles: number): number {
  let nnz = 0;
  for (let d = 0; d < moves.count; d++) {
    const fixed = popcount32(moves.check[d]);
    const occupied = popcount32(moves.want[d]);
    nnz += binomial(nSites - fixed, nParticles - occupied);
  }
  return nnz;
}
