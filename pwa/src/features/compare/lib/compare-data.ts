/**
 * What the compare view draws from two maps: physics-core's comparison on common points, the
 * cells of the difference map (placed on map A's grid), and a diverging colour scale.
 */
import { compareMaps, pointKey, type MapComparison, type MapPoint, type PhaseMap } from '@phasewright/physics-core';

export interface DifferenceCell {
  /** Key of the point in map A (cells are drawn on A's grid). */
  key: string;
  point: MapPoint;
  /** b − a of the chosen observable; undefined when one of the two lacks it. */
  difference: number | undefined;
}

export interface Comparison {
  result: MapComparison;
  /** True when both maps sweep the same parameters (a side-by-side and difference map make sense). */
  sameAxes: boolean;
}

export function compare(a: PhaseMap, b: PhaseMap): Comparison {
  const axesA = a.sweep.axes.map((x) => x.parameter).sort();
  const axesB = b.sweep.axes.map((x) => x.parameter).sort();
  return { result: compareMaps(a, b), sameAxes: axesA.join(',') === axesB.join(',') };
}

/** Observables that at least one common point has in both maps (energy first). */
export function comparableObservables(c: Comparison): string[] {
  return Object.keys(c.result.summary).sort((x, y) => (x === 'energy' ? -1 : y === 'energy' ? 1 : x.localeCompare(y)));
}

/** One cell per common point, at map A's point (keys of A rebuilt from parameters, as compareMaps does). */
export function differenceCells(a: PhaseMap, c: Comparison, observable: string): DifferenceCell[] {
  const byKey = new Map<string, [string, MapPoint]>();
  for (const [key, p] of Object.entries(a.points)) byKey.set(pointKey(p.parameters), [key, p]);
  const out: DifferenceCell[] = [];
  for (const pc of c.result.common) {
    const hit = byKey.get(pc.key);
    if (hit) out.push({ key: hit[0], point: hit[1], difference: pc.differences[observable] });
  }
  return out;
}

/** Largest |difference| (the colour scale is symmetric about zero); 0 when all agree. */
export function differenceScale(cells: DifferenceCell[]): number {
  return cells.reduce((m, c) => (c.difference === undefined ? m : Math.max(m, Math.abs(c.difference))), 0);
}

/** Diverging colour: blue (b < a) — paper (equal) — orange (b > a), Okabe–Ito ends. */
export function divergingColor(value: number | undefined, scale: number): string {
  if (value === undefined) return '#bdb6a6';
  const paper = [245, 241, 232];
  const end = value < 0 ? [0, 114, 178] : [213, 94, 0];
  const t = scale > 0 ? Math.min(1, Math.abs(value) / scale) : 0;
  return `rgb(${paper.map((p, i) => Math.round(p + (end[i] - p) * t)).join(' ')})`;
}
