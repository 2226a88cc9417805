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

describe('EdOperator', () => {
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
