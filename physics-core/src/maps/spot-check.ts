/**
 * What every spot-check shares (the CLI, the server's worker threads, the reviewer's browser):
 * which points are drawn and how they are re-run. The comparison rules stay with each caller's
 * report. Sampling is reproducible: the same keys, k and seed give the same sample anywhere.
 */
import type { MapPoint, RuntimeInfo } from './map-format.js';
import type { SweepSpec } from '../sweep/spec.js';
import type { SegmentJob } from '../sweep/segment.js';
import { mulberry32 } from '../util/random.js';

/** K keys drawn without replacement by a seeded Fisher–Yates shuffle of the sorted keys; returned sorted. */
export function samplePointKeys(keys: string[], k: number, seed: number): string[] {
  const sorted = [...keys].sort();
  const random = mulberry32(seed);
  for (let i = sorted.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [sorted[i], sorted[j]] = [sorted[j], sorted[i]];
  }
  return sorted.slice(0, Math.min(Math.max(0, Math.floor(k)), sorted.length)).sort();
}

/** One cold segment per point, so every re-run is independent of the path that first computed it. */
export function spotCheckJobs(sweep: SweepSpec, points: Record<string, Pick<MapPoint, 'parameters' | 'level'>>, keys: string[], runtime: RuntimeInfo): SegmentJob[] {
  const context = {
    model: sweep.model,
    axes: sweep.axes.map((a) => a.parameter),
    method: sweep.method,
    solver: sweep.solver ?? {},
    seed: sweep.seed ?? 0,
    runtime,
    ...(sweep.observables ? { observables: sweep.observables } : {}),
  };
  return keys.map((key) => ({ context, items: [{ key, parameters: points[key].parameters, coords: [], level: points[key].level }] }));
}
