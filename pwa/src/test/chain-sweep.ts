import type { SweepSpec } from '@phasewright/physics-core';

/**
 * Test fixture: an ED cut in V of hardcore bosons on an open chain at half filling, hopping J = 1
 * and nearest-neighbour repulsion V (free fermions at V = 0 by Jordan–Wigner).
 */
export function chainVCut(o: { name: string; sites: number; to: number; points: number; seed: number }): SweepSpec {
  return {
    spec: 'phasewright.sweep/1',
    name: o.name,
    model: {
      spec: 'phasewright.model/1',
      lattice: { kind: 'chain', size: [o.sites], boundary: ['open'] },
      particles: { kind: 'hardcore', filling: 0.5 },
      parameters: { J: 1, V: 0 },
      terms: [
        { kind: 'hop', neighbors: 1, amplitude: '-J' },
        { kind: 'interaction', neighbors: 1, amplitude: 'V' },
      ],
    },
    axes: [{ parameter: 'V', kind: 'linear', from: 0, to: o.to, points: o.points }],
    method: 'ed',
    solver: { fidelity: false },
    seed: o.seed,
  };
}
