/**
 * Neighbour shells and bonds.
 *
 * Shells are distances of the INFINITE lattice (so an open cluster numbers its shells like the
 * bulk), grouped with a relative tolerance of 1e-6. Bonds are then laid on the finite cluster:
 * every basis site of every cell is joined to the image of each canonical cell bond; on a
 * periodic axis the target cell is wrapped and the crossing is counted in `wrap`; on an open
 * axis a bond leaving the cluster is dropped. No minimum-image rule is applied: distinct periodic
 * images are distinct bonds. Because that is ambiguous on very small periodic clusters (a ring of
 * two sites would carry two different nn bonds between the same pair, a ring of one would bond a
 * site to itself), `checkDistinctPairs` refuses a cluster in which two bonds of the shells in use
 * join the same pair of sites, or a bond joins a site to itself, with a SpecError at
 * `$.lattice.size` naming the axis and the smallest length that works.
 */
import { SpecError } from '../errors.js';
import type { BoundaryKind, Bond } from '../model/types.js';
import { DISTANCE_TOLERANCE, isCanonical, type CellBond, type UnitCell } from './unit-cell.js';

export interface CellShells {
  /** Shell distances found, shell n at index n−1 (at least `shells` of them). */
  distances: number[];
  /** Canonically oriented bonds of the infinite lattice with shell ≤ `shells`, plus named bonds. */
  bonds: CellBond[];
}

/** Length scale of a cell: the length of its first translation. */
export function cellScale(cell: UnitCell): number {
  return Math.hypot(cell.translations[0][0], cell.translations[0][1]);
}

function displacement(cell: UnitCell, from: number, to: number, offset: number[]): [number, number] {
  let dx = cell.basis[to].x - cell.basis[from].x;
  let dy = cell.basis[to].y - cell.basis[from].y;
  for (let a = 0; a < offset.length; a++) {
    dx += offset[a] * cell.translations[a][0];
    dy += offset[a] * cell.translations[a][1];
  }
  return [dx, dy];
}

/** Index of `d` in the sorted shell list (tolerance 1e-6 relative), or −1. */
export function shellOf(distances: number[], d: number): number {
  for (let s = 0; s < distances.length; s++) {
    if (Math.abs(distances[s] - d) <= DISTANCE_TOLERANCE * Math.max(distances[s], d)) return s + 1;
  }
  return -1;
}

function* offsetsInBox(dim: number, r: number): Generator<number[]> {
  if (dim === 1) {
    for (let i = -r; i <= r; i++) yield [i];
    return;
  }
  for (let i = -r; i <= r; i++) for (let j = -r; j <= r; j++) yield [i, j];
}

/**
 * Shells and canonical cell bonds of the infinite lattice up to shell `shells` (and up to the
 * longest named bond). The enumeration box grows until it provably contains every displacement
 * no longer than the last shell wanted: a displacement whose cell offset leaves the box of radius
 * R has length ≥ (R+1)·h − spread, h the smallest distance between lattice lines and `spread`
 * the largest distance between basis sites.
 */
export function cellShells(cell: UnitCell, shells: number): CellShells {
  const dim = cell.translations.length;
  const scale = cellScale(cell);
  const eps = DISTANCE_TOLERANCE * scale;
  const nb = cell.basis.length;
  let spread = 0;
  for (const p of cell.basis)
    for (const q of cell.basis) spread = Math.max(spread, Math.hypot(p.x - q.x, p.y - q.y));
  let h: number;
  if (dim === 1) h = scale;
  else {
    const [a, b] = cell.translations;
    const area = Math.abs(a[0] * b[1] - a[1] * b[0]);
    h = Math.min(area / Math.hypot(a[0], a[1]), area / Math.hypot(b[0], b[1]));
  }
  let namedMax = 0;
  for (const nbnd of cell.named ?? []) {
    const [dx, dy] = displacement(cell, nbnd.from, nbnd.to, nbnd.offset);
    namedMax = Math.max(namedMax, Math.hypot(dx, dy));
  }
  for (let r = 1; r <= 64; r++) {
    const bound = (r + 1) * h - spread;
    const dists: number[] = [];
    for (const off of offsetsInBox(dim, r))
      for (let s = 0; s < nb; s++)
        for (let t = 0; t < nb; t++) {
          const [dx, dy] = displacement(cell, s, t, off);
          const d = Math.hypot(dx, dy);
          if (d > eps && d < bound - eps) dists.push(d);
        }
    dists.sort((p, q) => p - q);
    const distances: number[] = [];
    for (const d of dists) {
      const last = distances[distances.length - 1];
      if (last === undefined || d - last > DISTANCE_TOLERANCE * d) distances.push(d);
    }
    const need = Math.max(namedMax, distances[shells - 1] ?? Infinity);
    if (distances.length < shells || need >= bound - eps) continue;
    const kept = distances.filter((d) => d <= need * (1 + DISTANCE_TOLERANCE));
    return { distances: kept, bonds: collectBonds(cell, kept, shells, r) };
  }
  throw new SpecError([
    { path: '$.lattice', message: `could not resolve ${shells} neighbour shells (degenerate translations?)` },
  ]);
}

function collectBonds(cell: UnitCell, distances: number[], shells: number, r: number): CellBond[] {
  const dim = cell.translations.length;
  const scale = cellScale(cell);
  const nb = cell.basis.length;
  const out: CellBond[] = [];
  const key = (from: number, to: number, off: number[]) => `${from}|${to}|${off.join(',')}`;
  const byKey = new Map<string, CellBond>();
  for (let s = 0; s < nb; s++)
    for (const off of offsetsInBox(dim, r))
      for (let t = 0; t < nb; t++) {
        const [dx, dy] = displacement(cell, s, t, off);
        const d = Math.hypot(dx, dy);
        const shell = shellOf(distances, d);
        if (shell < 1 || shell > shells) continue;
        if (!isCanonical(s, t, dx, dy, scale)) continue;
        const base = { from: s, to: t, offset: off, dx, dy, shell };
        const classes = shell === 1 ? ['nn'] : shell === 2 ? ['nnn'] : [];
        for (const c of cell.classify?.(base) ?? []) if (!classes.includes(c)) classes.push(c);
        const b: CellBond = { ...base, classes };
        out.push(b);
        byKey.set(key(s, t, off), b);
      }
  for (const nbnd of cell.named ?? []) {
    let [dx, dy] = displacement(cell, nbnd.from, nbnd.to, nbnd.offset);
    let from = nbnd.from;
    let to = nbnd.to;
    let off = nbnd.offset.slice();
    if (!isCanonical(from, to, dx, dy, scale)) {
      [from, to, off, dx, dy] = [to, from, off.map((o) => -o || 0), -dx, -dy];
    }
    const existing = byKey.get(key(from, to, off));
    if (existing) {
      if (!existing.classes.includes(nbnd.class)) existing.classes.push(nbnd.class);
      continue;
    }
    const shell = shellOf(distances, Math.hypot(dx, dy));
    const shellClass = shell === 1 ? ['nn'] : shell === 2 ? ['nnn'] : [];
    const b: CellBond = { from, to, offset: off, dx, dy, shell, classes: [...shellClass, nbnd.class] };
    out.push(b);
    byKey.set(key(from, to, off), b);
  }
  out.sort((p, q) => p.from - q.from || p.shell - q.shell || p.to - q.to || cmpOffset(p.offset, q.offset));
  return out;
}

function cmpOffset(a: number[], b: number[]): number {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i] - b[i];
  return 0;
}

/** Cell index of cell coordinates, axis 0 fastest. */
export function cellIndex(cell: number[], size: number[]): number {
  let idx = 0;
  for (let a = size.length - 1; a >= 0; a--) idx = idx * size[a] + cell[a];
  return idx;
}

/** Lay the cell bonds on the finite cluster. Bond order: by `from` site, then by cell bond. */
export function layBonds(
  cellBonds: CellBond[],
  nBasis: number,
  size: number[],
  boundary: BoundaryKind[],
): Bond[] {
  const dim = size.length;
  const nCells = size.reduce((p, q) => p * q, 1);
  const bySub: CellBond[][] = Array.from({ length: nBasis }, () => []);
  for (const b of cellBonds) bySub[b.from].push(b);
  const bonds: Bond[] = [];
  const c = new Array<number>(dim).fill(0);
  const t = new Array<number>(dim).fill(0);
  for (let ci = 0; ci < nCells; ci++) {
    let rest = ci;
    for (let a = 0; a < dim; a++) {
      c[a] = rest % size[a];
      rest = Math.floor(rest / size[a]);
    }
    for (let s = 0; s < nBasis; s++) {
      next: for (const cb of bySub[s]) {
        const wrap = new Array<number>(dim).fill(0);
        for (let a = 0; a < dim; a++) {
          const raw = c[a] + cb.offset[a];
          if (boundary[a] === 'open') {
            if (raw < 0 || raw >= size[a]) continue next;
            t[a] = raw;
          } else {
            wrap[a] = Math.floor(raw / size[a]);
            t[a] = raw - wrap[a] * size[a];
          }
        }
        bonds.push({
          index: bonds.length,
          from: ci * nBasis + s,
          to: cellIndex(t, size) * nBasis + cb.to,
          dx: cb.dx,
          dy: cb.dy,
          shell: cb.shell,
          classes: cb.classes.slice(),
          wrap,
        });
      }
    }
  }
  return bonds;
}

/** Whether two cell bonds land on the same unordered pair of sites (or one on a single site) on this cluster. */
function collide(p: CellBond, q: CellBond | null, size: number[], boundary: BoundaryKind[]): boolean {
  const same = (u: number[], v: number[]) =>
    u.every((x, a) => (boundary[a] === 'open' ? x === v[a] : (((x - v[a]) % size[a]) + size[a]) % size[a] === 0));
  const zero = p.offset.map(() => 0);
  if (q === null)
    return p.from === p.to && (same(p.offset, zero) || same(p.offset, p.offset.map((o) => -o)));
  if (p.from === q.from && p.to === q.to && same(p.offset, q.offset)) return true;
  return p.from === q.to && p.to === q.from && same(p.offset, q.offset.map((o) => -o));
}

/** First colliding pair of cell bonds (q = null for a bond onto its own site), or undefined. */
function findCollision(
  cellBonds: CellBond[],
  size: number[],
  boundary: BoundaryKind[],
): [CellBond, CellBond | null] | undefined {
  for (let i = 0; i < cellBonds.length; i++) {
    const p = cellBonds[i];
    // An open axis that the bond cannot fit in never produces the bond at all.
    if (p.offset.some((o, a) => boundary[a] === 'open' && Math.abs(o) >= size[a])) continue;
    if (collide(p, null, size, boundary)) return [p, null];
    for (let j = i + 1; j < cellBonds.length; j++) {
      const q = cellBonds[j];
      if (q.offset.some((o, a) => boundary[a] === 'open' && Math.abs(o) >= size[a])) continue;
      if (collide(p, q, size, boundary)) return [p, q];
    }
  }
  return undefined;
}

/**
 * Refuse a periodic cluster too small for its bonds to be unambiguous (see the file comment).
 * The error names the first axis whose growth removes the ambiguity and the length needed.
 */
export function checkDistinctPairs(cellBonds: CellBond[], size: number[], boundary: BoundaryKind[]): void {
  const hit = findCollision(cellBonds, size, boundary);
  if (!hit) return;
  const [p, q] = hit;
  const classes = [...new Set([...p.classes, ...(q?.classes ?? [])])].join(', ') || `shell ${p.shell}`;
  const what =
    q === null
      ? `a bond of class ${classes} would join a site to itself, or join the same pair of sites twice (once each way round the periodic axis)`
      : `two different periodic images of bonds (${classes}) would join the same pair of sites`;
  const hints: string[] = [];
  for (let a = 0; a < size.length; a++) {
    if (boundary[a] !== 'periodic') continue;
    for (let l = size[a] + 1; l <= size[a] + 64; l++) {
      const trial = size.slice();
      trial[a] = l;
      if (!findCollision(cellBonds, trial, boundary)) {
        hints.push(`axis ${a} needs length ≥ ${l} (has ${size[a]})`);
        break;
      }
    }
  }
  throw new SpecError([
    {
      path: '$.lattice.size',
      message:
        `periodic cluster too small for the neighbour shells in use: ${what}` +
        (hints.length ? `; ${hints.join(' or ')}` : '; enlarge the periodic axes'),
    },
  ]);
}
