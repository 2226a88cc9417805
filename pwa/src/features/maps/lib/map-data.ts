/**
 * What the map view draws, from a sweep spec and its points: the axes, each point's cell (its
 * refinement level sets the cell size), the labels, the scalar observables, and the boundaries
 * traced by physics-core.
 */
import { resolveSupercell, traceBoundaries, type Boundary, type MapPoint, type SupercellSpec, type SweepSpec } from '@phasewright/physics-core';

export interface AxisInfo {
  parameter: string;
  log: boolean;
  min: number;
  max: number;
  /** Coarse grid step in the axis' own units (log axes: in log10 units). */
  step: number;
}

export function axisInfo(sweep: SweepSpec): AxisInfo[] {
  return sweep.axes.map((a) => {
    if (a.kind === 'list') {
      const min = Math.min(...a.values);
      const max = Math.max(...a.values);
      return { parameter: a.parameter, log: false, min, max, step: a.values.length > 1 ? (max - min) / (a.values.length - 1) : 1 };
    }
    const min = Math.min(a.from, a.to);
    const max = Math.max(a.from, a.to);
    const log = a.kind === 'log';
    const span = log ? Math.log10(max / min) : max - min;
    return { parameter: a.parameter, log, min, max, step: a.points > 1 ? span / (a.points - 1) : 1 };
  });
}

export interface MapCell {
  key: string;
  point: MapPoint;
  /** Coordinates along each axis (parameter values). */
  at: number[];
  /** Half-width of the cell along each axis, in the axis' units (log: log10 units). */
  half: number[];
  labelId: string | undefined;
  flagged: boolean;
}

export function mapCells(sweep: SweepSpec, points: { key: string; point: MapPoint }[]): MapCell[] {
  const axes = axisInfo(sweep);
  return points.map(({ key, point }) => ({
    key,
    point,
    at: axes.map((a) => point.parameters[a.parameter]),
    half: axes.map((a) => a.step / 2 / 2 ** point.level),
    labelId: point.label?.id,
    flagged: !point.convergence.converged || point.observables.degenerate === 1,
  }));
}

export function labelsOf(points: { point: MapPoint }[]): string[] {
  return [...new Set(points.map((p) => p.point.label?.id).filter((x): x is string => typeof x === 'string'))].sort();
}

/** Scalar observables present on at least one point, energy first. */
export function scalarObservables(points: { point: MapPoint }[]): string[] {
  const names = new Set<string>();
  for (const { point } of points) for (const [k, v] of Object.entries(point.observables)) if (typeof v === 'number') names.add(k);
  const order = ['energyPerSite', 'gap', 'fidelitySusceptibility', 'structureFactorMax', 'condensateFraction', 'densityContrast', 'maxAbsCurrent', 'maxAbsCirculation'];
  return [...names].sort((a, b) => {
    const ia = order.indexOf(a);
    const ib = order.indexOf(b);
    return (ia < 0 ? 99 : ia) - (ib < 0 ? 99 : ib) || a.localeCompare(b);
  });
}

export function scalar(point: MapPoint, name: string): number | undefined {
  if (name === 'energy') return point.energy;
  const v = point.observables[name];
  return typeof v === 'number' && Number.isFinite(v) ? v : undefined;
}

/** Boundaries between labels (empty when fewer than two labels). */
export function boundariesOf(sweep: SweepSpec, points: { key: string; point: MapPoint }[]): Boundary[] {
  const lookup: Record<string, MapPoint> = {};
  for (const p of points) lookup[p.key] = p.point;
  if (labelsOf(points).length < 2) return [];
  try {
    return traceBoundaries(sweep, lookup);
  } catch {
    return [];
  }
}

/** The caveats a reader of this map must see. */
/** Unit cells in a mean-field sweep's supercell (solver.supercell; one cell when absent); undefined if it does not resolve. */
export function supercellCells(sweep: SweepSpec): number | undefined {
  const spec = sweep.solver?.supercell as SupercellSpec | undefined;
  if (spec === 'sqrt3') return 3;
  const dim = sweep.model.lattice.size.length;
  try {
    // Cell counts and integer vectors do not depend on the lattice's translations; unit vectors stand in.
    return resolveSupercell(spec, Array.from({ length: dim }, (_, a) => Array.from({ length: dim }, (_, j) => (a === j ? 1 : 0)))).cells;
  } catch {
    return undefined;
  }
}

export function caveatsOf(sweep: SweepSpec, points: { point: MapPoint }[]): string[] {
  const out: string[] = [];
  const l = sweep.model.lattice;
  if (sweep.method === 'ed') {
    const cells = l.size.join(' × ');
    out.push(`Exact diagonalization on a finite cluster: ${l.kind}, ${cells} unit cells, ${l.boundary.join('/')} boundaries${l.twist?.some((t) => t !== 0) ? ', twisted' : ''}. Boundaries shift with cluster size and shape; compare two sizes before trusting a line.`);
  } else {
    out.push('Mean-field (Gutzwiller product states): no correlations between sites; tends to favour ordered and superfluid states. Its energy is a variational upper bound.');
    const cells = supercellCells(sweep);
    out.push(
      cells === undefined
        ? 'The mean-field supercell could not be read from the solver options.'
        : `Mean-field supercell of ${cells} unit cell${cells === 1 ? '' : 's'}: order whose period does not fit it ${cells === 1 ? '(any density wave or flux pattern that repeats over more than one cell) ' : ''}cannot appear. Repeat with a larger supercell to test for it.`,
    );
  }
  const flagged = points.filter((p) => !p.point.convergence.converged).length;
  const degenerate = points.filter((p) => p.point.observables.degenerate === 1).length;
  if (flagged) out.push(`${flagged} point${flagged === 1 ? '' : 's'} did not converge (marked ×).`);
  if (degenerate) out.push(`${degenerate} point${degenerate === 1 ? ' has' : 's have'} a degenerate ground state (marked ◦): observables are averaged over the manifold.`);
  out.push('Fidelity-susceptibility peaks indicate, but do not prove, a transition: level crossings on a small cluster and crossovers give peaks too.');
  return out;
}
