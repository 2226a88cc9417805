/**
 * What runs inside an executor (a worker thread, a web worker or the calling thread): the point
 * solver interface, the plain-data messages, and the loop over one path segment. Kept free of the
 * public entry (and so of the solvers and mathjs) so that workers start fast.
 */
import type { ModelSpec } from '../model/types.js';
import type { Method, Result } from '../result.js';
import type { MapPoint, RuntimeInfo } from '../maps/map-format.js';
import { pointSeed } from '../maps/provenance.js';
import { extractObservables } from './observables.js';
import type { WorkItem } from './plan.js';

/* ------------------------------------------------------------------ point solver -- */

/** What a point solver is asked: the model with the swept parameters overridden. */
export interface PointRequest {
  model: ModelSpec;
  method: Method;
  /** The sweep's solver options, unchanged. */
  solver: Record<string, unknown>;
  /** Swept parameters (override the model's values). */
  parameters: Record<string, number>;
  /** This point's seed (derived from the sweep seed and the key). */
  seed: number;
  key: string;
  /** The swept parameters in axis order (e.g. the fidelity susceptibility is taken along the first). */
  axes: string[];
}

export interface PointOutcome {
  result: Result;
  /** Anything the next point along the path can start from (ED: the ground-state vector; mean-field: the solution). */
  warm?: unknown;
}

/** Solves one point; `warm` is the previous point's `warm` along the segment (undefined at a segment's start). */
export type PointSolver = (request: PointRequest, warm: unknown) => PointOutcome | Promise<PointOutcome>;

/* --------------------------------------------------------------------- executors -- */

/** The sweep-wide context of a segment (plain data). */
export interface SweepContext {
  model: ModelSpec;
  /** Swept parameters in axis order. */
  axes: string[];
  method: Method;
  solver: Record<string, unknown>;
  seed: number;
  observables?: string[];
  runtime: RuntimeInfo;
  author?: string;
}

/** One unit of work: a path segment; its points warm-start from each other in order. */
export interface SegmentJob {
  context: SweepContext;
  items: WorkItem[];
}

/** One finished (or failed) point, streamed back as soon as it is done. */
export type PointEvent =
  | { kind: 'point'; key: string; point: MapPoint }
  | { kind: 'failed'; key: string; message: string };

/**
 * Runs segments and streams points back. Implementations: `InProcessExecutor` (here), Node
 * worker threads (physics-core/cli/node-executor.ts), the PWA's worker pool. `run` resolves when
 * every segment is done, or rejects with the signal's reason when cancelled (points already
 * delivered stay delivered).
 */
export interface Executor {
  readonly concurrency: number;
  run(jobs: SegmentJob[], onEvent: (event: PointEvent) => void, signal?: AbortSignal): Promise<void>;
  close?(): Promise<void>;
}

const now = () => (typeof performance !== 'undefined' ? performance.now() : Date.now());

function warningsOf(result: Result): string[] {
  const w = [...(result.warnings ?? [])];
  if (!result.convergence.converged) w.push(`not converged (residual ${result.convergence.residual.toExponential(2)})`);
  if (result.degenerate) w.push('degenerate ground state');
  return [...new Set(w)].sort();
}

/** A map point from a solver's Result (what every executor sends back). */
export function pointFromResult(result: Result, item: WorkItem, context: SweepContext, wallMs: number, seed: number): MapPoint {
  const point: MapPoint = {
    parameters: { ...item.parameters },
    level: item.level,
    energy: result.energy,
    observables: extractObservables(result, context.observables),
    convergence: { ...result.convergence },
    wallMs: Math.round(wallMs * 1000) / 1000,
    seed,
    computed: { at: new Date().toISOString(), runtime: context.runtime },
  };
  if (context.author !== undefined) point.computed.author = context.author;
  if (result.label) point.label = structuredClone(result.label);
  const warnings = warningsOf(result);
  if (warnings.length > 0) point.warnings = warnings;
  return point;
}

/**
 * Runs one segment with `solve`, warm-starting along it; shared by every executor. A point whose
 * solver throws is reported as failed (the segment continues cold from the next point).
 */
export async function runSegment(
  job: SegmentJob,
  solve: PointSolver,
  onEvent: (event: PointEvent) => void,
  signal?: AbortSignal,
): Promise<void> {
  let warm: unknown;
  for (const item of job.items) {
    signal?.throwIfAborted();
    const seed = pointSeed(job.context.seed, item.key);
    const t0 = now();
    try {
      const outcome = await solve(
        { model: job.context.model, method: job.context.method, solver: job.context.solver, parameters: item.parameters, seed, key: item.key, axes: job.context.axes },
        warm,
      );
      warm = outcome.warm;
      onEvent({ kind: 'point', key: item.key, point: pointFromResult(outcome.result, item, job.context, now() - t0, seed) });
    } catch (error) {
      if (signal?.aborted) throw signal.reason;
      warm = undefined;
      onEvent({ kind: 'failed', key: item.key, message: error instanceof Error ? error.message : String(error) });
    }
  }
}

