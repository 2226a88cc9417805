/**
 * The sweep engine. It plans, skips points already in the map (resume), hands path segments to
 * an `Executor`, collects points as they stream back, reports progress, and after the coarse
 * pass runs refinement rounds. Everything that crosses the executor boundary is plain data
 * (structured-clone safe), so the same interface serves an in-process loop, Node worker threads
 * (physics-core/cli) and the PWA's web-worker pool.
 */
import { PhasewrightError } from '../errors.js';
import { CORE_VERSION } from '../version.js';
import type { MapPoint, PhaseMap, RuntimeInfo } from '../maps/map-format.js';
import { MAP_SPEC_ID } from '../maps/map-format.js';
import { mergePoints } from '../maps/merge.js';
import { mapIdentity } from '../maps/provenance.js';
import type { Executor, PointEvent, PointSolver, SegmentJob, SweepContext } from './segment.js';
import { runSegment } from './segment.js';
import type { ChunkSpec, WorkItem } from './plan.js';
import { chunkPlan, defaultSegmentLength, planSweep, segmentPath } from './plan.js';
import { refineItems } from './refine.js';
import type { SweepSpec } from './spec.js';

export type { Executor, PointEvent, PointOutcome, PointRequest, PointSolver, SegmentJob, SweepContext } from './segment.js';
export { pointFromResult, runSegment } from './segment.js';

/** Runs segments one after another in the calling thread (tests, and a web worker calling the core directly). */
export class InProcessExecutor implements Executor {
  readonly concurrency = 1;
  constructor(private readonly solve: PointSolver) {}
  async run(jobs: SegmentJob[], onEvent: (event: PointEvent) => void, signal?: AbortSignal): Promise<void> {
    for (const job of jobs) await runSegment(job, this.solve, onEvent, signal);
  }
}

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

/* ------------------------------------------------------------------------ engine -- */

export interface Progress {
  /** Points computed (or failed) in this run. */
  done: number;
  /** Points to compute in this run so far (grows when refinement adds points). */
  total: number;
  /** Points found in the map already and skipped. */
  skipped: number;
  failed: number;
  /** Points per second in this run. */
  rate: number;
  /** Seconds left at the current rate (NaN before the first point). */
  etaS: number;
  /** 0 = coarse pass, r = r-th refinement round. */
  round: number;
}

export interface RunOptions {
  executor: Executor;
  runtime: RuntimeInfo;
  author?: string;
  /** Run only this chunk of the coarse plan (refinement is then skipped: it needs the whole map). */
  chunk?: ChunkSpec;
  /** A map of the same sweep to continue: its points are not recomputed. */
  resume?: PhaseMap;
  /** Run refinement rounds after the coarse pass. @default true unless `chunk` is given */
  refine?: boolean;
  signal?: AbortSignal;
  onProgress?: (progress: Progress) => void;
  /** Called after every point is added (e.g. to checkpoint the map); the map is live, do not keep it. */
  onPoint?: (map: PhaseMap, key: string) => void;
  /** @default CORE_VERSION */
  coreVersion?: string;
  /** Points per segment. @default defaultSegmentLength(number of coarse points) */
  segmentLength?: number;
}

export interface RunOutcome {
  map: PhaseMap;
  cancelled: boolean;
  computed: number;
  skipped: number;
  failed: number;
}

/** An empty map for a sweep, with this run as its only source. */
export function createMap(sweep: SweepSpec, runtime: RuntimeInfo, author?: string, coreVersion: string = CORE_VERSION): PhaseMap {
  const createdAt = new Date().toISOString();
  const source = author !== undefined ? { author, createdAt, runtime } : { createdAt, runtime };
  const map: PhaseMap = {
    spec: MAP_SPEC_ID,
    id: mapIdentity(sweep, coreVersion),
    sweep: structuredClone(sweep),
    points: {},
    provenance: { createdAt, runtime, seeds: [sweep.seed ?? 0], coreVersion, warnings: [], sources: [source] },
  };
  if (author !== undefined) map.provenance.author = author;
  return map;
}

function addPoint(map: PhaseMap, key: string, point: MapPoint): void {
  const existing = map.points[key];
  map.points[key] = existing ? mergePoints([existing, point], map.sweep.method) : point;
  const warnings = new Set(map.provenance.warnings);
  for (const w of point.warnings ?? []) warnings.add(`${key}: ${w}`);
  map.provenance.warnings = [...warnings].sort();
}

/** Sorts points by key so that the map's text does not depend on arrival order. */
function sortPoints(map: PhaseMap): void {
  const sorted: Record<string, MapPoint> = {};
  for (const key of Object.keys(map.points).sort()) sorted[key] = map.points[key];
  map.points = sorted;
}

/**
 * Runs a sweep (or one chunk of it, or the rest of a resumed map) and returns the map. Cancelling
 * through `signal` returns the partial map with `cancelled: true` and no `finishedAt`.
 */
export async function runSweep(sweep: SweepSpec, options: RunOptions): Promise<RunOutcome> {
  const coreVersion = options.coreVersion ?? CORE_VERSION;
  let map: PhaseMap;
  const startedAt = new Date().toISOString();
  if (options.resume) {
    const id = mapIdentity(sweep, coreVersion);
    if (options.resume.id !== id) {
      throw new PhasewrightError(
        'the map to resume belongs to a different sweep (model, axes, method, solver options, seed or core version differ)',
        'resume',
        undefined,
        { mapId: options.resume.id, sweepId: id },
      );
    }
    map = structuredClone(options.resume);
    const source = options.author !== undefined ? { author: options.author, createdAt: startedAt, runtime: options.runtime } : { createdAt: startedAt, runtime: options.runtime };
    map.provenance.sources = [...map.provenance.sources, source];
    delete map.provenance.finishedAt;
  } else {
    map = createMap(sweep, options.runtime, options.author, coreVersion);
  }
  const context: SweepContext = {
    model: sweep.model,
    axes: sweep.axes.map((a) => a.parameter),
    method: sweep.method,
    solver: sweep.solver ?? {},
    seed: sweep.seed ?? 0,
    runtime: options.runtime,
  };
  if (sweep.observables) context.observables = sweep.observables;
  if (options.author !== undefined) context.author = options.author;

  const coarse = planSweep(sweep, options.segmentLength ? { segmentLength: options.segmentLength } : {});
  const plan = options.chunk ? chunkPlan(coarse, options.chunk) : coarse;
  const segLen = options.segmentLength ?? defaultSegmentLength(coarse.items.length);
  const t0 = now();
  const progress: Progress = { done: 0, total: 0, skipped: 0, failed: 0, rate: 0, etaS: NaN, round: 0 };
  const report = () => {
    const s = (now() - t0) / 1000;
    progress.rate = s > 0 ? progress.done / s : 0;
    progress.etaS = progress.rate > 0 ? (progress.total - progress.done) / progress.rate : NaN;
    options.onProgress?.({ ...progress });
  };
  const onEvent = (event: PointEvent) => {
    progress.done++;
    if (event.kind === 'point') {
      addPoint(map, event.key, event.point);
      options.onPoint?.(map, event.key);
    } else {
      progress.failed++;
      const warnings = new Set(map.provenance.warnings);
      warnings.add(`${event.key}: failed: ${event.message}`);
      map.provenance.warnings = [...warnings].sort();
    }
    report();
  };
  const runItems = async (segments: WorkItem[][]) => {
    const jobs = segments
      .map((items) => items.filter((item) => {
        if (map.points[item.key]) {
          progress.skipped++;
          return false;
        }
        return true;
      }))
      .filter((items) => items.length > 0)
      .map((items) => ({ context, items }));
    progress.total += jobs.reduce((n, j) => n + j.items.length, 0);
    report();
    await options.executor.run(jobs, onEvent, options.signal);
  };

  let cancelled = false;
  try {
    await runItems(plan.segments);
    const refine = options.refine ?? !options.chunk;
    const maxDepth = sweep.refine?.maxDepth ?? 0;
    for (let round = 1; refine && round <= maxDepth + 1; round++) {
      const items = refineItems(sweep, map.points);
      if (items.length === 0) break;
      progress.round = round;
      await runItems(segmentPath(items, segLen));
    }
  } catch (error) {
    if (!options.signal?.aborted) throw error;
    cancelled = true;
  }
  sortPoints(map);
  if (!cancelled) {
    const finishedAt = new Date().toISOString();
    map.provenance.finishedAt = finishedAt;
    const last = map.provenance.sources.at(-1);
    if (last) last.finishedAt = finishedAt;
  }
  return { map, cancelled, computed: progress.done - progress.failed, skipped: progress.skipped, failed: progress.failed };
}
