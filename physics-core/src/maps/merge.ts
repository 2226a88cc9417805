/**
 * Merging maps of the same identity, by the physics of their points:
 *
 * - the union of points; a point present in several maps keeps one primary result;
 * - ED: results of one point must agree in energy within a relative tolerance; those that do
 *   are kept as confirmations in `history`, those that do not in `disputed` (the point is then
 *   disputed). The primary result is the lowest energy (ties broken canonically).
 * - mean-field: the lowest energy wins (the better variational upper bound); the others go to
 *   `history` with their provenance.
 *
 * Every result ever seen for a point is kept once (summaries are compared as canonical JSON),
 * and the outcome depends only on that set, so merge is commutative, associative and
 * idempotent (`mergeMaps(a, a)` equals `normaliseMap(a)`; maps written by the engine are normal).
 */
import { PhasewrightError } from '../errors.js';
import { canonicalJson, canonicallyEqual } from './canonical-json.js';
import type { MapPoint, MapSource, PhaseMap, PointSummary } from './map-format.js';

export interface MergeOptions {
  /** Relative energy tolerance for ED results of the same point. @default 1e-8 */
  edRelativeTolerance?: number;
  /** Absolute floor of the ED tolerance (energies near zero). @default 1e-12 */
  edAbsoluteTolerance?: number;
}

export class MergeError extends PhasewrightError {
  constructor(message: string, details?: Record<string, unknown>) {
    super(message, 'merge', undefined, details);
    this.name = 'MergeError';
  }
}

function summaryOf(p: MapPoint): PointSummary {
  const s: PointSummary = { energy: p.energy, convergence: p.convergence, wallMs: p.wallMs, seed: p.seed, computed: p.computed };
  if (p.label !== undefined) s.label = p.label;
  if (p.warnings !== undefined) s.warnings = p.warnings;
  return s;
}

/** A result with its energy; its canonical text is written only when an order or a comparison needs it. */
interface Entry<T> {
  energy: number;
  s: T;
  text?: string;
}

const textOf = (e: Entry<unknown>): string => (e.text ??= canonicalJson(e.s));

/** Orders results: lower energy first, then canonical text (a total order on distinct results). */
function compareResults(a: Entry<unknown>, b: Entry<unknown>): number {
  if (a.energy !== b.energy) return a.energy < b.energy ? -1 : 1;
  if (canonicallyEqual(a.s, b.s)) return 0;
  const ta = textOf(a);
  const tb = textOf(b);
  return ta < tb ? -1 : ta > tb ? 1 : 0;
}

/** Agreement of two ED energies within tolerance. */
export function edEnergiesAgree(a: number, b: number, options: MergeOptions = {}): boolean {
  const rel = options.edRelativeTolerance ?? 1e-8;
  const abs = options.edAbsoluteTolerance ?? 1e-12;
  return Math.abs(a - b) <= Math.max(abs, rel * Math.max(Math.abs(a), Math.abs(b)));
}

/** Members of a point that merging replaces (its level, disputes and history). */
const replaced = (key: string): boolean => key === 'level' || key === 'disputed' || key === 'history';

/** Whether two points agree (as canonicallyEqual) in everything merging keeps, without copying them. */
function keptEqual(a: MapPoint, b: MapPoint): boolean {
  const x = a as unknown as Record<string, unknown>;
  const y = b as unknown as Record<string, unknown>;
  let n = 0;
  for (const key of Object.keys(x)) {
    if (replaced(key) || x[key] === undefined) continue;
    n++;
    if (!Object.prototype.hasOwnProperty.call(y, key) || !canonicallyEqual(x[key], y[key], 1)) return false;
  }
  for (const key of Object.keys(y)) if (!replaced(key) && y[key] !== undefined) n--;
  return n === 0;
}

/**
 * The merged point: the members of `best` but the replaced ones, then `level` and the given lists
 * (the members and order a rest copy plus a spread would give), copied member by member.
 */
function mergedPoint(best: MapPoint, level: number, disputed: PointSummary[] | undefined, history: PointSummary[] | undefined): MapPoint {
  const out = {} as Record<string, unknown>;
  const from = best as unknown as Record<string, unknown>;
  for (const key in from) {
    if (replaced(key) || !Object.prototype.hasOwnProperty.call(from, key)) continue;
    // An own "__proto__" member (JSON.parse makes one) stays a member, as a spread would keep it.
    if (key === '__proto__') Object.defineProperty(out, key, { value: from[key], enumerable: true, writable: true, configurable: true });
    else out[key] = from[key];
  }
  out.level = level;
  if (disputed !== undefined) out.disputed = disputed;
  if (history !== undefined) out.history = history;
  return out as unknown as MapPoint;
}

/**
 * The primary among the inputs' primaries: least by (energy, canonical summary, canonical full
 * point). Canonical texts are written only for candidates tied so far; when the tied candidates
 * agree in everything the merged point keeps, any of them gives the same merged point.
 */
function primary(candidates: Entry<PointSummary>[], points: MapPoint[]): number {
  let best = 0;
  let tied = [0];
  for (let i = 1; i < candidates.length; i++) {
    const order = compareResults(candidates[i], candidates[best]);
    if (order < 0) {
      best = i;
      tied = [i];
    } else if (order === 0) tied.push(i);
  }
  if (tied.length === 1) return best;
  const first = points[tied[0]];
  if (tied.every((i) => keptEqual(points[i], first))) return tied[0];
  const full = tied.map((i) => ({ i, text: canonicalJson(points[i]) }));
  full.sort((a, b) => (a.text < b.text ? -1 : a.text > b.text ? 1 : 0));
  return full[0].i;
}

/** Merges results of one point (same key); `method` decides the rule. */
export function mergePoints(points: MapPoint[], method: 'ed' | 'meanfield', options: MergeOptions = {}): MapPoint {
  if (points.length === 0) throw new MergeError('nothing to merge');
  if (points.length === 2) {
    // Common case (a stored point and a pushed one): two plain results of different energies. The
    // general rule below gives the same: the lower is primary, the other its one confirmation
    // (history) or, for ED beyond tolerance, its one dispute.
    const [a, b] = points;
    if (a.energy !== b.energy && !a.disputed && !a.history && !b.disputed && !b.history) {
      const best = a.energy < b.energy ? a : b;
      const other = best === a ? b : a;
      const s = summaryOf(other);
      const disputes = method === 'ed' && !edEnergiesAgree(other.energy, best.energy, options);
      return mergedPoint(best, Math.min(a.level, b.level), disputes ? [s] : undefined, disputes ? undefined : [s]);
    }
  }
  const candidates: Entry<PointSummary>[] = points.map((p) => ({ energy: p.energy, s: summaryOf(p) }));
  const index = primary(candidates, points);
  const top = candidates[index];
  const best = points[index];
  // Every other result ever seen, once: results are equal when their canonical texts are, which
  // needs equal energies, so texts are written only within groups of equal energy.
  const byEnergy = new Map<number, Entry<PointSummary>[]>();
  const add = (e: Entry<PointSummary>) => {
    const group = byEnergy.get(e.energy);
    if (group) group.push(e);
    else byEnergy.set(e.energy, [e]);
  };
  let level = Infinity;
  for (let k = 0; k < points.length; k++) {
    const p = points[k];
    add(candidates[k]);
    if (p.disputed) for (const s of p.disputed) add({ energy: s.energy, s });
    if (p.history) for (const s of p.history) add({ energy: s.energy, s });
    level = Math.min(level, p.level);
  }
  const disputed: Entry<PointSummary>[] = [];
  const history: Entry<PointSummary>[] = [];
  for (const [energy, group] of byEnergy) {
    let unique = group;
    // An entry is trivially equal to itself (most groups are one result; the primary's group holds top itself).
    let same = true;
    for (let i = 1; same && i < group.length; i++) same = canonicallyEqual(group[i].s, group[0].s);
    if (same && energy === top.energy && (group[0] === top || canonicallyEqual(group[0].s, top.s))) {
      unique = []; // all equal to the primary
    } else if (same && energy !== top.energy) {
      unique = [{ energy, s: group[group.length - 1].s }]; // equal results: one, the last one's object
    } else if (group.length > 1 || energy === top.energy) {
      const byText = new Map<string, Entry<PointSummary>>();
      for (const e of group) {
        const text = textOf(e);
        const seen = byText.get(text);
        // The first of equal results keeps its place, the last one's object is kept.
        if (seen) seen.s = e.s;
        else byText.set(text, { energy: e.energy, s: e.s, text });
      }
      if (energy === top.energy) byText.delete(textOf(top));
      unique = [...byText.values()];
    }
    for (const e of unique) {
      if (method === 'ed' && !edEnergiesAgree(e.energy, best.energy, options)) disputed.push(e);
      else history.push(e);
    }
  }
  disputed.sort(compareResults);
  history.sort(compareResults);
  return mergedPoint(best, level, disputed.length > 0 ? disputed.map((e) => e.s) : undefined, history.length > 0 ? history.map((e) => e.s) : undefined);
}

const sortedUnique = <T>(items: T[], key: (x: T) => string): T[] => {
  const m = new Map<string, T>();
  for (const x of items) m.set(key(x), x);
  return [...m.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([, x]) => x);
};

function sourceOrder(a: MapSource, b: MapSource): number {
  if (a.createdAt !== b.createdAt) return a.createdAt < b.createdAt ? -1 : 1;
  const ta = canonicalJson(a);
  const tb = canonicalJson(b);
  return ta < tb ? -1 : ta > tb ? 1 : 0;
}

/**
 * Merges maps of the same identity (throws MergeError on different identities: compare them
 * with `compareMaps` instead). The result's provenance lists every source run; its author,
 * runtime and createdAt are the earliest source's, finishedAt the latest any source recorded
 * (sources interrupted and resumed keep no finishedAt).
 */
export function mergeMaps(maps: PhaseMap[], options: MergeOptions = {}): PhaseMap {
  if (maps.length === 0) throw new MergeError('no maps to merge');
  const id = maps[0].id;
  for (const m of maps) {
    if (m.id !== id) {
      throw new MergeError(
        `maps of different identities cannot be merged (${id.slice(0, 12)}… vs ${m.id.slice(0, 12)}…): they differ in model, sweep, solver options or core version; compare them instead`,
        { ids: [id, m.id] },
      );
    }
  }
  const method = maps[0].sweep.method;
  const byKey = new Map<string, MapPoint[]>();
  for (const m of maps) {
    for (const [key, p] of Object.entries(m.points)) {
      const list = byKey.get(key);
      if (list) list.push(p);
      else byKey.set(key, [p]);
    }
  }
  const points: Record<string, MapPoint> = {};
  for (const key of [...byKey.keys()].sort()) {
    const list = byKey.get(key) as MapPoint[];
    const only = list[0];
    // Fast path: a point found once, with no other results, is already in normal form.
    points[key] = list.length === 1 && !only.disputed && !only.history ? only : mergePoints(list, method, options);
  }

  const sources = sortedUnique(maps.flatMap((m) => m.provenance.sources), canonicalJson).sort(sourceOrder);
  const first = sources[0];
  const finished = sources.flatMap((s) => (s.finishedAt === undefined ? [] : [s.finishedAt])).sort().at(-1);
  // The sweep text may differ in name/refinement settings (not part of the identity): keep the canonical least.
  const sweep = sortedUnique(maps.map((m) => m.sweep), canonicalJson)[0];
  const provenance: PhaseMap['provenance'] = {
    createdAt: first.createdAt,
    runtime: first.runtime,
    seeds: [...new Set(maps.flatMap((m) => m.provenance.seeds))].sort((a, b) => a - b),
    coreVersion: maps[0].provenance.coreVersion,
    warnings: [...new Set(maps.flatMap((m) => m.provenance.warnings))].sort(),
    sources,
  };
  if (first.author !== undefined) provenance.author = first.author;
  if (finished !== undefined) provenance.finishedAt = finished;
  return { spec: maps[0].spec, id, sweep, points, provenance };
}

/** The normal form of a map (what `mergeMaps([map])` returns). */
export function normaliseMap(map: PhaseMap, options: MergeOptions = {}): PhaseMap {
  return mergeMaps([map], options);
}
