/**
 * Plaquettes: the smallest loops of nearest-neighbour (`nn`) bonds, as counter-clockwise loops.
 *
 * Method: the nn bonds of every built-in lattice (and of most custom ones) form a planar graph
 * in the unwrapped plane, whose faces are exactly the smallest loops (triangles of the triangular,
 * zigzag and kagome lattices, squares of the square lattice and ladder, hexagons of honeycomb and
 * kagome). Faces are traced with the face on the left: arriving at v from u, leave along the
 * next bond clockwise from v→u. A traced loop is kept when it closes in the unwrapped plane (its
 * steps sum to zero, which drops loops winding around a periodic axis), encloses a positive area
 * (which drops the outer boundary of an open cluster) and has at most `maxLength` steps.
 * When nn bonds cross each other (possible on custom lattices) faces are not defined; the
 * plaquettes are then the shortest cycles through each nn bond instead, oriented counter-clockwise.
 *
 * Each plaquette starts at its smallest site index; `area` is the shoelace area, `cx`, `cy` the
 * mean of the corners, unwrapped from the first corner's position.
 */
import type { Bond, Plaquette, Site } from '../model/types.js';
import type { CellBond, UnitCell } from './unit-cell.js';

interface Half {
  bond: number;
  from: number;
  to: number;
  dx: number;
  dy: number;
  sign: 1 | -1;
  angle: number;
}

function loopGeometry(sites: Site[], halves: Half[]) {
  let x = sites[halves[0].from].x;
  let y = sites[halves[0].from].y;
  const xs = [x];
  const ys = [y];
  for (const h of halves.slice(0, -1)) {
    x += h.dx;
    y += h.dy;
    xs.push(x);
    ys.push(y);
  }
  const sx = halves.reduce((s, h) => s + h.dx, 0);
  const sy = halves.reduce((s, h) => s + h.dy, 0);
  let a2 = 0;
  for (let i = 0; i < xs.length; i++) {
    const j = (i + 1) % xs.length;
    a2 += xs[i] * ys[j] - xs[j] * ys[i];
  }
  const cx = xs.reduce((s, v) => s + v, 0) / xs.length;
  const cy = ys.reduce((s, v) => s + v, 0) / ys.length;
  return { area: a2 / 2, closed: Math.hypot(sx, sy), cx, cy, xs, ys };
}

function makePlaquette(sites: Site[], halves: Half[], index: number, scale: number): Plaquette | null {
  const g = loopGeometry(sites, halves);
  if (g.closed > 1e-6 * scale) return null;
  if (g.area <= 1e-9 * scale * scale) return null;
  // rotate to start at the smallest site index
  let start = 0;
  for (let i = 1; i < halves.length; i++) if (halves[i].from < halves[start].from) start = i;
  const rot = [...halves.slice(start), ...halves.slice(0, start)];
  const r = loopGeometry(sites, rot);
  return {
    index,
    sites: rot.map((h) => h.from),
    steps: rot.map((h) => ({ bond: h.bond, sign: h.sign })),
    area: r.area,
    cx: r.cx,
    cy: r.cy,
  };
}

function segmentsCross(ax: number, ay: number, bx: number, by: number, cx: number, cy: number, dx: number, dy: number, eps: number): boolean {
  const o = (px: number, py: number, qx: number, qy: number, rx: number, ry: number) =>
    (qx - px) * (ry - py) - (qy - py) * (rx - px);
  const d1 = o(ax, ay, bx, by, cx, cy);
  const d2 = o(ax, ay, bx, by, dx, dy);
  const d3 = o(cx, cy, dx, dy, ax, ay);
  const d4 = o(cx, cy, dx, dy, bx, by);
  return ((d1 > eps && d2 < -eps) || (d1 < -eps && d2 > eps)) && ((d3 > eps && d4 < -eps) || (d3 < -eps && d4 > eps));
}

/**
 * Whether the nn bonds of the infinite lattice are drawn without crossings (planar), checked on
 * the unit cell's nn bonds against their images in the neighbouring cells.
 */
export function cellNnPlanar(cell: UnitCell, cellBonds: CellBond[]): boolean {
  const scale = Math.hypot(cell.translations[0][0], cell.translations[0][1]);
  const eps = 1e-9 * scale * scale;
  const nn = cellBonds.filter((b) => b.shell === 1);
  const dim = cell.translations.length;
  const offs: number[][] = [];
  for (let i = -2; i <= 2; i++) {
    if (dim === 1) offs.push([i]);
    else for (let j = -2; j <= 2; j++) offs.push([i, j]);
  }
  const origin = (b: CellBond, off: number[]) => {
    let x = cell.basis[b.from].x;
    let y = cell.basis[b.from].y;
    off.forEach((o, a) => {
      x += o * cell.translations[a][0];
      y += o * cell.translations[a][1];
    });
    return [x, y];
  };
  for (const p of nn) {
    const [ax, ay] = origin(p, p.offset.map(() => 0));
    for (const q of nn)
      for (const off of offs) {
        const [cx, cy] = origin(q, off);
        if (segmentsCross(ax, ay, ax + p.dx, ay + p.dy, cx, cy, cx + q.dx, cy + q.dy, eps)) return false;
      }
  }
  return true;
}

export function buildPlaquettes(
  sites: Site[],
  bonds: Bond[],
  scale: number,
  planar: boolean,
  maxLength = 12,
): Plaquette[] {
  const nn = bonds.filter((b) => b.shell === 1 && b.from !== b.to);
  const out: Half[][] = sites.map(() => []);
  const halves: Half[] = [];
  for (const b of nn) {
    const f: Half = { bond: b.index, from: b.from, to: b.to, dx: b.dx, dy: b.dy, sign: 1, angle: Math.atan2(b.dy, b.dx) };
    const r: Half = { bond: b.index, from: b.to, to: b.from, dx: -b.dx, dy: -b.dy, sign: -1, angle: Math.atan2(-b.dy, -b.dx) };
    halves.push(f, r);
    out[b.from].push(f);
    out[b.to].push(r);
  }
  for (const list of out) list.sort((p, q) => p.angle - q.angle);
  if (!planar) return shortestCycles(sites, nn, out, scale, maxLength);
  const visited = new Set<Half>();
  const plaquettes: Plaquette[] = [];
  for (const h0 of halves) {
    if (visited.has(h0)) continue;
    const loop: Half[] = [];
    let h = h0;
    let ok = true;
    do {
      visited.add(h);
      loop.push(h);
      if (loop.length > maxLength) ok = false;
      const list = out[h.to];
      // the half-edge back (h.to → h.from along the same bond)
      const back = list.findIndex((e) => e.bond === h.bond && e.sign === -h.sign);
      h = list[(back - 1 + list.length) % list.length];
    } while (h !== h0 && !visited.has(h));
    if (!ok || h !== h0) continue;
    const p = makePlaquette(sites, loop, plaquettes.length, scale);
    if (p) plaquettes.push(p);
  }
  return plaquettes;
}

/** Fallback for non-planar nn graphs: the shortest cycle through each nn bond (BFS), deduplicated. */
function shortestCycles(sites: Site[], nn: Bond[], out: Half[][], scale: number, maxLength: number): Plaquette[] {
  const seen = new Set<string>();
  const plaquettes: Plaquette[] = [];
  for (const b of nn) {
    // BFS from b.to back to b.from without using b
    const prev = new Map<number, Half>();
    const queue = [b.to];
    const dist = new Map<number, number>([[b.to, 0]]);
    while (queue.length && !dist.has(b.from)) {
      const u = queue.shift() as number;
      if ((dist.get(u) ?? 0) >= maxLength - 1) break;
      for (const e of out[u]) {
        if (e.bond === b.index || dist.has(e.to)) continue;
        dist.set(e.to, (dist.get(u) ?? 0) + 1);
        prev.set(e.to, e);
        queue.push(e.to);
      }
    }
    if (!dist.has(b.from)) continue;
    const loop: Half[] = [];
    let v = b.from;
    while (v !== b.to) {
      const e = prev.get(v) as Half;
      loop.unshift(e);
      v = e.from;
    }
    const first: Half = { bond: b.index, from: b.from, to: b.to, dx: b.dx, dy: b.dy, sign: 1, angle: 0 };
    let cyc = [first, ...loop];
    if (loopGeometry(sites, cyc).area < 0) {
      cyc = cyc.reverse().map((e) => ({ ...e, from: e.to, to: e.from, dx: -e.dx, dy: -e.dy, sign: (-e.sign) as 1 | -1 }));
    }
    const key = cyc.map((e) => e.bond).sort((p, q) => p - q).join(',');
    if (seen.has(key)) continue;
    seen.add(key);
    const p = makePlaquette(sites, cyc, plaquettes.length, scale);
    if (p) plaquettes.push(p);
  }
  return plaquettes;
}
