/**
 * Planning: a pure function from a sweep spec to ordered work items. Points are visited along a
 * boustrophedon ("snake") path so that consecutive points are neighbours on the grid and each can
 * warm-start from the previous one. The path is cut into fixed segments; a segment is the unit of
 * work handed to an executor and always starts cold, so a point's result does not depend on how
 * many workers or chunks ran the sweep.
 */
import { PhasewrightError } from '../errors.js';
import { canonicalNumber } from '../maps/canonical-json.js';
import type { AxisSpec, SweepSpec } from './spec.js';
import { axisLength } from './spec.js';

/** One point to compute. Plain data: it crosses worker boundaries as is. */
export interface WorkItem {
  /** Canonical key of the parameter values (see `pointKey`). */
  key: string;
  /** The swept parameters' values (the model's other parameters keep their spec values). */
  parameters: Record<string, number>;
  /** Grid coordinates per axis: integers on the coarse grid, dyadic fractions after refinement. */
  coords: number[];
  /** Refinement depth (0 = coarse grid). */
  level: number;
}

export interface Plan {
  /** Work items in path order. */
  items: WorkItem[];
  /** Path-contiguous runs of items; each starts cold and warm-starts along itself. */
  segments: WorkItem[][];
}

/** Values computed from the grid are rounded to 12 significant digits so that keys stay readable. */
export function normaliseValue(x: number): number {
  const y = Number(x.toPrecision(12));
  return y === 0 ? 0 : y;
}

/** Value of an axis at grid coordinate u ∈ [0, n−1] (fractional u interpolates, log axes geometrically). */
export function axisValue(axis: AxisSpec, u: number): number {
  if (axis.kind === 'list') {
    const v = axis.values;
    if (Number.isInteger(u)) return v[u];
    const i = Math.min(Math.floor(u), v.length - 2);
    return normaliseValue(v[i] + (u - i) * (v[i + 1] - v[i]));
  }
  const n = axis.points;
  if (n === 1 || u === 0) return axis.from;
  if (u === n - 1) return axis.to;
  const t = u / (n - 1);
  if (axis.kind === 'linear') return normaliseValue(axis.from + t * (axis.to - axis.from));
  return normaliseValue(axis.from * Math.exp(t * Math.log(axis.to / axis.from)));
}

/** Canonical key of a point: parameters sorted by name, `name=value` joined by commas, e.g. `J=1,V=0.5`. */
export function pointKey(parameters: Record<string, number>): string {
  return Object.keys(parameters)
    .sort()
    .map((name) => `${name}=${canonicalNumber(parameters[name], `$.parameters.${name}`)}`)
    .join(',');
}

/** The work item at grid coordinates `coords` (one per axis). */
export function itemAt(sweep: SweepSpec, coords: number[], level: number): WorkItem {
  const parameters: Record<string, number> = {};
  sweep.axes.forEach((axis, a) => {
    parameters[axis.parameter] = axisValue(axis, coords[a]);
  });
  return { key: pointKey(parameters), parameters, coords: [...coords], level };
}

/**
 * Grid coordinates of the p-th point of the boustrophedon path over a grid of `sizes` (axis 0
 * fastest): the digit of axis a is reflected whenever the path index of the slower axes is odd,
 * so consecutive points differ by one step along one axis.
 */
export function snakeCoords(p: number, sizes: number[]): number[] {
  const coords: number[] = [];
  let stride = 1;
  for (let a = 0; a < sizes.length; a++) {
    const n = sizes[a];
    const raw = Math.floor(p / stride) % n;
    const slower = Math.floor(p / (stride * n));
    coords.push(slower % 2 === 1 ? n - 1 - raw : raw);
    stride *= n;
  }
  return coords;
}

/** Default segment length: a sixteenth of the path, between 4 and 64 points. */
export function defaultSegmentLength(total: number): number {
  return Math.max(4, Math.min(64, Math.ceil(total / 16)));
}

/** Cuts a path into consecutive runs of at most `length` items. */
export function segmentPath<T>(items: T[], length: number): T[][] {
  const out: T[][] = [];
  for (let i = 0; i < items.length; i += length) out.push(items.slice(i, i + length));
  return out;
}

export interface PlanOptions {
  /** Points per segment. @default defaultSegmentLength(total) */
  segmentLength?: number;
}

/** The coarse plan of a sweep: every grid point once, in snake order, cut into segments. */
export function planSweep(sweep: SweepSpec, options: PlanOptions = {}): Plan {
  const sizes = sweep.axes.map(axisLength);
  const total = sizes.reduce((a, b) => a * b, 1);
  const items: WorkItem[] = new Array(total);
  for (let p = 0; p < total; p++) items[p] = itemAt(sweep, snakeCoords(p, sizes), 0);
  const length = options.segmentLength ?? defaultSegmentLength(total);
  return { items, segments: segmentPath(items, length) };
}

export interface ChunkSpec {
  /** 1-based chunk number. */
  index: number;
  count: number;
}

/** Parses `i/n` (1 ≤ i ≤ n) as given to `--chunk`. */
export function parseChunk(text: string): ChunkSpec {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || count < 1 || index < 1 || index > count) {
    throw new PhasewrightError(`--chunk must be i/n with 1 ≤ i ≤ n (got "${text}")`, 'usage');
  }
  return { index, count };
}

/**
 * Chunk `index` of `count` (1-based): a contiguous run of whole segments, so chunks keep their
 * warm starts and the union of all chunks is the plan, each point exactly once.
 */
export function chunkPlan(plan: Plan, chunk: ChunkSpec): Plan {
  const s = plan.segments.length;
  const start = Math.floor(((chunk.index - 1) * s) / chunk.count);
  const end = Math.floor((chunk.index * s) / chunk.count);
  const segments = plan.segments.slice(start, end);
  return { items: segments.flat(), segments };
}
