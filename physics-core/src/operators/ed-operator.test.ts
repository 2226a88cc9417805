import { describe, expect, it } from 'vitest';
import { EdOperator, estimateOperator } from './ed-operator.js';
import { SizeError } from '../errors.js';
import { chainModel, denseFromMatvec, denseHermitianEigen, handModel, randomModel } from '../ed/test-models.js';
import type { CompiledModel } from '../model/types.js';

function maxDiff(a: Float64Array, b: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

/**
 * H straight from its definition, independent of the move tables: for every basis state and
 * every entry, apply t·b†_to [P_via] b_from and its conjugate by bit tests; n_i n_j and n_i on
 * the diagonal. Row-major re/im, indices by binary search in the sorted state list.
 */
function bruteForceDense(model: CompiledModel, states: Uint32Array): { re: Float64Array; im: Float64Array } {
  const n = states.length;
  const re = new Float64Array(n * n);
  const im = new Float64Array(n * n);
  const index = (s: number): number => {
    let lo = 0;
    let hi = n - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (states[mid] === s) return mid;
      if (states[mid] < s) lo = mid + 1;
      else hi = mid - 1;
    }
    throw new Error(`state ${s} not in the basis`);
  };
  const occ = (s: number, i: number): boolean => Math.floor(s / 2 ** i) % 2 === 1;
  for (let c = 0; c < n; c++) {
    const s = states[c];
    for (const term of model.terms) {
      if (term.kind === 'interaction') for (const e of term.entries) re[c * n + c] += occ(s, e.i) && occ(s, e.j) ? e.value : 0;
      if (term.kind === 'onsite') for (const e of term.entries) re[c * n + c] += occ(s, e.i) ? e.value : 0;
      if (term.kind !== 'hop' && term.kind !== 'conditional-hop') continue;
      for (const e of term.entries) {
        if (term.kind === 'conditional-hop') {
          const via = occ(s, (e as { via: number }).via);
          if (via !== (term.when === 'occupied')) continue;
        }
        // t b†_to b_from: from occupied, to empty → ⟨s'|H|s⟩ = t
        if (occ(s, e.from) && !occ(s, e.to)) {
          const r = index(s - 2 ** e.from + 2 ** e.to);
          re[r * n + c] += e.re;
          im[r * n + c] += e.im;
        }
        // conj(t) b†_from b_to
        if (occ(s, e.to) && !occ(s, e.from)) {
          const r = index(s - 2 ** e.to + 2 ** e.from);
          re[r * n + c] += e.re;
          im[r * n + c] -= e.im;
        }
      }
    }
  }
  return { re, im };
}

describe('EdOperator', () => {
  it('equals H built from its definition by brute force, for CSR (packed and, above 256 coefficients, unpacked) and matrix-free', () => {
    const many = (() => {
      // 11 sites, all pairs hop (55 entries) plus conditional hops on every triple in a row (≥ 256 coefficients in total).
      const hops: [number, number, number, number][] = [];
      for (let i = 0; i < 11; i++) for (let j = i + 1; j < 11; j++) hops.push([i, j, Math.cos(i + 2 * j), Math.sin(3 * i - j)]);
      const cond: [number, number, number, number, number][] = [];
      for (let i = 0; i < 11; i++) for (let d = 1; d < 8; d++) cond.push([i, (i + d) % 11, (i + d + 1) % 11, 0.1 * d, -0.05 * i]);
      return handModel({ nSites: 11, nParticles: 4, hops, conditional: [{ when: 'empty', entries: cond }], interactions: [[0, 5, 0.7], [3, 9, -0.4]], onsite: [[10, 0.3]] });
    })();
    for (const model of [randomModel(21, 9, 4), randomModel(22, 10, 3), randomModel(23, 7, 5), many]) {
      const csr = new EdOperator(model, { storage: 'csr' });
      const free = new EdOperator(model, { storage: 'matrix-free' });
      const n = csr.dimension;
      const ref = bruteForceDense(model, csr.basis.states);
      for (const op of [csr, free]) {
        const d = denseFromMatvec((x, y) => op.matvec(x, y), n);
        expect(maxDiff(d.re, ref.re)).toBeLessThan(1e-14);
        expect(maxDiff(d.im, ref.im)).toBeLessThan(1e-14);
      }
    }
    expect(estimateOperator(many).csrBytes).toBeGreaterThan(5 * (estimateOperator(many).nnz / 2));
  });

  it('two sites, one particle: H = [[0, conj t],[t, 0]] for t·b†_1 b_0 + h.c. (definition)', () => {
    const op = new EdOperator(handModel({ nSites: 2, nParticles: 1, hops: [[0, 1, 0.3, 0.7]] }));
    // basis: |01⟩ = particle on site 0 (state 1), |10⟩ = site 1 (state 2)
    const { re, im } = denseFromMatvec((x, y) => op.matvec(x, y), 2);
    expect([re[2], im[2]]).toEqual([0.3, 0.7]); // ⟨site1|H|site0⟩ = t
    expect([re[1], im[1]]).toEqual([0.3, -0.7]);
  });

  it('conditional hop acts only when the via site is empty (or occupied)', () => {
    for (const when of ['empty', 'occupied'] as const) {
      const op = new EdOperator(
        handModel({ nSites: 3, nParticles: 2, conditional: [{ when, entries: [[0, 1, 2, 1, 0]] }] }),
      );
      // N = 2 states in order: 011 (sites 0,1), 101 (sites 0,2), 110 (sites 1,2).
      // The move 0→2 through 1 maps 011 → 110 and needs site 1 occupied; with two particles on
      // three sites it can never happen with site 1 empty.
      const { re } = denseFromMatvec((x, y) => op.matvec(x, y), 3);
      const n = 3;
      expect(re[2 * n + 0]).toBe(when === 'occupied' ? 1 : 0);
      expect(op.nnz).toBe(when === 'occupied' ? 2 : 0);
    }
  });

  it('is Hermitian and CSR equals matrix-free on random complex models with conditional terms', () => {
    for (const [seed, L, N] of [
      [1, 6, 3],
      [2, 7, 2],
      [3, 8, 4],
    ]) {
      const model = randomModel(seed, L, N);
      const csr = new EdOperator(model, { storage: 'csr' });
      const free = new EdOperator(model, { storage: 'matrix-free' });
      expect(csr.storage).toBe('csr');
      expect(free.storage).toBe('matrix-free');
      const n = csr.dimension;
      const a = denseFromMatvec((x, y) => csr.matvec(x, y), n);
      const b = denseFromMatvec((x, y) => free.matvec(x, y), n);
      expect(maxDiff(a.re, b.re)).toBeLessThan(1e-15);
      expect(maxDiff(a.im, b.im)).toBeLessThan(1e-15);
      for (let r = 0; r < n; r++) {
        for (let c = 0; c < n; c++) {
          expect(a.re[r * n + c]).toBeCloseTo(a.re[c * n + r], 14);
          expect(a.im[r * n + c]).toBeCloseTo(-a.im[c * n + r], 14);
        }
      }
      // the exact nnz count equals the stored elements
      expect(csr.nnz).toBe(estimateOperator(model).nnz);
    }
  });

  it('update re-weights in place and equals a fresh build; changed structure rebuilds', () => {
    const model = randomModel(5, 7, 3);
    const op = new EdOperator(model);
    const scaled: CompiledModel = {
      ...model,
      terms: model.terms.map((t) => {
        switch (t.kind) {
          case 'hop':
            return { ...t, entries: t.entries.map((e) => ({ ...e, re: 2 * e.re - e.im, im: e.re + 2 * e.im })) };
          case 'conditional-hop':
            return { ...t, entries: t.entries.map((e) => ({ ...e, re: 0.5 * e.re, im: 0.5 * e.im })) };
          case 'interaction':
            return { ...t, entries: t.entries.map((e) => ({ ...e, value: 3 * e.value })) };
          case 'onsite':
            return t;
        }
      }),
    };
    expect(op.update(scaled)).toBe('reweighted');
    const fresh = new EdOperator(scaled);
    const n = op.dimension;
    const a = denseFromMatvec((x, y) => op.matvec(x, y), n);
    const b = denseFromMatvec((x, y) => fresh.matvec(x, y), n);
    expect(maxDiff(a.re, b.re)).toBe(0);
    expect(maxDiff(a.im, b.im)).toBe(0);
    expect(op.update(chainModel({ L: 7, N: 3 }))).toBe('rebuilt');
    expect(op.dimension).toBe(35);
  });

  it('a gauge transformation b_j → e^{iχ_j} b_j leaves the spectrum unchanged (ml-matrix dense)', () => {
    const model = randomModel(11, 6, 3);
    const chi = [0.3, -1.2, 2.0, 0.1, 0.7, -2.5];
    const rot = (re: number, im: number, a: number): { re: number; im: number } => ({
      re: re * Math.cos(a) - im * Math.sin(a),
      im: re * Math.sin(a) + im * Math.cos(a),
    });
    // t b†_to b_from → t e^{i(χ_to − χ_from)} b†_to b_from
    const gauged: CompiledModel = {
      ...model,
      terms: model.terms.map((t) =>
        t.kind === 'hop' || t.kind === 'conditional-hop'
          ? ({ ...t, entries: t.entries.map((e) => ({ ...e, ...rot(e.re, e.im, chi[e.to] - chi[e.from]) })) } as typeof t)
          : t,
      ),
    };
    const spectrum = (m: CompiledModel): number[] => {
      const op = new EdOperator(m);
      const { re, im } = denseFromMatvec((x, y) => op.matvec(x, y), op.dimension);
      return denseHermitianEigen(re, im, op.dimension).values;
    };
    const a = spectrum(model);
    const b = spectrum(gauged);
    for (let i = 0; i < a.length; i++) expect(b[i]).toBeCloseTo(a[i], 10);
  });

  it('refuses above the memory budget, naming the estimate and how to raise it', () => {
    const model = chainModel({ L: 20, N: 10, periodic: true });
    expect(() => new EdOperator(model, { memoryBudgetBytes: 1e5 })).toThrow(SizeError);
    expect(() => new EdOperator(model, { memoryBudgetBytes: 1e5 })).toThrow(/memoryBudgetBytes/);
    // CSR does not fit but matrix-free does: auto falls back
    const est = estimateOperator(model);
    const op = new EdOperator(model, { memoryBudgetBytes: est.totalMatrixFreeBytes + 1000 });
    expect(op.storage).toBe('matrix-free');
  });
});
