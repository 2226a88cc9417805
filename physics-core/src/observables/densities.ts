import { probabilities, type StateManifold } from './manifold.js';

/** ⟨n_i⟩ and ⟨n_i n_j⟩ (Ns×Ns row-major, diagonal = ⟨n_i⟩) in one pass over the basis. */
export function densityCorrelations(m: StateManifold): { densities: Float64Array; correlations: Float64Array } {
  const ns = m.basis.nSites;
  const p = probabilities(m);
  const states = m.basis.states;
  const densities = new Float64Array(ns);
  const correlations = new Float64Array(ns * ns);
  const occupied = new Int32Array(ns);
  for (let r = 0; r < p.length; r++) {
    const w = p[r];
    if (w === 0) continue;
    let s = states[r] | 0;
    let count = 0;
    while (s !== 0) {
      const low = s & -s;
      occupied[count++] = 31 - Math.clz32(low);
      s ^= low;
    }
    for (let a = 0; a < count; a++) {
      const i = occupied[a];
      densities[i] += w;
      const row = i * ns;
      for (let b = 0; b < count; b++) correlations[row + occupied[b]] += w;
    }
  }
  return { densities, correlations };
}
