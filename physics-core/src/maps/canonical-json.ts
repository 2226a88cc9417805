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
 *
 * Written by direct string building (`fast`), with the sorted key order of each object shape
 * cached; anything it does not answer goes to the plain path-tracking writer (`write`), which is
 * the definition. The test checks the two against a reference writer on random nested values.
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

/** Deeper than this, `fast` hands over to `write` (which also detects cycles). */
const FAST_DEPTH = 200;

/** Characters JSON.stringify escapes in a string: controls, `"`, `\\` and (lone) surrogates. */
// eslint-disable-next-line no-control-regex -- the control characters are what is looked for
const NEEDS_ESCAPE = /[\u0000-\u001f"\\\ud800-\udfff]/;

/** A string as JSON: written directly when nothing in it needs escaping (most keys and values), else by JSON.stringify. */
function quote(s: string): string {
  if (s.length > 32) return NEEDS_ESCAPE.test(s) ? JSON.stringify(s) : `"${s}"`;
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    if (c < 32 || c === 34 || c === 92 || (c >= 0xd800 && c <= 0xdfff)) return JSON.stringify(s);
  }
  return `"${s}"`;
}

/**
 * The canonical member order of objects with the same own keys in the same enumeration order (a
 * "shape": every point of a map has a few), with each key written once as `{"key":` and `,"key":`.
 */
interface Shape {
  keys: string[];
  order: string[];
  open: string[];
  next: string[];
}

/** Shapes by first key, a few per first key (checked key by key); bounded, so odd inputs cannot grow it without end. */
const shapes = new Map<string, Shape[]>();
const MAX_FIRST_KEYS = 1024;
const MAX_SHAPES_PER_KEY = 8;
/** Objects with more keys than this are written without the shape cache. */
const MAX_SHAPE_KEYS = 64;

function shapeOf(keys: string[]): Shape {
  const n = keys.length;
  const list = shapes.get(keys[0]);
  if (list !== undefined) {
    search: for (let s = 0; s < list.length; s++) {
      const known = list[s].keys;
      if (known.length !== n) continue;
      for (let i = 1; i < n; i++) if (known[i] !== keys[i]) continue search;
      return list[s];
    }
  }
  const order = keys.slice().sort();
  const quoted = order.map((k) => `${quote(k)}:`);
  const shape: Shape = { keys, order, open: quoted.map((q) => `{${q}`), next: quoted.map((q) => `,${q}`) };
  if (list === undefined) {
    if (shapes.size < MAX_FIRST_KEYS) shapes.set(keys[0], [shape]);
  } else if (list.length < MAX_SHAPES_PER_KEY) list.push(shape);
  return shape;
}

/**
 * Large containers collect their members' texts and join them; each text is flattened while it is
 * young (`charCodeAt` makes V8 flatten a concatenated string), so a whole map does not leave
 * millions of string pieces for the garbage collector to move.
 */
function flat(text: string): string {
  text.charCodeAt(0);
  return text;
}

/**
 * The canonical text of `value` by direct string building, or undefined where `write` must take
 * over: refused values (with their JSON path), cycles and very deep values, array holes, and
 * objects that are neither plain objects, plain arrays nor typed arrays (class instances, Dates,
 * Maps, boxed primitives). Writes exactly what `write` writes wherever it answers.
 */
function fast(value: unknown, depth: number): string | undefined {
  switch (typeof value) {
    case 'string':
      return quote(value);
    case 'number':
      return value - value === 0 ? `${value}` : undefined; // NaN and ±Infinity are not; `${-0}` is "0"
    case 'boolean':
      return value ? 'true' : 'false';
    case 'object':
      break;
    default:
      return undefined;
  }
  if (value === null) return 'null';
  if (depth > FAST_DEPTH) return undefined;
  const proto: unknown = Object.getPrototypeOf(value);
  if (proto === Array.prototype) {
    const array = value as unknown[];
    const n = array.length;
    if (n === 0) return '[]';
    if (n > MAX_SHAPE_KEYS) {
      const parts = new Array<string>(n);
      for (let i = 0; i < n; i++) {
        const item = array[i];
        const text = item === undefined ? undefined : fast(item, depth + 1);
        if (text === undefined) return undefined;
        parts[i] = flat(text);
      }
      return `[${parts.join(',')}]`;
    }
    let out = '[';
    for (let i = 0; i < n; i++) {
      const item = array[i];
      let text: string | undefined;
      if (typeof item === 'number') text = item - item === 0 ? `${item}` : undefined;
      else text = item === undefined ? undefined : fast(item, depth + 1);
      if (text === undefined) return undefined;
      out += i === 0 ? text : `,${text}`;
    }
    return `${out}]`;
  }
  if (proto !== Object.prototype && proto !== null) {
    if (!ArrayBuffer.isView(value) || value instanceof DataView) return undefined;
    const view = value as unknown as ArrayLike<number | bigint>;
    let out = '[';
    for (let i = 0; i < view.length; i++) {
      const item = view[i];
      if (typeof item !== 'number' || item - item !== 0) return undefined;
      out += i === 0 ? `${item}` : `,${item}`;
    }
    return `${out}]`;
  }
  const record = value as Record<string, unknown>;
  const keys = Object.keys(record);
  const n = keys.length;
  if (n === 0) return '{}';
  if (n > MAX_SHAPE_KEYS) {
    keys.sort();
    const parts: string[] = [];
    for (let i = 0; i < n; i++) {
      const item = record[keys[i]];
      if (item === undefined) continue;
      const text = fast(item, depth + 1);
      if (text === undefined) return undefined;
      parts.push(`${quote(keys[i])}:${flat(text)}`);
    }
    return `{${parts.join(',')}}`;
  }
  const { order, open, next } = shapeOf(keys);
  let out = '';
  for (let i = 0; i < n; i++) {
    const item = record[order[i]];
    if (item === undefined) continue;
    let text: string | undefined;
    if (typeof item === 'number') text = item - item === 0 ? `${item}` : undefined;
    else text = fast(item, depth + 1);
    if (text === undefined) return undefined;
    out += out === '' ? open[i] + text : next[i] + text;
  }
  return out === '' ? '{}' : `${out}}`;
}

/** The canonical JSON text of `value`; throws CanonicalJsonError (with a JSON path) on values JSON cannot hold. */
export function canonicalJson(value: unknown): string {
  const text = fast(value, 0);
  if (text !== undefined) return text;
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

/** Index just past the JSON string that opens at `start` (a `"`), or -1 when it does not close. */
function stringEnd(text: string, start: number): number {
  for (let i = start + 1; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 92) i++; // a backslash escapes the next character
    else if (c === 34) return i + 1;
  }
  return -1;
}

/**
 * The canonical text of an object with more members, from its canonical text `text` and the new
 * members' keys with their canonical value texts: each member is spliced in before the first
 * member whose key sorts after it, so only the text before the last insertion point is scanned
 * (not parsed). Returns undefined when a key is already there or `text` is not a canonical object
 * text; the caller then writes the whole value with canonicalJson. With `text === canonicalJson(o)`
 * and each value text `canonicalJson(v)`, the result is `canonicalJson` of `o` with those members.
 */
export function insertMembers(text: string, members: [key: string, valueText: string][]): string | undefined {
  const end = text.length - 1;
  if (text.charCodeAt(0) !== 123 || text.charCodeAt(end) !== 125) return undefined;
  if (members.length === 0) return text;
  const sorted = members.slice().sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  for (let k = 1; k < sorted.length; k++) if (sorted[k][0] === sorted[k - 1][0]) return undefined;
  const member = (k: number) => `${quote(sorted[k][0])}:${sorted[k][1]}`;
  if (end === 1) return `{${sorted.map((_, k) => member(k)).join(',')}}`;
  let out = '';
  let from = 0;
  let m = 0;
  let i = 1;
  while (i < end && m < sorted.length) {
    if (text.charCodeAt(i) !== 34) return undefined;
    const keyEnd = stringEnd(text, i);
    if (keyEnd < 0 || text.charCodeAt(keyEnd) !== 58) return undefined;
    const raw = text.slice(i, keyEnd);
    const key = raw.includes('\\') ? (JSON.parse(raw) as string) : raw.slice(1, -1);
    while (m < sorted.length && sorted[m][0] < key) {
      out += `${text.slice(from, i)}${member(m)},`;
      from = i;
      m++;
    }
    if (m < sorted.length && sorted[m][0] === key) return undefined;
    if (m === sorted.length) break;
    // Past this member's value: the next comma outside strings and brackets, or the closing brace.
    let j = keyEnd + 1;
    let depth = 0;
    for (; j < end; j++) {
      const c = text.charCodeAt(j);
      if (c === 34) {
        const after = stringEnd(text, j);
        if (after < 0) return undefined;
        j = after - 1;
      } else if (c === 123 || c === 91) depth++;
      else if (c === 125 || c === 93) depth--;
      else if (c === 44 && depth === 0) break;
    }
    if (depth !== 0 || j === keyEnd + 1) return undefined;
    i = j + 1;
  }
  if (m === sorted.length) return out + text.slice(from);
  // The rest sort after every member of the text.
  let tail = '';
  for (; m < sorted.length; m++) tail += `,${member(m)}`;
  return `${out}${text.slice(from, end)}${tail}}`;
}
