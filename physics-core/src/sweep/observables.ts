/**
 * What a map keeps of a solver's Result for one point: scalars (for tables, cuts, colour maps,
 * refinement) and a few lists. Names:
 *
 * - `energyPerSite`, `gap` (when known), `degenerate` (1 or 0), `condensateFraction`,
 *   `densityMin`, `densityMax`, `densityContrast` (max − min site density: a density-wave
 *   indicator that also works in mean-field, where S(q) has no connected part between sites),
 *   `structureFactorMax` and its momentum `structureFactorMaxQx`, `structureFactorMaxQy`,
 *   `maxAbsCurrent`, `maxAbsCirculation`, `maxAbsChirality`;
 * - every finite number in `Result.extras` under its own name (e.g. `fidelitySusceptibility`);
 *   number lists in `extras` only when the sweep names them in `observables`;
 * - lists: `densities` (per site), `structureFactor` (rows [qx, qy, S(q)]), `condensate` (rows
 *   [re, im] per site, mean-field).
 */
import type { Result } from '../result.js';
import type { ObservableValue } from '../maps/map-format.js';

const finite = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

function maxAbs(values: number[]): number {
  let m = 0;
  for (const v of values) if (Math.abs(v) > m) m = Math.abs(v);
  return m;
}

/** All observables the map can keep for a Result (before filtering by the sweep's `observables`). */
export function allObservables(result: Result, extraLists: string[] = []): Record<string, ObservableValue> {
  const out: Record<string, ObservableValue> = {};
  out.energyPerSite = result.energyPerSite;
  if (finite(result.gap)) out.gap = result.gap;
  out.degenerate = result.degenerate ? 1 : 0;
  if (finite(result.condensateFraction)) out.condensateFraction = result.condensateFraction;
  if (result.sites.length > 0) {
    const d = result.sites.map((s) => s.density);
    out.densities = d;
    out.densityMin = Math.min(...d);
    out.densityMax = Math.max(...d);
    out.densityContrast = out.densityMax - out.densityMin;
    if (result.method === 'meanfield') out.condensate = result.sites.map((s) => [s.condensate[0], s.condensate[1]]);
  }
  if (result.structureFactor.length > 0) {
    out.structureFactor = result.structureFactor.map((s) => [s.q[0], s.q[1], s.value]);
    let best = result.structureFactor[0];
    for (const s of result.structureFactor) if (s.value > best.value) best = s;
    out.structureFactorMax = best.value;
    out.structureFactorMaxQx = best.q[0];
    out.structureFactorMaxQy = best.q[1];
  }
  if (result.bonds.length > 0) out.maxAbsCurrent = maxAbs(result.bonds.map((b) => b.current));
  if (result.plaquettes.length > 0) {
    out.maxAbsCirculation = maxAbs(result.plaquettes.map((p) => p.circulation));
    out.maxAbsChirality = maxAbs(result.plaquettes.map((p) => p.chirality));
  }
  for (const [name, v] of Object.entries(result.extras ?? {})) {
    if (name in out) continue;
    if (finite(v)) out[name] = v;
    else if (extraLists.includes(name) && Array.isArray(v) && v.length > 0 && v.every(finite)) out[name] = [...v];
  }
  return out;
}

/** The observables to store: all of them, or those named in `keep` that the result has. */
export function extractObservables(result: Result, keep?: string[]): Record<string, ObservableValue> {
  const all = allObservables(result, keep ?? []);
  if (!keep) return all;
  const out: Record<string, ObservableValue> = {};
  for (const name of keep) if (name in all) out[name] = all[name];
  return out;
}

/** S(q) at the momentum closest to q from a stored `structureFactor` table (undefined when absent). */
export function structureFactorAt(table: ObservableValue | undefined, q: [number, number]): number | undefined {
  if (!Array.isArray(table)) return undefined;
  let best: number[] | undefined;
  let dist = Infinity;
  for (const row of table) {
    if (!Array.isArray(row) || row.length < 3) continue;
    const d = Math.hypot(row[0] - q[0], row[1] - q[1]);
    if (d < dist) {
      dist = d;
      best = row;
    }
  }
  return best?.[2];
}
