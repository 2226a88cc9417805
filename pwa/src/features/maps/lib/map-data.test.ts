import type { MapPoint, SweepSpec } from '@phasewright/physics-core';
import { describe, expect, it } from 'vitest';
import { axisInfo, boundariesOf, caveatsOf, labelsOf, mapCells, scalarObservables } from './map-data.js';

const model = {
  spec: 'phasewright.model/1' as const,
  lattice: { kind: 'chain' as const, size: [8], boundary: ['periodic' as const] },
  particles: { kind: 'hardcore' as const, filling: 0.5 },
  parameters: { J: 1, V: 0 },
  terms: [{ kind: 'interaction' as const, neighbors: 1, amplitude: 'V' }],
};
const sweep: SweepSpec = { spec: 'phasewright.sweep/1', model, axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 4, points: 5 }], method: 'ed' };

function pt(V: number, label: string, converged = true, level = 0): { key: string; point: MapPoint } {
  return {
    key: `V=${V}`,
    point: {
      parameters: { V },
      level,
      energy: -V,
      observables: { energyPerSite: -V / 8, gap: 1, degenerate: V === 4 ? 1 : 0 },
      convergence: { converged, iterations: 1, residual: 0 },
      wallMs: 1,
      seed: 0,
      computed: { at: '', runtime: { kind: 'browser', version: '', cores: 1 } },
      label: { id: label, confidence: 1, evidence: {} },
    },
  };
}

describe('map data', () => {
  const points = [pt(0, 'superfluid'), pt(1, 'superfluid'), pt(2, 'superfluid', false), pt(3, 'density-wave'), pt(4, 'density-wave'), pt(2.5, 'density-wave', true, 1)];

  it('cells are as wide as the grid step, halved per refinement level', () => {
    expect(axisInfo(sweep)[0]).toMatchObject({ min: 0, max: 4, step: 1, log: false });
    const cells = mapCells(sweep, points);
    expect(cells.find((c) => c.key === 'V=1')?.half).toEqual([0.5]);
    expect(cells.find((c) => c.key === 'V=2.5')?.half).toEqual([0.25]);
    expect(cells.find((c) => c.key === 'V=2')?.flagged).toBe(true);
  });

  it('labels sorted, scalar observables energy-first, a boundary between the two labels', () => {
    expect(labelsOf(points)).toEqual(['density-wave', 'superfluid']);
    expect(scalarObservables(points).slice(0, 2)).toEqual(['energyPerSite', 'gap']);
    const b = boundariesOf(sweep, points);
    expect(b.length).toBe(1);
    expect(b[0].between).toEqual(['density-wave', 'superfluid']);
    const v = b[0].vertices[0].at.V;
    // Between the last superfluid point (V = 2) and the first density-wave point of the coarse grid.
    expect(v).toBeGreaterThan(2);
    expect(v).toBeLessThan(3);
    expect(b[0].vertices[0].uncertainty.V).toBeGreaterThan(0);
  });

  it('caveats name the cluster, count flagged points and warn about fidelity peaks', () => {
    const c = caveatsOf(sweep, points.map((p) => ({ point: p.point }))).join(' ');
    expect(c).toMatch(/chain, 8 unit cells, periodic/);
    expect(c).toMatch(/1 point did not converge/);
    expect(c).toMatch(/1 point has a degenerate ground state/);
    expect(c).toMatch(/indicate, but do not prove/);
    expect(caveatsOf({ ...sweep, method: 'meanfield' }, []).join(' ')).toMatch(/Mean-field/);
    // A one-cell supercell cannot hold a density wave of period two: said on every such map.
    expect(caveatsOf({ ...sweep, method: 'meanfield' }, []).join(' ')).toMatch(/supercell of 1 unit cell: .* cannot appear/);
    expect(caveatsOf({ ...sweep, method: 'meanfield', solver: { supercell: [4] } }, []).join(' ')).toMatch(/supercell of 4 unit cells: order whose period does not fit it cannot appear/);
    expect(caveatsOf({ ...sweep, method: 'meanfield', solver: { supercell: 'sqrt3' } }, []).join(' ')).toMatch(/supercell of 3 unit cells/);
  });
});
