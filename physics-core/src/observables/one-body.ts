import { Matrix, EigenvalueDecomposition } from 'ml-matrix';
import type { Lattice } from '../model/types.js';
import { bit, transitionExpectation, type StateManifold } from './manifold.js';

/** One-body density matrix ρ_ij = ⟨b†_i b_j⟩ (Hermitian; Ns×Ns row-major re/im). */
export function oneBodyDensityMatrix(m: StateManifold, densities: Float64Array): { re: Float64Array; im: Float64Array } {
  const ns = m.basis.nSites;
  const re = new Float64Array(ns * ns);
  const im = new Float64Array(ns * ns);
  const h = new Float64Array(2);
  for (let i = 0; i < ns; i++) {
    re[i * ns + i] = densities[i];
    for (let j = i + 1; j < ns; j++) {
      // ⟨b†_i b_j⟩: move a particle j → i
      transitionExpectation(m, bit(i) | bit(j), bit(j), bit(i) | bit(j), h);
      re[i * ns + j] = h[0];
      im[i * ns + j] = h[1];
      re[j * ns + i] = h[0];
      im[j * ns + i] = -h[1];
    }
  }
  return { re, im };
}

/**
 * Momentum distribution n(q) = ⟨b†_q b_q⟩ = (1/Ns) Σ_ij e^{iq·(r_i − r_j)} ρ_ij with
 * b_q = Ns^{-1/2} Σ_j e^{−iq·r_j} b_j. Gauge dependent when hops carry Peierls phases.
 */
export function momentumDistribution(
  lattice: Lattice,
  obdm: { re: Float64Array; im: Float64Array },
  momenta: number[][] = lattice.momenta,
): { q: [number, number]; value: number }[] {
  const ns = lattice.sites.length;
  const sites = lattice.sites;
  return momenta.map(([qx, qy]) => {
    let value = 0;
    for (let i = 0; i < ns; i++) {
      for (let j = 0; j < ns; j++) {
        const phase = qx * (sites[i].x - sites[j].x) + qy * (sites[i].y - sites[j].y);
        // Re(e^{iφ} ρ_ij)
        value += Math.cos(phase) * obdm.re[i * ns + j] - Math.sin(phase) * obdm.im[i * ns + j];
      }
    }
    return { q: [qx, qy] as [number, number], value: value / ns };
  });
}

/**
 * Eigenvalues of the Hermitian ρ, descending, through ml-matrix on the real symmetric embedding
 * [[Re, −Im], [Im, Re]] (each eigenvalue appears twice; every second one is kept).
 */
export function obdmEigenvalues(obdm: { re: Float64Array; im: Float64Array }, ns: number): number[] {
  const big = Matrix.zeros(2 * ns, 2 * ns);
  for (let i = 0; i < ns; i++) {
    for (let j = 0; j < ns; j++) {
      const a = obdm.re[i * ns + j];
      const b = obdm.im[i * ns + j];
      big.set(i, j, a);
      big.set(i + ns, j + ns, a);
      big.set(i, j + ns, -b);
      big.set(i + ns, j, b);
    }
  }
  const values = new EigenvalueDecomposition(big, { assumeSymmetric: true }).realEigenvalues.sort((x, y) => y - x);
  return values.filter((_, k) => k % 2 === 0);
}

/** Condensate fraction: largest eigenvalue of ρ divided by N (0 for N = 0). */
export function condensateFraction(obdm: { re: Float64Array; im: Float64Array }, ns: number, nParticles: number): number {
  if (nParticles === 0) return 0;
  return obdmEigenvalues(obdm, ns)[0] / nParticles;
}
