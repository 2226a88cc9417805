/**
 * Adaptive refinement and boundary tracing: pure functions of a sweep and the points computed so
 * far. The first one or two axes with at least two points are refined (bisection in 1D,
 * quadtree in 2D); a third axis counts layers, each refined on its own.
 *
 * A cell of grid size h (in coarse-grid units) is split when it is a leaf (its centre has not
 * been computed), its depth is below `maxDepth`, and
 * - `label`: the points on its border (corners and any finer points on its edges) carry
 *   different phase labels, or
 * - `fidelity`: one of its corners is a local maximum of the fidelity susceptibility along an
 *   axis at spacing h (at the coarse level it must also exceed the smaller neighbour by
 *   `fidelityContrast`, so that flat noise does not trigger refinement).
 * Splitting adds the centre and edge midpoints (1 point in 1D, 5 in 2D, minus those present).
 *
 * Peaks of the fidelity susceptibility and changes of label on a finite cluster or in mean-field
 * indicate transitions; they do not prove them (finite-size shifts, mean-field artefacts).
 */
import type { WorkItem } from './plan.js';
import { axisValue, itemAt } from './plan.js';
import type { SweepSpec } from './spec.js';
import { axisLength } from './spec.js';

/** What refinement needs of a point. */
export interface RefinablePoint {
  label?: { id: string };
  observables: Record<string, unknown>;
}

export type PointLookup = Record<string, RefinablePoint>;

interface Geometry {
  sweep: SweepSpec;
  sizes: number[];
  /** Axes refined (1 or 2 of them). */
  refined: number[];
  /** The remaining axes: each coarse value is a layer. */
  layers: number[];
  maxDepth: number;
}

function geometry(sweep: SweepSpec): Geometry {
  const sizes = sweep.axes.map(axisLength);
  const refined = [0, 1].filter((a) => a < sizes.length && sizes[a] >= 2);
  const layers = sizes.map((_, a) => a).filter((a) => !refined.includes(a));
  return { sweep, sizes, refined, layers, maxDepth: sweep.refine?.maxDepth ?? 0 };
}

const keyAt = (g: Geometry, coords: number[]): string => itemAt(g.sweep, coords, 0).key;

/** All combinations of `values` over `k` slots. */
function tuples(k: number, values: number[]): number[][] {
  let out: number[][] = [[]];
  for (let i = 0; i < k; i++) out = out.flatMap((t) => values.map((v) => [...t, v]));
  return out;
}

/** Coarse cells: origins of every unit cell of the refined axes, for every layer. */
function coarseCells(g: Geometry): number[][] {
  let origins: number[][] = [[]];
  for (let a = 0; a < g.sizes.length; a++) {
    const n = g.refined.includes(a) ? g.sizes[a] - 1 : g.sizes[a];
    const next: number[][] = [];
    for (const o of origins) for (let i = 0; i < n; i++) next.push([...o, i]);
    origins = next;
  }
  return origins;
}

function offset(g: Geometry, origin: number[], steps: number[], h: number): number[] {
  const c = [...origin];
  g.refined.forEach((a, i) => {
    c[a] = origin[a] + steps[i] * h;
  });
  return c;
}

/** Points on the segment from a to b (grid coords) that exist, including finer hanging points, in order; a and b included. */
function edgeChain(g: Geometry, points: PointLookup, a: number[], b: number[], depthLeft: number): number[][] {
  const mid = a.map((x, i) => (x + b[i]) / 2);
  if (depthLeft > 0 && points[keyAt(g, mid)]) {
    const left = edgeChain(g, points, a, mid, depthLeft - 1);
    const right = edgeChain(g, points, mid, b, depthLeft - 1);
    return [...left, ...right.slice(1)];
  }
  return [a, b];
}

interface Leaf {
  origin: number[];
  h: number;
  depth: number;
}

function leaves(g: Geometry, points: PointLookup): Leaf[] {
  const out: Leaf[] = [];
  const k = g.refined.length;
  const visit = (origin: number[], h: number, depth: number) => {
    const centre = offset(g, origin, new Array(k).fill(0.5), h);
    if (depth < g.maxDepth && points[keyAt(g, centre)]) {
      for (const t of tuples(k, [0, 0.5])) visit(offset(g, origin, t, h), h / 2, depth + 1);
    } else out.push({ origin, h, depth });
  };
  if (k === 0) return out;
  for (const origin of coarseCells(g)) visit(origin, 1, 0);
  return out;
}

/** The border of a leaf as a closed walk of existing grid points (1D: its two ends). */
function border(g: Geometry, points: PointLookup, leaf: Leaf): number[][] {
  const { origin, h } = leaf;
  const left = g.maxDepth - leaf.depth;
  if (g.refined.length === 1) return [origin, offset(g, origin, [1], h)];
  const c = [[0, 0], [1, 0], [1, 1], [0, 1]].map((t) => offset(g, origin, t, h));
  const walk: number[][] = [];
  for (let e = 0; e < 4; e++) walk.push(...edgeChain(g, points, c[e], c[(e + 1) % 4], left).slice(0, -1));
  return walk;
}

function scalar(p: RefinablePoint | undefined, name: string): number | undefined {
  const v = p?.observables[name];
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

function isFidelityPeak(g: Geometry, points: PointLookup, c: number[], h: number, depth: number): boolean {
  const name = g.sweep.refine?.fidelityObservable ?? 'fidelitySusceptibility';
  const contrast = g.sweep.refine?.fidelityContrast ?? 0.05;
  const v = scalar(points[keyAt(g, c)], name);
  if (v === undefined) return false;
  return g.refined.some((a) => {
    const lo = [...c];
    const hi = [...c];
    lo[a] -= h;
    hi[a] += h;
    if (lo[a] < 0 || hi[a] > g.sizes[a] - 1) return false;
    const vl = scalar(points[keyAt(g, lo)], name);
    const vh = scalar(points[keyAt(g, hi)], name);
    if (vl === undefined || vh === undefined || !(v > vl && v > vh)) return false;
    return depth > 0 || v >= (1 + contrast) * Math.min(vl, vh);
  });
}

/**
 * The next round of refinement: the points to compute (not yet in `points`), in a snake-like
 * order (sorted by layer, then along the refined axes), each with `level` = its cell depth + 1.
 */
export function refineItems(sweep: SweepSpec, points: PointLookup): WorkItem[] {
  const g = geometry(sweep);
  const on = sweep.refine?.on ?? ['label'];
  if (g.maxDepth === 0 || g.refined.length === 0) return [];
  const k = g.refined.length;
  const found = new Map<string, WorkItem>();
  for (const leaf of leaves(g, points)) {
    if (leaf.depth >= g.maxDepth) continue;
    const walk = border(g, points, leaf);
    const labels = walk.map((c) => points[keyAt(g, c)]?.label?.id);
    let split = false;
    if (on.includes('label')) split = new Set(labels.filter((l) => l !== undefined)).size > 1;
    if (!split && on.includes('fidelity')) {
      split = tuples(k, [0, 1]).some((t) => isFidelityPeak(g, points, offset(g, leaf.origin, t, leaf.h), leaf.h, leaf.depth));
    }
    if (!split) continue;
    for (const t of tuples(k, [0, 0.5, 1])) {
      if (t.every((x) => x !== 0.5)) continue;
      const item = itemAt(sweep, offset(g, leaf.origin, t, leaf.h), leaf.depth + 1);
      if (!points[item.key] && !found.has(item.key)) found.set(item.key, item);
    }
  }
  const order = [...g.layers, ...[...g.refined].reverse()];
  return [...found.values()].sort((x, y) => {
    for (const a of order) if (x.coords[a] !== y.coords[a]) return x.coords[a] - y.coords[a];
    return 0;
  });
}

/* ----------------------------------------------------------------------- boundaries -- */

export interface BoundaryVertex {
  /** Position in parameter values (swept parameters). */
  at: Record<string, number>;
  /** Half the size of the finest cell that brackets this crossing, per swept parameter (0 where exact). */
  uncertainty: Record<string, number>;
}

export interface Boundary {
  /** The two labels the boundary separates, sorted. */
  between: [string, string];
  /** Values of the layer (non-refined) axes. */
  layer: Record<string, number>;
  /** A polyline (1D sweeps: one vertex). */
  vertices: BoundaryVertex[];
}

interface Crossing {
  u: number[];
  pair: [string, string];
  /** Half-span along each axis, in grid units (for the uncertainty). */
  half: number[];
}

function toVertex(g: Geometry, c: { u: number[]; half: number[] }): BoundaryVertex {
  const at: Record<string, number> = {};
  const uncertainty: Record<string, number> = {};
  g.sweep.axes.forEach((axis, a) => {
    at[axis.parameter] = axisValue(axis, c.u[a]);
    uncertainty[axis.parameter] = c.half[a] === 0
      ? 0
      : Math.abs(axisValue(axis, c.u[a] + c.half[a]) - axisValue(axis, c.u[a] - c.half[a])) / 2;
  });
  return { at, uncertainty };
}

const coordKey = (u: number[]) => u.join(' ');

/**
 * Phase boundaries traced through the leaves: a crossing on every border step between
 * differently labelled points (placed at the step's midpoint, uncertain by half the step), joined
 * into polylines per label pair (2D; a cell with more than two crossings joins them at its
 * centre). Unlabelled points are ignored.
 */
export function traceBoundaries(sweep: SweepSpec, points: PointLookup): Boundary[] {
  const g = geometry(sweep);
  const k = g.refined.length;
  if (k === 0) return [];
  const layerOf = (u: number[]) => {
    const layer: Record<string, number> = {};
    for (const a of g.layers) layer[sweep.axes[a].parameter] = axisValue(sweep.axes[a], u[a]);
    return layer;
  };
  const crossingBetween = (a: number[], b: number[]): Crossing | undefined => {
    const la = points[keyAt(g, a)]?.label?.id;
    const lb = points[keyAt(g, b)]?.label?.id;
    if (la === undefined || lb === undefined || la === lb) return undefined;
    return {
      u: a.map((x, i) => (x + b[i]) / 2),
      pair: (la < lb ? [la, lb] : [lb, la]) as [string, string],
      half: a.map((x, i) => Math.abs(b[i] - x) / 2),
    };
  };
  const allLeaves = leaves(g, points);
  if (k === 1) {
    const out: Boundary[] = [];
    for (const leaf of allLeaves) {
      const [a, b] = border(g, points, leaf);
      const c = crossingBetween(a, b);
      if (c) out.push({ between: c.pair, layer: layerOf(a), vertices: [toVertex(g, c)] });
    }
    return out;
  }
  // 2D: segments per (layer, pair), then chained into polylines.
  const groups = new Map<string, { pair: [string, string]; layer: Record<string, number>; segments: [Crossing, Crossing][] }>();
  for (const leaf of allLeaves) {
    const walk = border(g, points, leaf);
    const crossings: Crossing[] = [];
    for (let i = 0; i < walk.length; i++) {
      const c = crossingBetween(walk[i], walk[(i + 1) % walk.length]);
      if (c) crossings.push(c);
    }
    if (crossings.length < 2) continue;
    const layer = layerOf(leaf.origin);
    const add = (a: Crossing, b: Crossing, pair: [string, string]) => {
      const id = `${JSON.stringify(layer)}|${pair.join('|')}`;
      const grp = groups.get(id) ?? { pair, layer, segments: [] };
      grp.segments.push([a, b]);
      groups.set(id, grp);
    };
    if (crossings.length === 2 && crossings[0].pair.join() === crossings[1].pair.join()) {
      add(crossings[0], crossings[1], crossings[0].pair);
    } else {
      const centre: Crossing = {
        u: offset(g, leaf.origin, [0.5, 0.5], leaf.h),
        pair: crossings[0].pair,
        half: leaf.origin.map((_, a) => (g.refined.includes(a) ? leaf.h / 2 : 0)),
      };
      for (const c of crossings) add(c, { ...centre, pair: c.pair }, c.pair);
    }
  }
  const out: Boundary[] = [];
  for (const grp of groups.values()) {
    const adj = new Map<string, { c: Crossing; seg: number }[]>();
    grp.segments.forEach(([a, b], i) => {
      for (const [x, y] of [[a, b], [b, a]] as const) {
        const list = adj.get(coordKey(x.u)) ?? [];
        list.push({ c: y, seg: i });
        adj.set(coordKey(x.u), list);
      }
    });
    const used = new Set<number>();
    const vertexOf = new Map<string, Crossing>();
    for (const [a, b] of grp.segments) {
      vertexOf.set(coordKey(a.u), a);
      vertexOf.set(coordKey(b.u), b);
    }
    // Start at open ends (degree ≠ 2) first, then close loops.
    const starts = [...adj.keys()].sort((x, y) => (adj.get(x)!.length === 2 ? 1 : 0) - (adj.get(y)!.length === 2 ? 1 : 0));
    for (const start of starts) {
      for (;;) {
        const first = adj.get(start)!.find((e) => !used.has(e.seg));
        if (!first) break;
        const line: Crossing[] = [vertexOf.get(start)!];
        let edge: { c: Crossing; seg: number } | undefined = first;
        while (edge) {
          used.add(edge.seg);
          line.push(edge.c);
          edge = adj.get(coordKey(edge.c.u))!.find((e) => !used.has(e.seg));
        }
        out.push({ between: grp.pair, layer: grp.layer, vertices: line.map((c) => toVertex(g, c)) });
      }
    }
  }
  return out;
}

/** Key of the point at grid coordinates (exported for tests and tools). */
export function keyAtCoords(sweep: SweepSpec, coords: number[]): string {
  return itemAt(sweep, coords, 0).key;
}
