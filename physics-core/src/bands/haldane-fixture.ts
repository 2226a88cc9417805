/**
 * Haldane's honeycomb model (F. D. M. Haldane, Phys. Rev. Lett. 61, 2015 (1988)) as a hand-built
 * Bloch model, for tests: nearest-neighbour hopping t1, next-nearest t2·e^{iνφ} with ν = ±1 the
 * turn of the two-step path (counter-clockwise +1), on-site +M on sublattice A and −M on B.
 * Geometry: nearest-neighbour distance 1, a1 = (√3, 0), a2 = (√3/2, 3/2), A at (0,0), B at (0,1).
 */
import type { BlochHop, BlochModel } from './bloch.js';

export function haldaneBlochModel(t1: number, t2: number, phi: number, M: number): BlochModel {
  const s3 = Math.sqrt(3);
  const translations = [[s3, 0], [s3 / 2, 1.5]];
  const basis = [[0, 0], [0, 1]];
  const hops: BlochHop[] = [];
  // Nearest neighbours A(0) → B(cell d).
  const nnCells = [[0, 0], [0, -1], [1, -1]];
  const pos = (sub: number, c: number[]): number[] => [
    basis[sub][0] + c[0] * translations[0][0] + c[1] * translations[1][0],
    basis[sub][1] + c[0] * translations[0][1] + c[1] * translations[1][1],
  ];
  for (const d of nnCells) hops.push({ from: 0, to: 1, re: t1, im: 0, dcell: d });
  // Next-nearest: two nn steps s → other → s, turn = sign of the cross product of the steps.
  const steps = (sub: number): { d: number[]; cell: number[] }[] => nnCells.map((c) => {
    const cell = sub === 0 ? c : [-c[0], -c[1]];
    const a = pos(sub, [0, 0]);
    const b = pos(1 - sub, cell);
    return { d: [b[0] - a[0], b[1] - a[1]], cell };
  });
  for (let sub = 0; sub < 2; sub++) {
    for (const s1 of steps(sub)) {
      for (const s2 of steps(1 - sub)) {
        const cell = [s1.cell[0] + s2.cell[0], s1.cell[1] + s2.cell[1]];
        if (cell[0] === 0 && cell[1] === 0) continue;
        // Each unordered pair once: keep the canonical direction of the cell displacement.
        if (cell[0] < 0 || (cell[0] === 0 && cell[1] < 0)) continue;
        const turn = Math.sign(s1.d[0] * s2.d[1] - s1.d[1] * s2.d[0]);
        hops.push({ from: sub, to: sub, re: t2 * Math.cos(turn * phi), im: t2 * Math.sin(turn * phi), dcell: cell });
      }
    }
  }
  return { nBands: 2, translations, hops, onsite: [M, -M] };
}
