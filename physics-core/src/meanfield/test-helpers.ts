/**
 * Test helpers of the mean-field tests: model specs and a dense grand-canonical exact
 * diagonalisation over the full Fock space of a small cluster (reference via ml-matrix).
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import type { CompiledModel, ModelSpec } from '../model/types.js';

export function xxzSpec(kind: 'chain' | 'square' | 'honeycomb', size: number[], V: number): ModelSpec {
  return {
    spec: 'phasewright.model/1',
    lattice: { kind, size, boundary: size.map(() => 'periodic' as const) },
    particles: { kind: 'hardcore', filling: 0.5 },
    parameters: { J: 1, V },
    terms: [
      { kind: 'hop', neighbors: 1, amplitude: '-J' },
      { kind: 'interaction', neighbors: 1, amplitude: 'V' },
    ],
  };
}

/** Lowest energy of every particle-number sector of a compiled model (dense, full Fock space ≤ 12 sites). */
export function sectorGroundEnergies(c: CompiledModel): number[] {
  const n = c.nSites;
  if (n > 12) throw new Error('too many sites for the dense reference');
  const out: number[] = [];
  for (let N = 0; N <= n; N++) {
    const states: number[] = [];
    for (let s = 0; s < 1 << n; s++) if (popcount(s) === N) states.push(s);
    const index = new Map(states.map((s, i) => [s, i]));
    const d = states.length;
    const re = Matrix.zeros(d, d);
    const im = Matrix.zeros(d, d);
    const addHop = (s: number, i: number, from: number, to: number, tr: number, ti: number, ok: (s: number) => boolean): void => {
      // t b†_to b_from and its conjugate
      if (ok(s) && s & (1 << from) && !(s & (1 << to))) {
        const j = index.get((s ^ (1 << from)) | (1 << to))!;
        re.set(j, i, re.get(j, i) + tr);
        im.set(j, i, im.get(j, i) + ti);
      }
      if (ok(s) && s & (1 << to) && !(s & (1 << from))) {
        const j = index.get((s ^ (1 << to)) | (1 << from))!;
        re.set(j, i, re.get(j, i) + tr);
        im.set(j, i, im.get(j, i) - ti);
      }
    };
    states.forEach((s, i) => {
      for (const t of c.terms) {
        if (t.kind === 'hop') for (const e of t.entries) addHop(s, i, e.from, e.to, e.re, e.im, () => true);
        else if (t.kind === 'conditional-hop') {
          for (const e of t.entries) {
            const want = t.when === 'empty' ? 0 : 1;
            addHop(s, i, e.from, e.to, e.re, e.im, (x) => ((x >> e.via) & 1) === want);
          }
        } else if (t.kind === 'interaction') {
          for (const e of t.entries) if (s & (1 << e.i) && s & (1 << e.j)) re.set(i, i, re.get(i, i) + e.value);
        } else {
          for (const e of t.entries) if (s & (1 << e.i)) re.set(i, i, re.get(i, i) + e.value);
        }
      }
    });
    const big = Matrix.zeros(2 * d, 2 * d);
    big.setSubMatrix(re, 0, 0);
    big.setSubMatrix(re, d, d);
    big.setSubMatrix(im.clone().mul(-1), 0, d);
    big.setSubMatrix(im, d, 0);
    const ev = new EigenvalueDecomposition(big, { assumeSymmetric: true }).realEigenvalues;
    out.push(Math.min(...ev));
  }
  return out;
}

function popcount(x: number): number {
  let c = 0;
  for (; x; x &= x - 1) c++;
  return c;
}

/** Lower convex envelope of points (N, E_N) evaluated at N = x. */
export function convexEnvelopeAt(values: number[], x: number): number {
  let best = Infinity;
  for (let a = 0; a < values.length; a++) {
    for (let b = a; b < values.length; b++) {
      if (x < a || x > b) continue;
      const v = a === b ? values[a] : values[a] + ((values[b] - values[a]) * (x - a)) / (b - a);
      best = Math.min(best, v);
    }
  }
  return best;
}
