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

/** The canonical JSON text of `value`; throws CanonicalJsonError (with a JSON path) on values JSON cannot hold. */
export function canonicalJson(value: unknown): string {
  const out: string[] = [];
  write(value, '$', out, new Set());
  return out.join('');
}
