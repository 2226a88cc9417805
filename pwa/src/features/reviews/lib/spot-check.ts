/**
 * The in-browser spot-check: re-run K sampled points of a map cold (one point per segment, so no
 * warm start from the original path) on the page's worker pool and judge them with physics-core's
 * compareSpotCheck, the rule the CLI and the server use too.
 */
import { compareSpotCheck, samplePointKeys, spotCheckJobs, type Executor, type MapPoint, type PointEvent, type RuntimeInfo, type SpotCheckComparison, type SweepSpec } from '@phasewright/physics-core';

export interface BrowserSpotCheckReport extends SpotCheckComparison {
  seed: number;
  wallMs: number;
}

/** Re-runs the sampled points on `executor` (the page's worker pool) and compares. */
export async function runSpotCheck(
  executor: Executor,
  sweep: SweepSpec,
  points: Record<string, MapPoint>,
  options: { sample: number; seed: number; runtime: RuntimeInfo; signal?: AbortSignal },
): Promise<BrowserSpotCheckReport> {
  const keys = samplePointKeys(Object.keys(points), options.sample, options.seed);
  if (keys.length === 0) throw new Error('The map has no points to re-run yet.');
  const stored: Record<string, MapPoint> = {};
  for (const k of keys) stored[k] = points[k];
  const fresh = new Map<string, MapPoint>();
  const failures = new Map<string, string>();
  const t0 = performance.now();
  await executor.run(
    spotCheckJobs(sweep, stored, keys, options.runtime),
    (e: PointEvent) => {
      if (e.kind === 'point') fresh.set(e.key, e.point);
      else failures.set(e.key, e.message);
    },
    options.signal,
  );
  return { ...compareSpotCheck(sweep.method, stored, fresh, failures), seed: options.seed, wallMs: performance.now() - t0 };
}
