import type { Lattice } from '../model/types.js';

/**
 * Density structure factor S(q) = (1/Ns) Σ_ij e^{iq·(r_i − r_j)} (⟨n_i n_j⟩ − ⟨n_i⟩⟨n_j⟩), diagonal
 * included, at the cluster's allowed momenta (lattice.momenta). The connected correlation is real
 * and symmetric, so S(q) = (1/Ns) Σ_ij cos(q·(r_i − r_j)) C_ij is real.
 */
export function structureFactor(
  lattice: Lattice,
  densities: Float64Array,
  correlations: Float64Array,
  momenta: number[][] = lattice.momenta,
): { q: [number, number]; value: number }[] {
  const ns = densities.length;
  const sites = lattice.sites;
  return momenta.map(([qx, qy]) => {
    let value = 0;
    for (let i = 0; i < ns; i++) {
      for (let j = 0; j < ns; j++) {
        const c = correlations[i * ns + j] - densities[i] * densities[j];
        value += Math.cos(qx * (sites[i].x - sites[j].x) + qy * (sites[i].y - sites[j].y)) * c;
      }
    }
    return { q: [qx, qy] as [number, number], value: value / ns };
  });
}
