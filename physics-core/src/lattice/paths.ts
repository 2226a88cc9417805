/**
 * Two-step paths j → k → i through a common neighbour k, for conditional hops.
 *
 * Every pair of distinct bonds meeting at a site k gives one unordered path (distinct periodic
 * images are distinct paths); paths whose two ends are the same site are skipped (they would
 * not move a particle). Canonical orientation `from` → `to` follows the bond rule: from the lower
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

const wrapKey = (from: number, to: number, wrap: number[]) => `${from}>${to}|${wrap.join(',')}`;

export function buildPaths(sites: Site[], bonds: Bond[], scale: number): Path[] {
  const inc: Incidence[][] = sites.map(() => []);
  const pairBond = new Map<string, number>();
  for (const b of bonds) {
    if (b.from === b.to) continue;
    inc[b.to].push({ bond: b.index, other: b.from, dx: b.dx, dy: b.dy, sign: 1 });
    inc[b.from].push({ bond: b.index, other: b.to, dx: -b.dx, dy: -b.dy, sign: -1 });
    const k = wrapKey(b.from, b.to, b.wrap);
    if (!pairBond.has(k)) pairBond.set(k, b.index);
  }
  const paths: Path[] = [];
  for (let k = 0; k < sites.length; k++) {
    const list = inc[k];
    for (let p = 0; p < list.length; p++)
      for (let q = p + 1; q < list.length; q++) {
        const e1 = list[p];
        const e2 = list[q];
        if (e1.other === e2.other) continue;
        // j = e1.other → k → i = e2.other
        const d1x = e1.dx;
        const d1y = e1.dy;
        const d2x = -e2.dx;
        const d2y = -e2.dy;
        const w1 = bonds[e1.bond].wrap.map((w) => e1.sign * w);
        const w2 = bonds[e2.bond].wrap.map((w) => -e2.sign * w);
        let from = e1.other;
        let to = e2.other;
        let first = { bond: e1.bond, sign: e1.sign };
        let second = { bond: e2.bond, sign: (-e2.sign) as 1 | -1 };
        let dx = d1x + d2x;
        let dy = d1y + d2y;
        let wrap = w1.map((w, a) => w + w2[a]);
        const cross = d1x * d2y - d1y * d2x;
        let turn: -1 | 0 | 1 =
          Math.abs(cross) <= 1e-9 * Math.hypot(d1x, d1y) * Math.hypot(d2x, d2y) ? 0 : cross > 0 ? 1 : -1;
        if (!isCanonical(sites[from].sublattice, sites[to].sublattice, dx, dy, scale)) {
          [from, to] = [to, from];
          [first, second] = [
            { bond: second.bond, sign: (-second.sign) as 1 | -1 },
            { bond: first.bond, sign: (-first.sign) as 1 | -1 },
          ];
          dx = -dx;
          dy = -dy;
          wrap = wrap.map((w) => -w || 0);
          turn = (-turn || 0) as -1 | 0 | 1;
        }
        const path: Path = { index: paths.length, from, via: k, to, first, second, turn, dx, dy, wrap };
        const pb = pairBond.get(wrapKey(from, to, wrap));
        if (pb !== undefined) path.pair = { bond: pb, sign: 1 };
        else {
          const rb = pairBond.get(wrapKey(to, from, wrap.map((w) => -w || 0)));
          if (rb !== undefined) path.pair = { bond: rb, sign: -1 };
        }
        paths.push(path);
      }
  }
  return paths;
}
