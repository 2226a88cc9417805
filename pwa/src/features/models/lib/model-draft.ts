/**
 * The editor's draft: the model spec as loose JSON (what the person typed, possibly invalid),
 * edited at JSON paths and validated as a whole by physics-core's `parseModelSpec`. Every issue
 * carries the JSON path of its field (`$.terms[1].amplitude`), which is how the editor puts the
 * message next to the field.
 */
import { SpecError, parseModelSpec, type ModelSpec } from '@phasewright/physics-core';

export type Json = string | number | boolean | null | Json[] | { [key: string]: Json };
export type JsonObject = { [key: string]: Json };
export type PathSegment = string | number;

export interface SpecIssue {
  path: string;
  message: string;
}

/** `['terms', 1, 'amplitude']` → `$.terms[1].amplitude` (the form physics-core uses). */
export function jsonPath(segments: readonly PathSegment[]): string {
  return segments.reduce<string>((p, s) => (typeof s === 'number' ? `${p}[${s}]` : `${p}.${s}`), '$');
}

export function getAt(root: Json, segments: readonly PathSegment[]): Json | undefined {
  let node: Json | undefined = root;
  for (const s of segments) {
    if (node === null || typeof node !== 'object') return undefined;
    node = Array.isArray(node) ? node[s as number] : node[s as string];
  }
  return node;
}

/** A copy of `root` with the value at `segments` replaced (`undefined` removes an object key). */
export function setAt(root: Json, segments: readonly PathSegment[], value: Json | undefined): Json {
  if (segments.length === 0) return value ?? null;
  const [head, ...rest] = segments;
  if (typeof head === 'number') {
    const arr = Array.isArray(root) ? [...root] : [];
    const next = setAt(arr[head] ?? null, rest, value);
    arr[head] = next;
    return arr;
  }
  const obj: JsonObject = root !== null && typeof root === 'object' && !Array.isArray(root) ? { ...root } : {};
  if (rest.length === 0 && value === undefined) {
    delete obj[head];
    return obj;
  }
  obj[head] = setAt(obj[head] ?? null, rest, value);
  return obj;
}

/** Text typed into a numeric-or-expression field: a number when it reads as one, else the text. */
export function fromInput(text: string): string | number {
  const t = text.trim();
  if (t !== '' && /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t)) return Number(t);
  return text;
}

export function toInput(value: Json | undefined): string {
  if (value === undefined || value === null) return '';
  return typeof value === 'object' ? JSON.stringify(value) : String(value);
}

export type Validation = { ok: true; spec: ModelSpec; issues: [] } | { ok: false; issues: SpecIssue[] };

/** Validates the draft with the core's validator; any other exception becomes an issue at `$`. */
export function validateDraft(draft: Json): Validation {
  try {
    return { ok: true, spec: parseModelSpec(draft), issues: [] };
  } catch (error) {
    if (error instanceof SpecError) return { ok: false, issues: error.issues };
    return { ok: false, issues: [{ path: '$', message: error instanceof Error ? error.message : String(error) }] };
  }
}

/** Messages for the field at `path`: issues at that path, or inside it when `deep`. */
export function issuesAt(issues: readonly SpecIssue[], path: string, deep = false): string[] {
  return issues
    .filter((i) => i.path === path || (deep && (i.path.startsWith(`${path}.`) || i.path.startsWith(`${path}[`))))
    .map((i) => i.message);
}

/** Parses a model JSON file's text for import; a syntax error names the line and column. */
export function parseModelText(text: string): { draft: Json } | { error: string } {
  try {
    return { draft: JSON.parse(text) as Json };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    const pos = /position (\d+)/.exec(message);
    if (pos) {
      const offset = Number(pos[1]);
      const before = text.slice(0, offset).split('\n');
      return { error: `not valid JSON at line ${before.length}, column ${before[before.length - 1].length + 1}: ${message}` };
    }
    return { error: `not valid JSON: ${message}` };
  }
}

/** A new model to start from: a short periodic chain with plain hops and a repulsion. */
export function blankDraft(): JsonObject {
  return {
    spec: 'phasewright.model/1',
    name: 'new model',
    lattice: { kind: 'chain', size: [8], boundary: ['periodic'], twist: [0] },
    particles: { kind: 'hardcore', filling: 0.5 },
    parameters: { J: 1, V: 1 },
    terms: [
      { kind: 'hop', neighbors: 1, amplitude: '-J' },
      { kind: 'interaction', neighbors: 1, amplitude: 'V' },
    ],
  };
}
