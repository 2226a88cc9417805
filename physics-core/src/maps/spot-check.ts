/**
 * What every spot-check shares (the CLI, the server's worker threads, the reviewer's browser):
 * which points are drawn, how they are re-run and how the fresh points are judged against the
 * stored ones. Sampling is reproducible: the same keys, k and seed give the same sample anywhere.
 */
import type { Method } from '../result.js';
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

/**
 * Relative energy tolerance of a spot-check per method (common practice, not a published value),
 * on |ΔE| / max(|E|, 1): energies near zero (a mean-field state with no hopping energy, say) are
 * compared in absolute terms, in the model's energy unit, where a relative difference means nothing.
 * ED: Lanczos converged to a residual r changes the energy by O(r²), so a cold re-run on the same
 * cluster agrees far below 1e-8. Mean-field: the minimizer stops on a gradient tolerance, and
 * energies from different starts that reach the same minimum agree to about 1e-6.
 */
export const SPOT_CHECK_TOLERANCE: Readonly<Record<Method, number>> = { ed: 1e-8, meanfield: 1e-6 };

/**
 * How one re-run point compares:
 * - `reproduced`: energy within tolerance and the same label (or no label on either side);
 * - `stored-lower` (mean-field only): the re-run stopped in a higher minimum. The stored point had
 *   the sweep's warm start as one more candidate and is the lower variational energy, the one a
 *   merge keeps, so the map stands there; the point passes and the report says so;
 * - `differs`: ED energy beyond tolerance, a mean-field re-run lower than the stored point (the
 *   map missed a lower minimum there and its label may be wrong), or a different label;
 * - `not-run`: the re-run failed or never came back.
 */
export type SpotCheckOutcome = 'reproduced' | 'stored-lower' | 'differs' | 'not-run';

export interface SpotCheckPointResult {
  key: string;
  parameters: Record<string, number>;
  storedEnergy: number;
  storedLabel?: string;
  freshEnergy?: number;
  absEnergyDifference?: number;
  /** |ΔE| / max(|E_stored|, 1). */
  relEnergyDifference?: number;
  freshLabel?: string;
  /** Set when either side has a label. */
  labelsAgree?: boolean;
  converged?: boolean;
  wallMs?: number;
  outcome: SpotCheckOutcome;
  /** Why the point fails (outcome `differs` or `not-run`). */
  problem?: string;
  /** What a reader should know about a passing point (outcome `stored-lower`). */
  note?: string;
}

export interface SpotCheckComparison {
  method: Method;
  sample: number;
  tolerance: number;
  points: SpotCheckPointResult[];
  maxAbsEnergyDifference: number;
  maxRelEnergyDifference: number;
  /** The point with the largest relative energy difference. */
  worstKey?: string;
  labelsAgree: number;
  labelsCompared: number;
  reproduced: number;
  storedLower: number;
  differs: number;
  /** Points that could not be re-run. */
  failed: number;
  /** At least one point, and every point reproduced or (mean-field) stored lower. */
  pass: boolean;
}

/**
 * Judges fresh re-runs of the points in `stored` (all of its keys) under the method's rule above.
 * `failures` carries the reason for keys that could not be re-run. A pass shows that the numbers
 * are reproducible, not that they are right.
 */
export function compareSpotCheck(
  method: Method,
  stored: Record<string, Pick<MapPoint, 'energy' | 'parameters' | 'label'>>,
  fresh: ReadonlyMap<string, Pick<MapPoint, 'energy' | 'label' | 'convergence' | 'wallMs'>>,
  failures: ReadonlyMap<string, string> = new Map(),
  tolerance: number = SPOT_CHECK_TOLERANCE[method],
): SpotCheckComparison {
  if (!(tolerance > 0)) throw new RangeError(`spot-check tolerance must be a positive number (got ${tolerance})`);
  const counts: Record<SpotCheckOutcome, number> = { reproduced: 0, 'stored-lower': 0, differs: 0, 'not-run': 0 };
  let maxAbs = 0;
  let maxRel = 0;
  let worstKey: string | undefined;
  let labelsAgree = 0;
  let labelsCompared = 0;
  const points = Object.keys(stored)
    .sort()
    .map((key): SpotCheckPointResult => {
      const old = stored[key];
      const base = { key, parameters: old.parameters, storedEnergy: old.energy, ...(old.label ? { storedLabel: old.label.id } : {}) };
      const f = fresh.get(key);
      if (!f) {
        counts['not-run']++;
        return { ...base, outcome: 'not-run', problem: failures.get(key) ?? 'no result came back' };
      }
      const abs = Math.abs(f.energy - old.energy);
      const rel = abs / Math.max(Math.abs(old.energy), 1);
      maxAbs = Math.max(maxAbs, abs);
      if (worstKey === undefined || rel > maxRel) {
        maxRel = rel;
        worstKey = key;
      }
      const p: SpotCheckPointResult = {
        ...base,
        freshEnergy: f.energy,
        absEnergyDifference: abs,
        relEnergyDifference: rel,
        ...(f.label ? { freshLabel: f.label.id } : {}),
        converged: f.convergence.converged,
        wallMs: f.wallMs,
        outcome: 'reproduced',
      };
      if (f.label || old.label) {
        labelsCompared++;
        p.labelsAgree = f.label?.id === old.label?.id;
        if (p.labelsAgree) labelsAgree++;
      }
      const within = rel <= tolerance;
      const labelText = `label ${old.label?.id ?? '(none)'} → ${f.label?.id ?? '(none)'}`;
      if (method === 'meanfield' && !within && f.energy > old.energy) {
        p.outcome = 'stored-lower';
        p.note = `the re-run stopped in a higher minimum (relative |ΔE| = ${rel.toExponential(2)}${p.labelsAgree === false ? `, ${labelText}` : ''}); the stored point, found with the sweep's warm start, is the lower variational energy and stands`;
      } else if (!within || p.labelsAgree === false) {
        p.outcome = 'differs';
        const problems: string[] = [];
        if (!within) {
          problems.push(
            method === 'meanfield'
              ? `the re-run found a lower minimum (relative |ΔE| = ${rel.toExponential(2)} > ${tolerance}): the stored point is not the lowest mean-field state here`
              : `relative |ΔE| = ${rel.toExponential(2)} > ${tolerance}`,
          );
        }
        if (p.labelsAgree === false) problems.push(labelText);
        p.problem = problems.join('; ');
      }
      counts[p.outcome]++;
      return p;
    });
  return {
    method,
    sample: points.length,
    tolerance,
    points,
    maxAbsEnergyDifference: maxAbs,
    maxRelEnergyDifference: maxRel,
    ...(worstKey !== undefined ? { worstKey } : {}),
    labelsAgree,
    labelsCompared,
    reproduced: counts.reproduced,
    storedLower: counts['stored-lower'],
    differs: counts.differs,
    failed: counts['not-run'],
    pass: points.length > 0 && counts.differs === 0 && counts['not-run'] === 0,
  };
}
