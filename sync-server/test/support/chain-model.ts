import type { ModelSpec } from '@phasewright/physics-core';

/**
 * The server tests' and benches' model: hardcore bosons on a periodic 6-site chain at half filling,
 * −J nearest-neighbour hops and V n_i n_{i+1} (an invented test model; by Jordan–Wigner its V = 0
 * ground energy is the free-fermion −4J, Lieb, Schultz & Mattis, Ann. Phys. 1961).
 */
export const CHAIN_6: ModelSpec = {
  spec: 'phasewright.model/1',
  name: 'chain L=6',
  lattice: { kind: 'chain', size: [6], boundary: ['periodic'] },
  particles: { kind: 'hardcore', filling: 0.5 },
  parameters: { J: 1, V: 1 },
  terms: [
    { kind: 'hop', neighbors: 1, amplitude: '-J' },
    { kind: 'interaction', neighbors: 1, amplitude: 'V' },
  ],
};
