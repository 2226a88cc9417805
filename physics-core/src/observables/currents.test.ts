import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { compileModel } from '../model/compile.js';
import type { CompiledModel, ModelSpec } from '../model/types.js';
import { EdSolver, solveEd } from '../ed/solve-ed.js';
import { pairKey } from './currents.js';
import { randomModel } from '../ed/test-models.js';

const zigzag = JSON.parse(readFileSync(new URL('../../examples/zigzag-conditional.json', import.meta.url), 'utf8')) as ModelSpec;

function smallZigzag(): CompiledModel {
  // 10 sites, with a twist so that plain hops also carry currents.
  return compileModel({ ...zigzag, lattice: { ...zigzag.lattice, size: [5], twist: [0.9] } });
}

/** Multiplies every hop that moves a particle a → b by e^{iA} (its conjugate by e^{−iA}). */
function withPairPhase(model: CompiledModel, a: number, b: number, A: number): CompiledModel {
  const rot = (re: number, im: number, s: number): { re: number; im: number } => ({
    re: re * Math.cos(s * A) - im * Math.sin(s * A),
    im: re * Math.sin(s * A) + im * Math.cos(s * A),
  });
  return {
    ...model,
    terms: model.terms.map((t) => {
      if (t.kind !== 'hop' && t.kind !== 'conditional-hop') return t;
      const entries = t.entries.map((e) =>
        e.from === a && e.to === b ? { ...e, ...rot(e.re, e.im, 1) } : e.from === b && e.to === a ? { ...e, ...rot(e.re, e.im, -1) } : e,
      );
      return { ...t, entries } as typeof t;
    }),
  };
}

function timeReversed(model: CompiledModel): CompiledModel {
  return {
    ...model,
    terms: model.terms.map((t) =>
      t.kind === 'hop' || t.kind === 'conditional-hop' ? ({ ...t, entries: t.entries.map((e) => ({ ...e, im: -e.im })) } as typeof t) : t,
    ),
  };
}

describe('bond currents −∂H/∂A', () => {
  it('equal the Hellmann–Feynman derivative −dE0/dA of the pair phase (central finite differences)', () => {
    const model = smallZigzag();
    const r = solveEd(model, { states: 2 });
    expect(r.degenerate).toBe(false);
    const solver = new EdSolver({ states: 1, observables: [], tolerance: 1e-12 }, true);
    const h = 1e-4;
    const pairs = r.bonds.filter((b) => Math.abs(b.current) > 1e-3);
    expect(pairs.length).toBeGreaterThan(2);
    expect(new Set(pairs.map((p) => p.class)).size).toBe(2); // zig (plain) and leg (conditional) pairs
    for (const b of pairs) {
      const ep = solver.solve(withPairPhase(model, b.from, b.to, h)).result.energy;
      const em = solver.solve(withPairPhase(model, b.from, b.to, -h)).result.energy;
      expect(-(ep - em) / (2 * h)).toBeCloseTo(b.current, 6);
    }
  });

  it('are conserved at every site (Σ outgoing = 0, conditional pairs included) and flip under time reversal', () => {
    for (const model of [smallZigzag(), randomModel(21, 8, 3), randomModel(22, 7, 4)]) {
      const r = solveEd(model, { states: 2 });
      const out = new Float64Array(model.nSites);
      for (const b of r.bonds) {
        out[b.from] += b.current;
        out[b.to] -= b.current;
      }
      for (let i = 0; i < model.nSites; i++) expect(Math.abs(out[i])).toBeLessThan(1e-9);
      const tr = solveEd(timeReversed(model), { states: 2 });
      expect(tr.energy).toBeCloseTo(r.energy, 10);
      const byPair = new Map(tr.bonds.map((b) => [pairKey(b.from, b.to), b]));
      for (const b of r.bonds) {
        const c = byPair.get(pairKey(b.from, b.to));
        expect(c?.from).toBe(b.from);
        expect(c?.current).toBeCloseTo(-b.current, 8);
      }
    }
  });
});
