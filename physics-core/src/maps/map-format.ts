/**
 * Map format v1 (`phasewright.map/1`): the result of a sweep. Points are keyed by their canonical
 * parameter key (`J=1,V=0.5`); each holds its best result (energy, kept observables, phase label
 * with evidence, convergence, wall time, where and when it was computed), plus the summaries of
 * other results for the same point: `disputed` (ED results that disagree beyond tolerance) and
 * `history` (results that lost to it or confirmed it). Files are canonical JSON, so a round trip
 * is lossless and equal maps are equal bytes.
 */
import { SpecError } from '../errors.js';
import type { Convergence, PhaseLabel } from '../result.js';
import { parseSweepSpec, type SweepSpec } from '../sweep/spec.js';
import { canonicalJson, insertMembers } from './canonical-json.js';

export const MAP_SPEC_ID = 'phasewright.map/1';

/** Where a computation ran. */
export interface RuntimeInfo {
  kind: 'node' | 'browser';
  /** Node version or the browser's user agent. */
  version: string;
  cores: number;
}

/** A scalar, a list (e.g. site densities) or a table (e.g. rows [qx, qy, S(q)]). */
export type ObservableValue = number | number[] | number[][];

/** Who computed a result, where and when. */
export interface ComputedBy {
  /** ISO 8601 time the point finished. */
  at: string;
  runtime: RuntimeInfo;
  author?: string;
}

/** One result for one point, without its observables (what history and disputes keep). */
export interface PointSummary {
  energy: number;
  label?: PhaseLabel;
  convergence: Convergence;
  wallMs: number;
  seed: number;
  computed: ComputedBy;
  warnings?: string[];
}

/** One full result for one point. */
export interface PointRecord extends PointSummary {
  observables: Record<string, ObservableValue>;
}

export interface MapPoint extends PointRecord {
  parameters: Record<string, number>;
  /** Refinement depth at which the point was added (0 = coarse grid). */
  level: number;
  /** ED results for this point that disagree with this one beyond tolerance (sorted canonically). */
  disputed?: PointSummary[];
  /** Results that lost to this one (mean-field: higher energy) or confirmed it (ED within tolerance). */
  history?: PointSummary[];
}

/** Who wrote (part of) a map. A fresh map has one source; a merged map lists all. */
export interface MapSource {
  author?: string;
  createdAt: string;
  finishedAt?: string;
  runtime: RuntimeInfo;
}

export interface MapProvenance {
  author?: string;
  createdAt: string;
  /** Absent while the run is still going (a checkpoint). */
  finishedAt?: string;
  runtime: RuntimeInfo;
  seeds: number[];
  coreVersion: string;
  /** Unconverged points, degenerate ground states, refused sizes, … (sorted, unique). */
  warnings: string[];
  /** Every run that contributed points (sorted canonically); the first one is the map's `author`/`runtime`. */
  sources: MapSource[];
}

export interface PhaseMap {
  spec: typeof MAP_SPEC_ID;
  /** Map identity: see `mapIdentity` (model + sweep + solver options + core version). */
  id: string;
  sweep: SweepSpec;
  points: Record<string, MapPoint>;
  provenance: MapProvenance;
}

/* ---------------------------------------------------------------------------- parsing -- */

type Issues = { path: string; message: string }[];
const isRecord = (x: unknown): x is Record<string, unknown> =>
  typeof x === 'object' && x !== null && !Array.isArray(x);
const isNum = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

/** Records an issue at `path` + `suffix` unless `cond` (the path text is built only for an issue). */
function need(cond: boolean, issues: Issues, path: string, suffix: string, message: string): boolean {
  if (!cond) issues.push({ path: path + suffix, message });
  return cond;
}

function checkRuntime(x: unknown, path: string, issues: Issues): void {
  if (!need(isRecord(x), issues, path, '', 'must be {kind, version, cores}')) return;
  const r = x as Record<string, unknown>;
  need(r.kind === 'node' || r.kind === 'browser', issues, path, '.kind', 'must be "node" or "browser"');
  need(typeof r.version === 'string', issues, path, '.version', 'must be a string');
  need(Number.isInteger(r.cores) && (r.cores as number) >= 1, issues, path, '.cores', 'must be an integer ≥ 1');
}

function checkSummary(x: unknown, path: string, issues: Issues, full: boolean): void {
  if (!need(isRecord(x), issues, path, '', 'must be an object')) return;
  const p = x as Record<string, unknown>;
  need(isNum(p.energy), issues, path, '.energy', 'must be a finite number');
  need(isNum(p.wallMs) && (p.wallMs as number) >= 0, issues, path, '.wallMs', 'must be a number ≥ 0');
  need(Number.isInteger(p.seed), issues, path, '.seed', 'must be an integer');
  if (need(isRecord(p.convergence), issues, path, '.convergence', 'must be {converged, iterations, residual}')) {
    const c = p.convergence as Record<string, unknown>;
    need(typeof c.converged === 'boolean', issues, path, '.convergence.converged', 'must be true or false');
    need(isNum(c.iterations), issues, path, '.convergence.iterations', 'must be a number');
    need(isNum(c.residual), issues, path, '.convergence.residual', 'must be a finite number');
  }
  if (p.label !== undefined && need(isRecord(p.label), issues, path, '.label', 'must be {id, confidence, evidence}')) {
    const l = p.label as Record<string, unknown>;
    need(typeof l.id === 'string', issues, path, '.label.id', 'must be a string');
    need(isNum(l.confidence), issues, path, '.label.confidence', 'must be a number');
    need(isRecord(l.evidence), issues, path, '.label.evidence', 'must be an object');
  }
  if (need(isRecord(p.computed), issues, path, '.computed', 'must be {at, runtime}')) {
    const c = p.computed as Record<string, unknown>;
    need(typeof c.at === 'string', issues, path, '.computed.at', 'must be an ISO time');
    checkRuntime(c.runtime, `${path}.computed.runtime`, issues);
  }
  if (p.warnings !== undefined) {
    need(Array.isArray(p.warnings) && p.warnings.every((w) => typeof w === 'string'), issues, path, '.warnings', 'must be an array of strings');
  }
  if (full && need(isRecord(p.observables), issues, path, '.observables', 'must be an object')) {
    for (const [name, v] of Object.entries(p.observables as Record<string, unknown>)) {
      const ok = isNum(v) ||
        (Array.isArray(v) && v.every((e) => isNum(e) || (Array.isArray(e) && e.every(isNum))));
      if (!ok) need(ok, issues, path, `.observables.${name}`, 'must be a finite number, a list of numbers or a table of numbers');
    }
  }
}

/**
 * Validates a parsed JSON value as a map v1. Throws SpecError with JSON paths; a map of a newer
 * format version is refused with a message saying so.
 */
export function parseMap(json: unknown): PhaseMap {
  const sweep = validateMap(json);
  const map = cloneJson(json) as PhaseMap;
  map.sweep = sweep;
  return map;
}

/**
 * A deep copy of a JSON value (what structuredClone gives for plain data, without its cost); a
 * part that is not plain JSON data (a Date, a typed array, an own "__proto__" member, …) is copied
 * by structuredClone.
 */
function cloneJson(x: unknown): unknown {
  if (typeof x !== 'object' || x === null) return x;
  const proto: unknown = Object.getPrototypeOf(x);
  if (proto === Array.prototype) {
    const a = x as unknown[];
    const out: unknown[] = new Array<unknown>(a.length);
    for (let i = 0; i < a.length; i++) {
      if (!(i in a)) return structuredClone(x);
      out[i] = cloneJson(a[i]);
    }
    return out;
  }
  if (proto !== Object.prototype || Object.prototype.hasOwnProperty.call(x, '__proto__')) return structuredClone(x);
  const r = x as Record<string, unknown>;
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(r)) out[key] = cloneJson(r[key]);
  return out;
}

/** Checks a parsed JSON value as a map v1 (throws SpecError with JSON paths) and returns its parsed sweep. */
function validateMap(json: unknown): SweepSpec {
  if (!isRecord(json)) throw new SpecError([{ path: '$', message: 'a map must be a JSON object' }]);
  if (json.spec !== MAP_SPEC_ID) {
    const m = typeof json.spec === 'string' ? /^phasewright\.map\/(\d+)$/.exec(json.spec) : null;
    const message = m && Number(m[1]) > 1
      ? `this map was written by a newer Phasewright (map/${m[1]}); this version reads map/1`
      : `must be "${MAP_SPEC_ID}" (got ${JSON.stringify(json.spec)})`;
    throw new SpecError([{ path: '$.spec', message }]);
  }
  const issues: Issues = [];
  for (const key of Object.keys(json)) {
    if (!['spec', 'id', 'sweep', 'points', 'provenance'].includes(key)) issues.push({ path: `$.${key}`, message: `unknown field "${key}"` });
  }
  need(typeof json.id === 'string' && /^[0-9a-f]{64}$/.test(json.id), issues, '$.id', '', 'must be a SHA-256 in hex');
  let sweep: SweepSpec | undefined;
  try {
    sweep = parseSweepSpec(json.sweep);
  } catch (error) {
    if (!(error instanceof SpecError)) throw error;
    for (const i of error.issues) issues.push({ path: i.path.replace(/^\$/, '$.sweep'), message: i.message });
  }
  if (need(isRecord(json.points), issues, '$.points', '', 'must be an object keyed by point key')) {
    for (const [key, raw] of Object.entries(json.points as Record<string, unknown>)) {
      const path = `$.points[${JSON.stringify(key)}]`;
      checkSummary(raw, path, issues, true);
      if (!isRecord(raw)) continue;
      if (need(isRecord(raw.parameters), issues, path, '.parameters', 'must be an object of numbers')) {
        for (const [n, v] of Object.entries(raw.parameters as Record<string, unknown>)) if (!isNum(v)) need(false, issues, path, `.parameters.${n}`, 'must be a finite number');
      }
      need(Number.isInteger(raw.level) && (raw.level as number) >= 0, issues, path, '.level', 'must be an integer ≥ 0');
      for (const list of ['disputed', 'history'] as const) {
        if (raw[list] === undefined) continue;
        if (need(Array.isArray(raw[list]), issues, path, `.${list}`, 'must be an array')) {
          (raw[list] as unknown[]).forEach((s, i) => checkSummary(s, `${path}.${list}[${i}]`, issues, false));
        }
      }
    }
  }
  const prov = json.provenance;
  if (need(isRecord(prov), issues, '$.provenance', '', 'must be an object')) {
    const p = prov as Record<string, unknown>;
    need(typeof p.createdAt === 'string', issues, '$.provenance.createdAt', '', 'must be an ISO time');
    need(p.finishedAt === undefined || typeof p.finishedAt === 'string', issues, '$.provenance.finishedAt', '', 'must be an ISO time');
    need(p.author === undefined || typeof p.author === 'string', issues, '$.provenance.author', '', 'must be a string');
    checkRuntime(p.runtime, '$.provenance.runtime', issues);
    need(Array.isArray(p.seeds) && p.seeds.every((s) => Number.isInteger(s)), issues, '$.provenance.seeds', '', 'must be an array of integers');
    need(typeof p.coreVersion === 'string', issues, '$.provenance.coreVersion', '', 'must be a string');
    need(Array.isArray(p.warnings) && p.warnings.every((w) => typeof w === 'string'), issues, '$.provenance.warnings', '', 'must be an array of strings');
    if (need(Array.isArray(p.sources) && p.sources.length > 0, issues, '$.provenance.sources', '', 'must be a non-empty array')) {
      (p.sources as unknown[]).forEach((s, i) => {
        const path = `$.provenance.sources[${i}]`;
        if (!need(isRecord(s), issues, path, '', 'must be {createdAt, runtime, …}')) return;
        need(typeof (s as Record<string, unknown>).createdAt === 'string', issues, path, '.createdAt', 'must be an ISO time');
        checkRuntime((s as Record<string, unknown>).runtime, `${path}.runtime`, issues);
      });
    }
  }
  if (issues.length > 0) throw new SpecError(issues);
  return sweep as SweepSpec;
}

/** Parses map text (JSON); a syntax error is reported as a SpecError at `$`. */
export function parseMapText(text: string): PhaseMap {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw new SpecError([{ path: '$', message: `not valid JSON (${(error as Error).message})` }]);
  }
  // A value fresh from JSON.parse is nobody else's: no copy needed.
  return parseOwnedMap(json);
}

/**
 * `parseMap` without the deep copy, for a caller that owns `json` and hands it over (a value fresh
 * from JSON.parse, a request body): same checks, same SpecError issues and paths. On success
 * `json` itself is returned, with its `sweep` replaced by the parsed sweep; the caller must not
 * keep using it as anything but the map. On error `json` is left unchanged.
 */
export function parseOwnedMap(json: unknown): PhaseMap {
  const sweep = validateMap(json);
  const map = json as PhaseMap;
  map.sweep = sweep;
  return map;
}

/** The map as canonical JSON text (sorted keys, shortest round-trip numbers) with a final newline. */
export function serializeMap(map: PhaseMap): string {
  return `${canonicalJson(map)}\n`;
}

/**
 * `canonicalJson(merged)` for a merged point, written faster when it is `stored` (a point read
 * back with JSON.parse from its canonical text `storedText`, with no disputes or history) plus the
 * `disputed`/`history` lists a merge added, every other member being the very same value: the
 * lists' texts are spliced into `storedText` (see insertMembers). Otherwise, or if unsure, the
 * whole point is written. `storedText` must be `canonicalJson(stored)`.
 */
export function mergedPointText(merged: MapPoint, stored: MapPoint, storedText: string): string {
  const m = merged as unknown as Record<string, unknown>;
  const s = stored as unknown as Record<string, unknown>;
  if (s.disputed !== undefined || s.history !== undefined) return canonicalJson(merged);
  const added: [string, string][] = [];
  let n = 0;
  for (const key of Object.keys(m)) {
    const value = m[key];
    if (value === undefined) continue;
    if (key === 'disputed' || key === 'history') {
      added.push([key, canonicalJson(value)]);
      continue;
    }
    n++;
    if (!Object.prototype.hasOwnProperty.call(s, key) || s[key] !== value) return canonicalJson(merged);
  }
  for (const key of Object.keys(s)) if (s[key] !== undefined) n--;
  if (n !== 0) return canonicalJson(merged);
  return insertMembers(storedText, added) ?? canonicalJson(merged);
}
