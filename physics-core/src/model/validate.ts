/**
 * Validation of model spec v1 (`phasewright.model/1`). `parseModelSpec` checks the whole
 * document and throws one SpecError listing EVERY problem found, each with its JSON path
 * (`$.lattice.kind`, `$.terms[2].amplitude`) and a reason that says what is allowed.
 *
 * Parameters may be numbers or expressions over `pi` and other parameters (e.g.
 * "theta": "2*pi/3"); cycles are reported. Per-term expression scopes:
 * - hop, conditional-hop, interaction: parameters, pi, turn, dx, dy, x, y
 * - onsite: parameters, pi, x, y, sublattice
 * (see compile.ts for what the per-entry variables mean).
 */
import { SpecError } from '../errors.js';
import { customUnitCell } from '../lattice/custom.js';
import { LATTICE_KINDS, builtinUnitCell, latticeClasses, latticeDimension } from '../lattice/lattices.js';
import { cellShells, checkDistinctPairs } from '../lattice/neighbors.js';
import { EXPRESSION_FUNCTIONS, checkExpression, realValue } from './expressions.js';
import { MODEL_SPEC_ID, type ModelSpec, type TermKind, type TermSpec } from './types.js';

export interface SpecIssue {
  path: string;
  message: string;
}

const ROOT_FIELDS = ['spec', 'name', 'lattice', 'particles', 'parameters', 'terms'];
const LATTICE_FIELDS = ['kind', 'size', 'boundary', 'twist', 'custom'];
const CUSTOM_FIELDS = ['sites', 'translations', 'bonds'];
const CUSTOM_SITE_FIELDS = ['x', 'y', 'sublattice'];
const CUSTOM_BOND_FIELDS = ['class', 'from', 'to', 'offset'];
const PARTICLE_FIELDS = ['kind', 'filling', 'count'];
export const TERM_KINDS: readonly TermKind[] = ['hop', 'conditional-hop', 'interaction', 'onsite'];
const TERM_FIELDS: Record<TermKind, string[]> = {
  hop: ['kind', 'neighbors', 'class', 'amplitude', 'phase'],
  'conditional-hop': ['kind', 'neighbors', 'class', 'legs', 'via', 'when', 'amplitude', 'phase'],
  interaction: ['kind', 'neighbors', 'class', 'amplitude'],
  onsite: ['kind', 'amplitude'],
};
/** Variables provided per entry, by term kind. */
export const ENTRY_VARIABLES: Record<TermKind, string[]> = {
  hop: ['turn', 'dx', 'dy', 'x', 'y'],
  'conditional-hop': ['turn', 'dx', 'dy', 'x', 'y'],
  interaction: ['turn', 'dx', 'dy', 'x', 'y'],
  onsite: ['x', 'y', 'sublattice'],
};
const RESERVED = ['pi', 'turn', 'dx', 'dy', 'x', 'y', 'sublattice'];
/** Largest `neighbors` shell a term may ask for. */
export const MAX_SHELL = 8;
/** Largest cluster a spec may describe (sites). */
export const MAX_SPEC_SITES = 1_000_000;
const IDENT = /^[A-Za-z_][A-Za-z0-9_]*$/;

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

function unknownFields(obj: Record<string, unknown>, allowed: string[], path: string, issues: SpecIssue[]): void {
  for (const k of Object.keys(obj))
    if (!allowed.includes(k))
      issues.push({ path: `${path}.${k}`, message: `unknown field '${k}' (allowed here: ${allowed.join(', ')})` });
}

function whichTermsAllow(field: string): string {
  const ks = TERM_KINDS.filter((k) => TERM_FIELDS[k].includes(field));
  return ks.length <= 2 ? ks.join(' and ') : `${ks.slice(0, -1).join(', ')} and ${ks[ks.length - 1]}`;
}

/**
 * Evaluate parameters (numbers or expressions over pi and each other) in dependency order.
 * `overrides` replace values by numbers before evaluation (so dependents follow them).
 */
export function evaluateParameters(
  parameters: Record<string, unknown>,
  overrides: Record<string, number> = {},
): { values: Record<string, number>; issues: SpecIssue[] } {
  const issues: SpecIssue[] = [];
  const names = Object.keys(parameters);
  for (const k of Object.keys(overrides)) {
    if (!names.includes(k))
      issues.push({
        path: `$.parameters.${k}`,
        message: `override for unknown parameter '${k}' (parameters: ${names.join(', ') || 'none'})`,
      });
    else if (!Number.isFinite(overrides[k]))
      issues.push({ path: `$.parameters.${k}`, message: `override must be a finite number, got ${overrides[k]}` });
  }
  const scope = ['pi', ...names];
  const compiled = new Map<string, ReturnType<typeof checkExpression>>();
  for (const name of names) {
    const path = `$.parameters.${name}`;
    if (!IDENT.test(name)) {
      issues.push({ path, message: `parameter name '${name}' is not an identifier (letters, digits, _)` });
      continue;
    }
    if (RESERVED.includes(name) || EXPRESSION_FUNCTIONS.includes(name)) {
      issues.push({ path, message: `'${name}' is reserved (reserved: ${[...RESERVED, ...EXPRESSION_FUNCTIONS].join(', ')})` });
      continue;
    }
    const src = name in overrides ? overrides[name] : parameters[name];
    const c = checkExpression(src, scope.filter((s) => s !== name));
    if (!c.ok) {
      const self = typeof src === 'string' && checkExpression(src, scope).ok;
      issues.push({ path, message: self ? `parameter '${name}' refers to itself` : c.message });
    }
    compiled.set(name, c);
  }
  const values: Record<string, number> = {};
  const state = new Map<string, 'visiting' | 'done' | 'failed'>();
  const visit = (name: string, chain: string[]): boolean => {
    const st = state.get(name);
    if (st === 'done') return true;
    if (st === 'failed') return false;
    if (st === 'visiting') {
      const cyc = [...chain.slice(chain.indexOf(name)), name];
      issues.push({ path: `$.parameters.${name}`, message: `parameters refer to each other in a cycle: ${cyc.join(' → ')}` });
      return false;
    }
    const c = compiled.get(name);
    if (!c || !c.ok) {
      state.set(name, 'failed');
      return false;
    }
    state.set(name, 'visiting');
    for (const dep of c.expr.symbols)
      if (dep !== 'pi' && !visit(dep, [...chain, name])) {
        state.set(name, 'failed');
        return false;
      }
    const raw = (() => {
      try {
        return c.expr.run({ pi: Math.PI, ...values });
      } catch (e) {
        return e as Error;
      }
    })();
    const v = realValue(raw);
    if (v === undefined) {
      issues.push({
        path: `$.parameters.${name}`,
        message: `'${c.expr.source}' is not a finite real number (got ${raw instanceof Error ? raw.message : String(raw)})`,
      });
      state.set(name, 'failed');
      return false;
    }
    values[name] = v;
    state.set(name, 'done');
    return true;
  };
  for (const name of names) visit(name, []);
  return { values, issues };
}

/** Shells a spec's terms need laid as bonds (at least 1). */
export function requiredShells(terms: TermSpec[]): number {
  let s = 1;
  for (const t of terms) {
    if (typeof t.neighbors === 'number') s = Math.max(s, t.neighbors);
    if (t.class === 'nnn' || t.legs === 'nnn') s = Math.max(s, 2);
  }
  return s;
}

function checkLattice(lat: unknown, values: Record<string, number>, issues: SpecIssue[]): { ok: boolean; nSites: number } {
  const bad = { ok: false, nSites: 0 };
  if (!isObject(lat)) {
    issues.push({ path: '$.lattice', message: 'must be an object with kind, size, boundary' });
    return bad;
  }
  unknownFields(lat, LATTICE_FIELDS, '$.lattice', issues);
  const kind = lat.kind;
  if (typeof kind !== 'string' || !(LATTICE_KINDS as readonly string[]).includes(kind)) {
    issues.push({ path: '$.lattice.kind', message: `unknown lattice kind '${String(kind)}' (allowed: ${LATTICE_KINDS.join(', ')})` });
    return bad;
  }
  let ok = true;
  let nBasis: number;
  let dim: number;
  if (kind === 'custom') {
    const cu = checkCustom(lat.custom, issues);
    if (!cu) return bad;
    dim = cu.dim;
    nBasis = cu.nBasis;
  } else {
    if (lat.custom !== undefined)
      issues.push({ path: '$.lattice.custom', message: `applies only to kind 'custom' (this lattice is '${kind}')` });
    dim = latticeDimension({ kind: kind as Exclude<ModelSpec['lattice']['kind'], 'custom'> });
    nBasis = kind === 'ladder' || kind === 'zigzag' || kind === 'honeycomb' ? 2 : kind === 'kagome' ? 3 : 1;
  }
  const axes = `${dim} ax${dim === 1 ? 'is' : 'es'}`;
  const size = lat.size;
  if (!Array.isArray(size)) {
    issues.push({ path: '$.lattice.size', message: `must be an array of ${dim} positive integers (unit cells per axis)` });
    ok = false;
  } else {
    if (size.length !== dim) {
      issues.push({ path: '$.lattice.size', message: `has ${size.length} entries; a ${kind} lattice has ${axes}` });
      ok = false;
    }
    size.forEach((l, a) => {
      if (!Number.isInteger(l) || (l as number) < 1) {
        issues.push({ path: `$.lattice.size[${a}]`, message: `must be a positive integer, got ${JSON.stringify(l)}` });
        ok = false;
      }
    });
  }
  const boundary = lat.boundary;
  if (!Array.isArray(boundary)) {
    issues.push({ path: '$.lattice.boundary', message: `must be an array of ${dim} entries, each 'open' or 'periodic'` });
    ok = false;
  } else {
    if (boundary.length !== dim) {
      issues.push({ path: '$.lattice.boundary', message: `has ${boundary.length} entries; a ${kind} lattice has ${axes}` });
      ok = false;
    }
    boundary.forEach((b, a) => {
      if (b !== 'open' && b !== 'periodic') {
        issues.push({ path: `$.lattice.boundary[${a}]`, message: `must be 'open' or 'periodic', got ${JSON.stringify(b)}` });
        ok = false;
      }
    });
  }
  if (lat.twist !== undefined) {
    if (!Array.isArray(lat.twist)) issues.push({ path: '$.lattice.twist', message: `must be an array of ${dim} angles (radians)` });
    else {
      if (lat.twist.length !== dim)
        issues.push({ path: '$.lattice.twist', message: `has ${lat.twist.length} entries; a ${kind} lattice has ${axes}` });
      lat.twist.forEach((t, a) => {
        const path = `$.lattice.twist[${a}]`;
        const c = checkExpression(t, ['pi', ...Object.keys(values)]);
        if (!c.ok) return issues.push({ path, message: c.message });
        if (!c.expr.symbols.every((s) => s === 'pi' || s in values)) return; // depends on a broken parameter
        const v = realValue(c.expr.run({ pi: Math.PI, ...values }));
        if (v === undefined) issues.push({ path, message: `'${c.expr.source}' is not a finite real number` });
        else if (v !== 0 && Array.isArray(boundary) && boundary[a] === 'open')
          issues.push({ path, message: `twist ${v} on an open axis has no meaning; set it to 0 or make axis ${a} periodic` });
      });
    }
  }
  const nSites = ok ? (size as number[]).reduce((p, q) => p * q, nBasis) : 0;
  if (ok && nSites > MAX_SPEC_SITES) {
    issues.push({ path: '$.lattice.size', message: `${nSites} sites exceed the limit of ${MAX_SPEC_SITES}` });
    ok = false;
  }
  return { ok, nSites };
}

function checkCustom(cu: unknown, issues: SpecIssue[]): { dim: number; nBasis: number } | undefined {
  const path = '$.lattice.custom';
  if (!isObject(cu)) {
    issues.push({ path, message: "a custom lattice needs 'custom': { sites, translations, bonds? }" });
    return undefined;
  }
  unknownFields(cu, CUSTOM_FIELDS, path, issues);
  let ok = true;
  const num = (v: unknown) => typeof v === 'number' && Number.isFinite(v);
  const tr = cu.translations;
  let dim = 0;
  if (!Array.isArray(tr) || tr.length < 1 || tr.length > 2) {
    issues.push({ path: `${path}.translations`, message: 'must hold 1 or 2 vectors [x, y]' });
    ok = false;
  } else {
    dim = tr.length;
    tr.forEach((t, a) => {
      if (!Array.isArray(t) || t.length !== 2 || !t.every(num)) {
        issues.push({ path: `${path}.translations[${a}]`, message: 'must be a vector [x, y] of two numbers' });
        ok = false;
      }
    });
    if (ok) {
      const v = tr as number[][];
      const n0 = Math.hypot(v[0][0], v[0][1]);
      if (n0 === 0) {
        issues.push({ path: `${path}.translations[0]`, message: 'must not be zero' });
        ok = false;
      } else if (dim === 2) {
        const det = v[0][0] * v[1][1] - v[0][1] * v[1][0];
        if (Math.abs(det) <= 1e-9 * n0 * Math.hypot(v[1][0], v[1][1])) {
          issues.push({ path: `${path}.translations`, message: 'the two translations are parallel (or zero)' });
          ok = false;
        }
      }
    }
  }
  const sites = cu.sites;
  let nBasis = 0;
  if (!Array.isArray(sites) || sites.length === 0) {
    issues.push({ path: `${path}.sites`, message: 'must be a non-empty array of { x, y, sublattice? }' });
    ok = false;
  } else {
    nBasis = sites.length;
    sites.forEach((s, i) => {
      const p = `${path}.sites[${i}]`;
      if (!isObject(s)) {
        issues.push({ path: p, message: 'must be an object { x, y, sublattice? }' });
        ok = false;
        return;
      }
      unknownFields(s, CUSTOM_SITE_FIELDS, p, issues);
      for (const k of ['x', 'y'])
        if (!num(s[k])) {
          issues.push({ path: `${p}.${k}`, message: `must be a finite number, got ${JSON.stringify(s[k])}` });
          ok = false;
        }
      if (s.sublattice !== undefined && !(Number.isInteger(s.sublattice) && (s.sublattice as number) >= 0))
        issues.push({ path: `${p}.sublattice`, message: `must be a non-negative integer, got ${JSON.stringify(s.sublattice)}` });
    });
  }
  if (cu.bonds !== undefined) {
    if (!Array.isArray(cu.bonds)) issues.push({ path: `${path}.bonds`, message: 'must be an array of { class, from, to, offset }' });
    else
      cu.bonds.forEach((b, i) => {
        const p = `${path}.bonds[${i}]`;
        if (!isObject(b)) {
          issues.push({ path: p, message: 'must be an object { class, from, to, offset }' });
          return;
        }
        unknownFields(b, CUSTOM_BOND_FIELDS, p, issues);
        if (typeof b.class !== 'string' || !IDENT.test(b.class))
          issues.push({ path: `${p}.class`, message: 'must be a name (letters, digits, _)' });
        else if (b.class === 'nn' || b.class === 'nnn')
          issues.push({ path: `${p}.class`, message: `'${b.class}' is automatic (the distance shell); choose another name` });
        for (const k of ['from', 'to'])
          if (!Number.isInteger(b[k]) || (b[k] as number) < 0 || (nBasis && (b[k] as number) >= nBasis))
            issues.push({ path: `${p}.${k}`, message: `must be a site index 0…${Math.max(0, nBasis - 1)}, got ${JSON.stringify(b[k])}` });
        if (!Array.isArray(b.offset) || (dim && b.offset.length !== dim) || !b.offset.every((o) => Number.isInteger(o)))
          issues.push({ path: `${p}.offset`, message: `must be ${dim || 'one'} integer cell offset(s), one per translation` });
        else if (b.from === b.to && b.offset.every((o) => o === 0))
          issues.push({ path: p, message: 'joins a site to itself' });
      });
  }
  if (ok && Array.isArray(sites)) {
    const pts = sites as { x: number; y: number }[];
    for (let i = 0; i < pts.length; i++)
      for (let j = i + 1; j < pts.length; j++)
        if (Math.hypot(pts[i].x - pts[j].x, pts[i].y - pts[j].y) < 1e-9)
          issues.push({ path: `${path}.sites[${j}]`, message: `sits at the same position as sites[${i}]` });
  }
  return ok ? { dim, nBasis } : undefined;
}

function checkParticles(p: unknown, nSites: number, latticeOk: boolean, integer: boolean, issues: SpecIssue[]): void {
  const path = '$.particles';
  if (!isObject(p)) {
    issues.push({ path, message: "must be an object { kind: 'hardcore', filling | count }" });
    return;
  }
  unknownFields(p, PARTICLE_FIELDS, path, issues);
  if (p.kind !== 'hardcore')
    issues.push({ path: `${path}.kind`, message: `unknown particle kind ${JSON.stringify(p.kind)} (allowed: 'hardcore')` });
  const hasF = p.filling !== undefined;
  const hasC = p.count !== undefined;
  if (hasF === hasC) {
    issues.push({ path, message: hasF ? "give either 'filling' or 'count', not both" : "needs 'filling' (particles per site) or 'count'" });
    return;
  }
  if (hasF) {
    const f = p.filling;
    if (typeof f !== 'number' || !Number.isFinite(f) || f < 0 || f > 1) {
      issues.push({ path: `${path}.filling`, message: `must be a number in [0, 1] for hardcore bosons, got ${JSON.stringify(f)}` });
      return;
    }
    if (!latticeOk || !integer) return;
    const n = f * nSites;
    if (Math.abs(n - Math.round(n)) > 1e-9)
      issues.push({
        path: `${path}.filling`,
        message: `filling ${f} on ${nSites} sites gives ${Number(n.toPrecision(12))} particles, not an integer (nearest fillings: ${Math.floor(n)}/${nSites}, ${Math.ceil(n)}/${nSites}; or give 'count')`,
      });
  } else {
    const c = p.count;
    if (!Number.isInteger(c) || (c as number) < 0)
      issues.push({ path: `${path}.count`, message: `must be a non-negative integer, got ${JSON.stringify(c)}` });
    else if (latticeOk && (c as number) > nSites)
      issues.push({ path: `${path}.count`, message: `${c} hardcore bosons do not fit on ${nSites} sites` });
  }
}

function checkTerms(
  terms: unknown,
  classes: string[] | undefined,
  latticeKind: string,
  paramNames: string[],
  issues: SpecIssue[],
): void {
  if (!Array.isArray(terms)) {
    issues.push({ path: '$.terms', message: 'must be an array of terms' });
    return;
  }
  const allFields = [...new Set(Object.values(TERM_FIELDS).flat())];
  terms.forEach((t, i) => {
    const path = `$.terms[${i}]`;
    if (!isObject(t)) {
      issues.push({ path, message: 'must be an object with kind and amplitude' });
      return;
    }
    const kind = t.kind;
    if (typeof kind !== 'string' || !(TERM_KINDS as readonly string[]).includes(kind)) {
      issues.push({ path: `${path}.kind`, message: `unknown term kind ${JSON.stringify(kind)} (allowed: ${TERM_KINDS.join(', ')})` });
      return;
    }
    const k = kind as TermKind;
    for (const f of Object.keys(t)) {
      if (TERM_FIELDS[k].includes(f)) continue;
      if (allFields.includes(f))
        issues.push({ path: `${path}.${f}`, message: `'${f}' applies only to ${whichTermsAllow(f)} terms, not to ${k}` });
      else issues.push({ path: `${path}.${f}`, message: `unknown field '${f}' (allowed for ${k}: ${TERM_FIELDS[k].join(', ')})` });
    }
    if (t.neighbors !== undefined && TERM_FIELDS[k].includes('neighbors'))
      if (!Number.isInteger(t.neighbors) || (t.neighbors as number) < 1 || (t.neighbors as number) > MAX_SHELL)
        issues.push({ path: `${path}.neighbors`, message: `must be a shell number 1…${MAX_SHELL}, got ${JSON.stringify(t.neighbors)}` });
    for (const f of ['class', 'legs'] as const) {
      if (t[f] === undefined || !TERM_FIELDS[k].includes(f)) continue;
      if (typeof t[f] !== 'string') issues.push({ path: `${path}.${f}`, message: 'must be a bond class name' });
      else if (classes && !classes.includes(t[f] as string))
        issues.push({
          path: `${path}.${f}`,
          message: `unknown bond class '${t[f]}' for a ${latticeKind} lattice (it has: ${classes.join(', ')})`,
        });
    }
    if (k === 'conditional-hop') {
      if (t.via !== undefined && t.via !== 'common-neighbor')
        issues.push({ path: `${path}.via`, message: `must be 'common-neighbor', got ${JSON.stringify(t.via)}` });
      if (t.when !== 'empty' && t.when !== 'occupied')
        issues.push({
          path: `${path}.when`,
          message:
            t.when === undefined
              ? "is required: 'empty' (hop when the intermediate site is empty) or 'occupied'"
              : `must be 'empty' or 'occupied', got ${JSON.stringify(t.when)}`,
        });
    }
    const scope = ['pi', ...paramNames, ...ENTRY_VARIABLES[k]];
    if (t.amplitude === undefined) issues.push({ path: `${path}.amplitude`, message: 'is required (a number or an expression)' });
    else {
      const c = checkExpression(t.amplitude, scope);
      if (!c.ok) issues.push({ path: `${path}.amplitude`, message: c.message });
    }
    if (t.phase !== undefined && TERM_FIELDS[k].includes('phase')) {
      const c = checkExpression(t.phase, scope);
      if (!c.ok) issues.push({ path: `${path}.phase`, message: c.message });
    }
  });
}

/**
 * Validate a model spec document and return it typed. Throws a SpecError listing every
 * problem with its JSON path. The returned object is a deep copy of the input (no defaults
 * filled in, so hashing it is stable).
 */
export interface ParseOptions {
  /**
   * Require `filling × sites` to be an integer (exact diagonalization works at a fixed particle
   * number). Mean-field solvers, for which the filling is a density, may switch it off. @default true
   */
  integerParticles?: boolean;
}

export function parseModelSpec(json: unknown, options: ParseOptions = {}): ModelSpec {
  const issues: SpecIssue[] = [];
  if (!isObject(json)) throw new SpecError([{ path: '$', message: 'a model spec must be a JSON object' }]);
  unknownFields(json, ROOT_FIELDS, '$', issues);
  if (json.spec !== MODEL_SPEC_ID)
    issues.push({ path: '$.spec', message: `must be '${MODEL_SPEC_ID}', got ${JSON.stringify(json.spec)}` });
  if (json.name !== undefined && typeof json.name !== 'string') issues.push({ path: '$.name', message: 'must be a string' });
  let values: Record<string, number> = {};
  let paramNames: string[] = [];
  if (json.parameters === undefined) {
    // allowed: a model without parameters
  } else if (!isObject(json.parameters)) issues.push({ path: '$.parameters', message: 'must be an object of name: number | expression' });
  else {
    paramNames = Object.keys(json.parameters);
    const ev = evaluateParameters(json.parameters);
    values = ev.values;
    issues.push(...ev.issues);
  }
  if (json.parameters === undefined) issues.push({ path: '$.parameters', message: 'is required (use {} for none)' });
  const lat = checkLattice(json.lattice, values, issues);
  const latObj = isObject(json.lattice) ? json.lattice : {};
  let classes: string[] | undefined;
  if (isObject(json.lattice) && (LATTICE_KINDS as readonly unknown[]).includes(latObj.kind)) {
    try {
      classes =
        latObj.kind === 'custom'
          ? isObject(latObj.custom) && Array.isArray(latObj.custom.bonds)
            ? ['nn', 'nnn', ...new Set(latObj.custom.bonds.filter(isObject).map((b) => String(b.class)))]
            : ['nn', 'nnn']
          : latticeClasses({ kind: latObj.kind as ModelSpec['lattice']['kind'] });
    } catch {
      classes = undefined;
    }
  }
  checkParticles(json.particles, lat.nSites, lat.ok, options.integerParticles ?? true, issues);
  checkTerms(json.terms, classes, String(latObj.kind), paramNames, issues);
  if (issues.length === 0) {
    // The cluster must be large enough for the shells the terms use (see lattice/neighbors.ts).
    const spec = json as unknown as ModelSpec;
    try {
      const cell = spec.lattice.kind === 'custom' ? customUnitCell(spec.lattice.custom!) : undefined;
      const { bonds } = cellShells(
        cell ?? builtinUnitCell(spec.lattice.kind as Exclude<ModelSpec['lattice']['kind'], 'custom'>),
        requiredShells(spec.terms),
      );
      checkDistinctPairs(bonds, spec.lattice.size, spec.lattice.boundary);
    } catch (e) {
      if (e instanceof SpecError) issues.push(...e.issues);
      else throw e;
    }
  }
  if (issues.length) throw new SpecError(issues);
  return JSON.parse(JSON.stringify(json)) as ModelSpec;
}
