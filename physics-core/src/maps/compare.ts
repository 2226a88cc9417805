/**
 * Comparing two maps (any identities: two methods, two cluster sizes, two people): align them on
 * the parameter points they share and report the differences of every scalar observable present
 * in both, of energies, and of phase labels.
 */
import type { PhaseMap } from './map-format.js';
import { pointKey } from '../sweep/plan.js';

export interface PointComparison {
  key: string;
  parameters: Record<string, number>;
  /** b − a for the energy and for every scalar observable both points carry. */
  differences: Record<string, number>;
  labelA?: string;
  labelB?: string;
  labelsAgree: boolean;
}

export interface ObservableSummary {
  /** Points where both maps carry the observable. */
  count: number;
  maxAbsDifference: number;
  /** Key of the point with the largest |b − a|. */
  worstKey: string;
}

export interface MapComparison {
  /** Parameter names both maps sweep (points are aligned on these; other swept parameters must be absent). */
  sharedParameters: string[];
  common: PointComparison[];
  onlyInA: string[];
  onlyInB: string[];
  /** Per observable (and `energy`): how many points compared and the largest difference. */
  summary: Record<string, ObservableSummary>;
  labelAgreement: { agree: number; compared: number };
}

/** Aligns two maps on common parameter points (keys rebuilt from the parameters, so axis order does not matter). */
export function compareMaps(a: PhaseMap, b: PhaseMap): MapComparison {
  const index = (m: PhaseMap) => {
    const out = new Map<string, PhaseMap['points'][string]>();
    for (const p of Object.values(m.points)) out.set(pointKey(p.parameters), p);
    return out;
  };
  const ia = index(a);
  const ib = index(b);
  const paramsA = new Set(a.sweep.axes.map((x) => x.parameter));
  const sharedParameters = b.sweep.axes.map((x) => x.parameter).filter((p) => paramsA.has(p)).sort();
  const common: PointComparison[] = [];
  const summary: Record<string, ObservableSummary> = {};
  let agree = 0;
  let compared = 0;
  for (const [key, pa] of [...ia.entries()].sort(([x], [y]) => (x < y ? -1 : x > y ? 1 : 0))) {
    const pb = ib.get(key);
    if (!pb) continue;
    const differences: Record<string, number> = { energy: pb.energy - pa.energy };
    for (const [name, va] of Object.entries(pa.observables)) {
      const vb = pb.observables[name];
      if (typeof va === 'number' && typeof vb === 'number') differences[name] = vb - va;
    }
    for (const [name, d] of Object.entries(differences)) {
      const s = summary[name] ?? (summary[name] = { count: 0, maxAbsDifference: 0, worstKey: key });
      s.count++;
      if (Math.abs(d) > s.maxAbsDifference) {
        s.maxAbsDifference = Math.abs(d);
        s.worstKey = key;
      }
    }
    const c: PointComparison = { key, parameters: pa.parameters, differences, labelsAgree: pa.label?.id === pb.label?.id };
    if (pa.label) c.labelA = pa.label.id;
    if (pb.label) c.labelB = pb.label.id;
    if (pa.label && pb.label) {
      compared++;
      if (c.labelsAgree) agree++;
    }
    common.push(c);
  }
  return {
    sharedParameters,
    common,
    onlyInA: [...ia.keys()].filter((k) => !ib.has(k)).sort(),
    onlyInB: [...ib.keys()].filter((k) => !ia.has(k)).sort(),
    summary,
    labelAgreement: { agree, compared },
  };
}
