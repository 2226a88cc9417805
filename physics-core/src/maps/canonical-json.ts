/**
 * Canonical JSON: one byte-exact text per value, so that hashes of maps, models and sweeps agree
 * between the PWA, the server and the CLI.
 *
 * - object keys sorted by UTF-16 code units (as `Array.prototype.sort` does), `undefined`
 *   members dropped (as JSON.stringify does);
 * - numbers in JavaScript's shortest round-trip form (`String(x)`), −0 written as 0;
 * - NaN, ±Infinity, `undefined` inside arrays, bigints, functions and symbols are refused with
 *   the JSON path of the offending value (a hash must never depend on a silent conversion);
 * - typed arrays are written as arrays of numbers; no whitespace.
 */
import { PhasewrightError } from '../errors.js';

/** Thrown when a value cannot be written as canonical JSON; `path` points at the value. */
export class CanonicalJsonError extends PhasewrightError {
  constructor(message: string, path: string) {
    super(message, 'canonical-json', path);
    this.name = 'CanonicalJsonError';
  }
}

/** Canonical form of a finite number: shortest round-trip representation, −0 → 0. */
export function canonicalNumber(x: number, path = '$'): string {
  if (!Number.isFinite(x)) {
    throw new CanonicalJsonError(`${String(x)} is not a JSON number`, path);
  }
  return Object.is(x, -0) ? '0' : String(x);
}

function memberPath(path: string, key: string): string {
  return /^[A-Za-z_$][A-Za-z0-9_$]*$/.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`;
}

function write(value: unknown, path: string, out: string[], seen: Set<object>): void {
  if (value === null) {
    out.push('null');
    return;
  }
  switch (typeof value) {
    case 'number':
      out.push(canonicalNumber(value, path));
      return;
    case 'string':
      out.push(JSON.stringify(value));
      return;
    case 'boolean':
      out.push(value ? 'true' : 'false');
      return;
    case 'object':
      break;
    default:
      throw new CanonicalJsonError(`a ${typeof value} cannot be written as JSON`, path);
  }
  const object = value as object;
  if (seen.has(object)) throw new CanonicalJsonError('circular reference', path);
  seen.add(object);
  if (ArrayBuffer.isView(object) && !(object instanceof DataView)) {
    const view = object as unknown as ArrayLike<number | bigint>;
    out.push('[');
    for (let i = 0; i < view.length; i++) {
      if (i > 0) out.push(',');
      const item = view[i];
      if (typeof item !== 'number') throw new CanonicalJsonError('a bigint cannot be written as JSON', `${path}[${i}]`);
      out.push(canonicalNumber(item, `${path}[${i}]`));
    }
    out.push(']');
  } else if (Array.isArray(object)) {
    out.push('[');
    object.forEach((item: unknown, i: number) => {
      if (i > 0) out.push(',');
      if (item === undefined) throw new CanonicalJsonError('undefined inside an array', `${path}[${i}]`);
      write(item, `${path}[${i}]`, out, seen);
    });
    out.push(']');
  } else {
    const record = object as Record<string, unknown>;
    const keys = Object.keys(record)
      .filter((k) => record[k] !== undefined)
      .sort();
    out.push('{');
    keys.forEach((key, i) => {
      if (i > 0) out.push(',');
      out.push(JSON.stringify(key), ':');
      write(record[key], memberPath(path, key), out, seen);
    });
    out.push('}');
  }
  seen.delete(object);
}

/** Deeper than this, `prepare` hands over to `write` (which also detects cycles). */
const FAST_DEPTH = 200;

/** Returned by `prepare` when JSON.stringify cannot be used for a value. */
const NOT_READY: unique symbol = Symbol('not-ready');
/** Array-index keys: objects enumerate them first in numeric order, whatever their insertion order. */
const INDEX_KEY = /^(?:0|[1-9][0-9]*)$/;

/**
 * A value whose `JSON.stringify` is the canonical text of `value`: `value` itself where it already
 * is one, else a copy with object keys inserted in canonical order and typed arrays turned into
 * arrays. Such a value holds only plain objects (with no function or symbol members), plain arrays
 * without `undefined` or holes, strings, booleans, null and finite numbers (JSON.stringify writes
 * −0 as 0 and other numbers in the same shortest round-trip form as String). Anything else
 * (refused values, cycles, very deep values, objects with array-index keys out of order, class
 * instances) gives NOT_READY, and `write` takes over: JSON paths are built only on that path.
 */
function prepare(value: unknown, depth: number): unknown {
  switch (typeof value) {
    case 'string':
    case 'boolean':
      return value;
    case 'number':
      return value - value === 0 ? value : NOT_READY; // NaN and ±Infinity are not
    case 'object':
      break;
    default:
      return NOT_READY;
  }
  if (value === null) return value;
  if (depth > FAST_DEPTH) return NOT_READY;
  const proto: unknown = Object.getPrototypeOf(value);
  if (proto === Array.prototype) {
    const array = value as unknown[];
    if ((array as { toJSON?: unknown }).toJSON !== undefined) return NOT_READY;
    let copy: unknown[] | undefined;
    for (let i = 0; i < array.length; i++) {
      const item = array[i];
      if (item === undefined) return NOT_READY;
      const ok = prepare(item, depth + 1);
      if (ok === NOT_READY) return NOT_READY;
      if (ok !== item && copy === undefined) copy = array.slice(0, i);
      if (copy !== undefined) copy.push(ok);
    }
    return copy ?? array;
  }
  if (ArrayBuffer.isView(value) && !(value instanceof DataView)) {
    const view = value as unknown as ArrayLike<number | bigint>;
    const copy: number[] = new Array<number>(view.length);
    for (let i = 0; i < view.length; i++) {
      const item = view[i];
      if (typeof item !== 'number' || item - item !== 0) return NOT_READY;
      copy[i] = item;
    }
    return copy;
  }
  if (proto !== Object.prototype && proto !== null) return NOT_READY;
  const record = value as Record<string, unknown>;
  const keys = Object.keys(record);
  let sorted = true;
  for (let i = 1; i < keys.length; i++) {
    if (!(keys[i - 1] < keys[i])) {
      sorted = false;
      break;
    }
  }
  if (sorted) {
    let copy: Record<string, unknown> | undefined;
    for (let i = 0; i < keys.length; i++) {
      const item = record[keys[i]];
      if (item === undefined) continue;
      const ok = prepare(item, depth + 1);
      if (ok === NOT_READY) return NOT_READY;
      if (ok !== item && copy === undefined) {
        if (keys.includes('__proto__')) return NOT_READY; // an own "__proto__" member cannot be copied by assignment
        copy = {};
        for (let j = 0; j < i; j++) if (record[keys[j]] !== undefined) copy[keys[j]] = record[keys[j]];
      }
      if (copy !== undefined) copy[keys[i]] = ok;
    }
    return copy ?? record;
  }
  keys.sort();
  const copy: Record<string, unknown> = {};
  for (let i = 0; i < keys.length; i++) {
    const key = keys[i];
    const c = key.charCodeAt(0);
    if ((c >= 48 && c <= 57 && INDEX_KEY.test(key)) || key === '__proto__') return NOT_READY;
    const item = record[key];
    if (item === undefined) continue;
    const ok = prepare(item, depth + 1);
    if (ok === NOT_READY) return NOT_READY;
    copy[key] = ok;
  }
  return copy;
}

/** The canonical JSON text of `value`; throws CanonicalJsonError (with a JSON path) on values JSON cannot hold. */
export function canonicalJson(value: unknown): string {
  const protoToJson = (Object.prototype as { toJSON?: unknown }).toJSON !== undefined || (Array.prototype as { toJSON?: unknown }).toJSON !== undefined;
  const prepared = protoToJson ? NOT_READY : prepare(value, 0);
  if (prepared !== NOT_READY) return JSON.stringify(prepared);
  // The path-tracking writer: for values refused (it throws with the JSON path) or unusual.
  const out: string[] = [];
  write(value, '$', out, new Set());
  return out.join('');
}

/**
 * True only when `a` and `b` certainly have the same canonical JSON (plain objects, arrays,
 * strings, booleans, null and finite numbers, compared member by member; −0 equals 0, undefined
 * members count as absent). False when they differ or when unsure: a cheap test that allocates
 * nothing but key lists, for callers that would otherwise compare canonical texts.
 */
export function canonicallyEqual(a: unknown, b: unknown, depth = 0): boolean {
  switch (typeof a) {
    case 'string':
    case 'boolean':
      return a === b;
    case 'number':
      return a === b && a - a === 0;
    case 'object':
      if (a === null) return b === null;
      return typeof b === 'object' && b !== null && plainEqual(a, b, depth);
    default:
      return false;
  }
}

function plainEqual(a: object, b: object, depth: number): boolean {
  if (depth > FAST_DEPTH) return false;
  const pa: unknown = Object.getPrototypeOf(a);
  const pb: unknown = Object.getPrototypeOf(b);
  if (pa === Array.prototype || pb === Array.prototype) {
    if (pa !== pb) return false;
    const x = a as unknown[];
    const y = b as unknown[];
    if (x.length !== y.length) return false;
    for (let i = 0; i < x.length; i++) {
      if (x[i] === undefined || y[i] === undefined || !canonicallyEqual(x[i], y[i], depth + 1)) return false;
    }
    return true;
  }
  if ((pa !== Object.prototype && pa !== null) || (pb !== Object.prototype && pb !== null)) return false;
  const x = a as Record<string, unknown>;
  const y = b as Record<string, unknown>;
  let n = 0;
  for (const key of Object.keys(x)) {
    if (x[key] === undefined) continue;
    n++;
    if (!Object.prototype.hasOwnProperty.call(y, key) || !canonicallyEqual(x[key], y[key], depth + 1)) return false;
  }
  for (const key of Object.keys(y)) if (y[key] !== undefined) n--;
  return n === 0;
}
