/**
 * Two-step paths j → k → i through a common neighbour k, for conditional hops.
 *
 * Every pair of distinct bonds meeting at a site k and sharing a bond class (so that some
 * `legs` class can select both steps) gives one unordered path (distinct periodic images are
 * distinct paths); paths whose two ends are the same site are skipped (they would not move a
 * particle). Canonical orientation `from` → `to` follows the bond rule: from the lower
 * cell-site (sublattice) index to the higher; same index: towards +x of the total displacement,
 * or +y when dx = 0. So when the two ends are also joined by a bond with that displacement,
 * the path runs along the bond (`pair.sign` = +1).
 *
 * Turn: the sign of the z component of (step j→k) × (step k→i) on unwrapped displacements,
 * +1 counter-clockwise (left turn), −1 clockwise, 0 straight (|cross| ≤ 1e-9·|d1|·|d2|).
 * Reversing a path flips its turn, so a phase ∝ turn is odd under reversal.
 */
import type { Bond, Path, Site } from '../model/types.js';
import { isCanonical } from './unit-cell.js';

interface Incidence {
  bond: number;
  /** The other end of the bond. */
  other: number;
  /** Displacement of the step other → k. */
  dx: number;
  dy: number;
  /** +1 when the step other → k runs along the bond's orientation. */
  sign: 1 | -1;
}

/** Numeric key of (from, to, wrap) for wraps in −7…7 per axis (paths of two bonds stay far inside). */
function pairKey(n: number, from: number, to: number, w0: number, w1: number): number {
  return ((from * n + to) * 16 + (w0 + 8)) * 16 + (w1 + 8);
}

export function buildPaths(sites: Site[], bonds: Bond[], scale: number): Path[] {
  const n = sites.length;
  const inc: Incidence[][] = sites.map(() => []);
  const pairBond = new Map<number, number>();
  for (const b of bonds) {
    if (b.from === b.to) continue;
    inc[b.to].push({ bond: b.index, other: b.from, dx: b.dx, dy: b.dy, sign: 1 });
    inc[b.from].push({ bond: b.index, other: b.to, dx: -b.dx, dy: -b.dy, sign: -1 });
    const k = pairKey(n, b.from, b.to, b.wrap[0] ?? 0, b.wrap[1] ?? 0);
    if (!pairBond.has(k)) pairBond.set(k, b.index);
  }
  const dim = bonds[0]?.wrap.length ?? 0;
  const paths: Path[] = [];
  for (let k = 0; k < n; k++) {
    const list = inc[k];
    for (let p = 0; p < list.length; p++)
      for (let q = p + 1; q < list.length; q++) {
        const e1 = list[p];
        const e2 = list[q];
        if (e1.other === e2.other) continue;
        const c1 = bonds[e1.bond].classes;
        const c2 = bonds[e2.bond].classes;
        if (!c1.some((c) => c2.includes(c))) continue; // no `legs` class could select both steps
        // j = e1.other → k → i = e2.other: steps d1 = e1.(dx, dy), d2 = −e2.(dx, dy)
        const d1x = e1.dx;
        const d1y = e1.dy;
        const d2x = -e2.dx;
        const d2y = -e2.dy;
        const wa = bonds[e1.bond].wrap;
        const wb = bonds[e2.bond].wrap;
        const s2 = -e2.sign as 1 | -1;
        let w0 = dim > 0 ? e1.sign * wa[0] + s2 * wb[0] : 0;
        let w1 = dim > 1 ? e1.sign * wa[1] + s2 * wb[1] : 0;
        const cross = d1x * d2y - d1y * d2x;
        let turn: -1 | 0 | 1 =
          Math.abs(cross) <= 1e-9 * Math.hypot(d1x, d1y) * Math.hypot(d2x, d2y) ? 0 : cross > 0 ? 1 : -1;
        let dx = d1x + d2x;
        let dy = d1y + d2y;
        let path: Path;
        if (isCanonical(sites[e1.other].sublattice, sites[e2.other].sublattice, dx, dy, scale)) {
          path = {
            index: paths.length,
            from: e1.other,
            via: k,
            to: e2.other,
            first: { bond: e1.bond, sign: e1.sign },
            second: { bond: e2.bond, sign: s2 },
            turn,
            dx,
            dy,
            wrap: dim === 1 ? [w0] : dim === 2 ? [w0, w1] : [],
          };
        } else {
          // reversed: i → k → j
          dx = -dx;
          dy = -dy;
          w0 = -w0 || 0;
          w1 = -w1 || 0;
          turn = turn === 0 ? 0 : turn === 1 ? -1 : 1;
          path = {
            index: paths.length,
            from: e2.other,
            via: k,
            to: e1.other,
            first: { bond: e2.bond, sign: e2.sign },
            second: { bond: e1.bond, sign: -e1.sign as 1 | -1 },
            turn,
            dx,
            dy,
            wrap: dim === 1 ? [w0] : dim === 2 ? [w0, w1] : [],
          };
        }
        const pb = pairBond.get(pairKey(n, path.from, path.to, w0, w1));
        if (pb !== undefined) path.pair = { bond: pb, sign: 1 };
        else {
          const rb = pairBond.get(pairKey(n, path.to, path.from, -w0 || 0, -w1 || 0));
          if (rb !== undefined) path.pair = { bond: rb, sign: -1 };
        }
        paths.push(path);
      }
  }
  return paths;
}
