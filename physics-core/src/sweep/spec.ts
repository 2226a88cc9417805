/**
 * Sweep spec v1 (`phasewright.sweep/1`): a plan over model parameters. One axis is a cut, two a
 * grid, three a stack of grids (the third axis counts the layers).
 *
 * ```json
 * { "spec": "phasewright.sweep/1", "name": "chain, V cut",
 *   "model": { "spec": "phasewright.model/1", … },
 *   "axes": [{ "parameter": "V", "kind": "linear", "from": 0, "to": 4, "points": 21 }],
 *   "method": "ed", "solver": { … }, "observables": ["energyPerSite", "fidelitySusceptibility"],
 *   "seed": 7, "refine": { "maxDepth": 3, "on": ["label", "fidelity"] } }
 * ```
 */
import { SpecError } from '../errors.js';
import type { ModelSpec } from '../model/types.js';
import type { Method } from '../result.js';
import { checkModelSpec } from './model-check.js';

export const SWEEP_SPEC_ID = 'phasewright.sweep/1';

export type AxisKind = 'linear' | 'log' | 'list';

export interface LinearAxisSpec {
  parameter: string;
  kind: 'linear' | 'log';
  from: number;
  to: number;
  /** Number of coarse points including both ends (≥ 1). */
  points: number;
}

export interface ListAxisSpec {
  parameter: string;
  kind: 'list';
  /** Strictly increasing or strictly decreasing values. */
  values: number[];
}

export type AxisSpec = LinearAxisSpec | ListAxisSpec;

export type RefineCriterion = 'label' | 'fidelity';

export interface RefineSpec {
  /** Number of halvings of a coarse cell (0 = no refinement). @default 0 */
  maxDepth: number;
  /** Split a cell when its corners carry different labels and/or it touches a fidelity peak. @default ['label'] */
  on: RefineCriterion[];
  /** Scalar observable searched for peaks. @default 'fidelitySusceptibility' */
  fidelityObservable?: string;
  /** A peak must exceed both neighbours along an axis by this relative margin. @default 0.05 */
  fidelityContrast?: number;
}

export interface SweepSpec {
  spec: typeof SWEEP_SPEC_ID;
  name?: string;
  model: ModelSpec;
  axes: AxisSpec[];
  method: Method;
  /** Options handed to the solver unchanged (see the solver's options). @default {} */
  solver?: Record<string, unknown>;
  /** Observables kept per point (names as in `extractObservables`); all when absent. */
  observables?: string[];
  /** Seed of the random starts; each point derives its own from it and its key. @default 0 */
  seed?: number;
  refine?: RefineSpec;
}

/** Refuse plans larger than this (a typo like `points: 1e6` should not start a month-long run). */
export const MAX_SWEEP_POINTS = 1_000_000;
export const MAX_REFINE_DEPTH = 10;

type Issues = { path: string; message: string }[];

const isRecord = (x: unknown): x is Record<string, unknown> =>
  typeof x === 'object' && x !== null && !Array.isArray(x);
const isFiniteNumber = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

function unknownKeys(obj: Record<string, unknown>, allowed: string[], path: string, issues: Issues): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key)) issues.push({ path: `${path}.${key}`, message: `unknown field "${key}" (allowed: ${allowed.join(', ')})` });
  }
}

function checkAxis(raw: unknown, path: string, model: ModelSpec | undefined, issues: Issues): AxisSpec | undefined {
  if (!isRecord(raw)) {
    issues.push({ path, message: 'an axis must be an object {parameter, kind, …}' });
    return undefined;
  }
  const before = issues.length;
  const { parameter, kind } = raw;
  if (typeof parameter !== 'string' || parameter === '') {
    issues.push({ path: `${path}.parameter`, message: 'must name a model parameter' });
  } else if (model && isRecord(model.parameters) && !(parameter in model.parameters)) {
    const known = Object.keys(model.parameters).join(', ') || 'none';
    issues.push({ path: `${path}.parameter`, message: `"${parameter}" is not a parameter of the model (parameters: ${known})` });
  }
  if (kind === 'linear' || kind === 'log') {
    unknownKeys(raw, ['parameter', 'kind', 'from', 'to', 'points'], path, issues);
    for (const f of ['from', 'to'] as const) {
      if (!isFiniteNumber(raw[f])) issues.push({ path: `${path}.${f}`, message: 'must be a finite number' });
    }
    if (!Number.isInteger(raw.points) || (raw.points as number) < 1) {
      issues.push({ path: `${path}.points`, message: 'must be an integer ≥ 1' });
    }
    if (kind === 'log' && isFiniteNumber(raw.from) && isFiniteNumber(raw.to) && !(raw.from * raw.to > 0)) {
      issues.push({ path: `${path}.from`, message: 'a log axis needs from and to of the same sign, both non-zero' });
    }
    if (isFiniteNumber(raw.from) && raw.from === raw.to && (raw.points as number) > 1) {
      issues.push({ path: `${path}.to`, message: 'from and to are equal; use points: 1 or a list' });
    }
    if (issues.length > before) return undefined;
    return { parameter: parameter as string, kind, from: raw.from as number, to: raw.to as number, points: raw.points as number };
  }
  if (kind === 'list') {
    unknownKeys(raw, ['parameter', 'kind', 'values'], path, issues);
    const values = raw.values;
    if (!Array.isArray(values) || values.length === 0) {
      issues.push({ path: `${path}.values`, message: 'must be a non-empty array of numbers' });
      return undefined;
    }
    values.forEach((v, i) => {
      if (!isFiniteNumber(v)) issues.push({ path: `${path}.values[${i}]`, message: 'must be a finite number' });
    });
    if (issues.length > before) return undefined;
    const nums = values as number[];
    const sign = Math.sign(nums[nums.length - 1] - nums[0]);
    for (let i = 1; i < nums.length; i++) {
      if (Math.sign(nums[i] - nums[i - 1]) !== sign || sign === 0) {
        issues.push({ path: `${path}.values[${i}]`, message: 'values must be strictly increasing or strictly decreasing' });
        break;
      }
    }
    if (issues.length > before) return undefined;
    return { parameter: parameter as string, kind, values: [...nums] };
  }
  issues.push({ path: `${path}.kind`, message: `must be "linear", "log" or "list" (got ${JSON.stringify(kind)})` });
  return undefined;
}

function checkRefine(raw: unknown, path: string, issues: Issues): RefineSpec | undefined {
  if (!isRecord(raw)) {
    issues.push({ path, message: 'must be an object {maxDepth, on}' });
    return undefined;
  }
  unknownKeys(raw, ['maxDepth', 'on', 'fidelityObservable', 'fidelityContrast'], path, issues);
  const out: RefineSpec = { maxDepth: 0, on: ['label'] };
  if (raw.maxDepth !== undefined) {
    if (!Number.isInteger(raw.maxDepth) || (raw.maxDepth as number) < 0 || (raw.maxDepth as number) > MAX_REFINE_DEPTH) {
      issues.push({ path: `${path}.maxDepth`, message: `must be an integer from 0 to ${MAX_REFINE_DEPTH}` });
    } else out.maxDepth = raw.maxDepth as number;
  }
  if (raw.on !== undefined) {
    if (!Array.isArray(raw.on)) issues.push({ path: `${path}.on`, message: 'must be an array of "label" and/or "fidelity"' });
    else {
      raw.on.forEach((c, i) => {
        if (c !== 'label' && c !== 'fidelity') issues.push({ path: `${path}.on[${i}]`, message: `must be "label" or "fidelity" (got ${JSON.stringify(c)})` });
      });
      out.on = [...new Set(raw.on as RefineCriterion[])];
    }
  }
  if (raw.fidelityObservable !== undefined) {
    if (typeof raw.fidelityObservable !== 'string' || raw.fidelityObservable === '') issues.push({ path: `${path}.fidelityObservable`, message: 'must be an observable name' });
    else out.fidelityObservable = raw.fidelityObservable;
  }
  if (raw.fidelityContrast !== undefined) {
    if (!isFiniteNumber(raw.fidelityContrast) || raw.fidelityContrast < 0) issues.push({ path: `${path}.fidelityContrast`, message: 'must be a number ≥ 0' });
    else out.fidelityContrast = raw.fidelityContrast;
  }
  return out;
}

/** Number of coarse points along an axis. */
export function axisLength(axis: AxisSpec): number {
  return axis.kind === 'list' ? axis.values.length : axis.points;
}

/**
 * Validates a parsed JSON value as a sweep spec v1; returns a typed copy. Throws SpecError listing
 * every problem with its JSON path (`$.axes[1].parameter`, `$.model.terms[0].amplitude`, …).
 */
export function parseSweepSpec(json: unknown): SweepSpec {
  const issues: Issues = [];
  if (!isRecord(json)) throw new SpecError([{ path: '$', message: 'a sweep spec must be a JSON object' }]);
  if (json.spec !== SWEEP_SPEC_ID) {
    const got = JSON.stringify(json.spec);
    const newer = typeof json.spec === 'string' && /^phasewright\.sweep\/(\d+)$/.exec(json.spec);
    issues.push({
      path: '$.spec',
      message: newer && Number(newer[1]) > 1
        ? `this sweep was written by a newer Phasewright (sweep/${newer[1]}); this version reads sweep/1`
        : `must be "${SWEEP_SPEC_ID}" (got ${got})`,
    });
    throw new SpecError(issues);
  }
  unknownKeys(json, ['spec', 'name', 'model', 'axes', 'method', 'solver', 'observables', 'seed', 'refine'], '$', issues);
  if (json.name !== undefined && typeof json.name !== 'string') issues.push({ path: '$.name', message: 'must be a string' });
  const model = checkModelSpec(json.model, '$.model', issues);
  const axes: AxisSpec[] = [];
  if (!Array.isArray(json.axes) || json.axes.length < 1 || json.axes.length > 3) {
    issues.push({ path: '$.axes', message: 'must be an array of 1 (cut), 2 (grid) or 3 (stack of grids) axes' });
  } else {
    const seen = new Map<string, number>();
    json.axes.forEach((raw, i) => {
      const axis = checkAxis(raw, `$.axes[${i}]`, model, issues);
      if (!axis) return;
      const earlier = seen.get(axis.parameter);
      if (earlier !== undefined) issues.push({ path: `$.axes[${i}].parameter`, message: `"${axis.parameter}" is already swept by $.axes[${earlier}]` });
      seen.set(axis.parameter, i);
      axes.push(axis);
    });
  }
  if (json.method !== 'ed' && json.method !== 'meanfield') {
    issues.push({ path: '$.method', message: `must be "ed" or "meanfield" (got ${JSON.stringify(json.method)})` });
  }
  if (json.solver !== undefined && !isRecord(json.solver)) issues.push({ path: '$.solver', message: 'must be an object of solver options' });
  if (json.observables !== undefined) {
    if (!Array.isArray(json.observables)) issues.push({ path: '$.observables', message: 'must be an array of observable names' });
    else json.observables.forEach((o, i) => {
      if (typeof o !== 'string' || o === '') issues.push({ path: `$.observables[${i}]`, message: 'must be an observable name' });
    });
  }
  if (json.seed !== undefined && (!Number.isInteger(json.seed) || (json.seed as number) < 0 || (json.seed as number) > 0xffffffff)) {
    issues.push({ path: '$.seed', message: 'must be an integer from 0 to 4294967295' });
  }
  const refine = json.refine === undefined ? undefined : checkRefine(json.refine, '$.refine', issues);
  if (issues.length === 0) {
    const total = axes.reduce((n, a) => n * axisLength(a), 1);
    if (total > MAX_SWEEP_POINTS) issues.push({ path: '$.axes', message: `${total} coarse points exceed the limit of ${MAX_SWEEP_POINTS}` });
  }
  if (issues.length > 0) throw new SpecError(issues);
  const out: SweepSpec = { spec: SWEEP_SPEC_ID, model: model as ModelSpec, axes, method: json.method as Method };
  if (typeof json.name === 'string') out.name = json.name;
  if (json.solver !== undefined) out.solver = structuredClone(json.solver as Record<string, unknown>);
  if (json.observables !== undefined) out.observables = [...(json.observables as string[])];
  if (json.seed !== undefined) out.seed = json.seed as number;
  if (refine) out.refine = refine;
  return out;
}
