import { probabilities, type StateManifold } from './manifold.js';

/**
 * ⟨n_i⟩ and ⟨n_i n_j⟩ (Ns×Ns row-major, diagonal = ⟨n_i⟩) in one pass over the basis. With
 * `m.symmetries`, rows of one site per orbit are summed and ⟨n_g(i) n_g(j)⟩ = ⟨n_i n_j⟩ fills the rest.
 */
export function densityCorrelations(m: StateManifold): { densities: Float64Array; correlations: Float64Array } {
  const ns = m.basis.nSites;
  const p = probabilities(m);
  const states = m.basis.states;
  const densities = new Float64Array(ns);
  const correlations = new Float64Array(ns * ns);
  const occupied = new Int32Array(ns);
  const perms = m.symmetries ?? [];
  // Rows summed: every site, or the smallest site of each orbit.
  const row = new Uint8Array(ns).fill(1);
  for (const g of perms) for (let i = 0; i < ns; i++) if (g[i] < i) row[i] = 0;
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
      if (row[i] === 0) continue;
      const at = i * ns;
      for (let b = 0; b < count; b++) correlations[at + occupied[b]] += w;
    }
  }
  if (perms.length) {
    for (let i = 0; i < ns; i++) {
      if (row[i] === 0) continue;
      for (const g of perms) for (let j = 0; j < ns; j++) correlations[g[i] * ns + g[j]] = correlations[i * ns + j];
    }
  }
  return { densities, correlations };
}
