/**
 * The in-browser spot-check: re-run K sampled points of a map cold (one point per segment, so no
 * warm start from the original path) on the page's worker pool and compare with the stored points.
 *
 * Pass rule: ED — every fresh energy within 1e-8 relative of the stored one and every label the
 * same; mean-field — every fresh energy lower than or equal to the stored one (within 1e-8
 * relative: a variational method may find a better minimum, never a worse one) and labels the same.
 * A pass shows reproducibility, not correctness.
 */
import { samplePointKeys, spotCheckJobs, type Executor, type MapPoint, type PointEvent, type RuntimeInfo, type SweepSpec } from '@phasewright/physics-core';

export const ED_RELATIVE_TOLERANCE = 1e-8;

export interface BrowserSpotCheckPoint {
  key: string;
  storedEnergy: number;
  freshEnergy?: number;
  absEnergyDifference?: number;
  relEnergyDifference?: number;
  storedLabel?: string;
  freshLabel?: string;
  labelsAgree?: boolean;
  /** Why this point fails the rule (energy or label), or why it could not be re-run. */
  problem?: string;
}

export interface BrowserSpotCheckReport {
  method: SweepSpec['method'];
  sample: number;
  seed: number;
  points: BrowserSpotCheckPoint[];
  maxAbsEnergyDifference: number;
  maxRelEnergyDifference: number;
  labelsAgree: number;
  labelsCompared: number;
  failed: number;
  pass: boolean;
  wallMs: number;
}

export { samplePointKeys };

/** Compares fresh points with stored ones under the method's rule. */
export function compareSpotCheck(
  method: SweepSpec['method'],
  stored: Record<string, MapPoint>,
  fresh: Map<string, MapPoint>,
  failures: Map<string, string>,
  meta: { seed: number; wallMs: number },
): BrowserSpotCheckReport {
  const keys = Object.keys(stored).sort();
  let maxAbs = 0;
  let maxRel = 0;
  let agree = 0;
  let compared = 0;
  let failed = 0;
  const points = keys.map((key): BrowserSpotCheckPoint => {
    const old = stored[key];
    const p: BrowserSpotCheckPoint = { key, storedEnergy: old.energy, ...(old.label ? { storedLabel: old.label.id } : {}) };
    const f = fresh.get(key);
    if (!f) {
      failed++;
      p.problem = failures.get(key) ?? 'no result came back';
      return p;
    }
    const abs = Math.abs(f.energy - old.energy);
    const scale = Math.max(Math.abs(old.energy), Number.MIN_VALUE);
    const rel = abs / scale;
    p.freshEnergy = f.energy;
    p.absEnergyDifference = abs;
    p.relEnergyDifference = rel;
    maxAbs = Math.max(maxAbs, abs);
    maxRel = Math.max(maxRel, rel);
    const problems: string[] = [];
    if (method === 'ed') {
      if (!(rel <= ED_RELATIVE_TOLERANCE)) problems.push(`|ΔE|/|E| = ${rel.toExponential(2)} > ${ED_RELATIVE_TOLERANCE}`);
    } else if (!(f.energy <= old.energy + ED_RELATIVE_TOLERANCE * scale)) {
      problems.push(`fresh energy ${f.energy} is higher than the stored ${old.energy}`);
    }
    if (f.label) p.freshLabel = f.label.id;
    if (f.label || old.label) {
      compared++;
      p.labelsAgree = f.label?.id === old.label?.id;
      if (p.labelsAgree) agree++;
      else problems.push(`label ${old.label?.id ?? '(none)'} → ${f.label?.id ?? '(none)'}`);
    }
    if (problems.length > 0) {
      failed++;
      p.problem = problems.join('; ');
    }
    return p;
  });
  return {
    method,
    sample: keys.length,
    seed: meta.seed,
    points,
    maxAbsEnergyDifference: maxAbs,
    maxRelEnergyDifference: maxRel,
    labelsAgree: agree,
    labelsCompared: compared,
    failed,
    pass: keys.length > 0 && failed === 0,
    wallMs: meta.wallMs,
  };
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
  return compareSpotCheck(sweep.method, stored, fresh, failures, { seed: options.seed, wallMs: performance.now() - t0 });
}
