/**
 * The one-particle (N = 1) picture of a point's model, for the point detail: the Bloch bands
 * along the lattice's high-symmetry path, the Berry curvature of the lowest band group on the
 * Brillouin-zone mesh and the Chern numbers of every isolated band group (Fukui–Hatsugai–Suzuki,
 * all computed by physics-core's `bandsOfSpec`). This module only shapes the answer for drawing;
 * it runs in the bands worker (../workers/bands-worker.ts) because compiling the model on the
 * periodic cluster costs ~0.1 s for a 2D lattice.
 */
import { bandsOfSpec, type ModelSpec } from '@phasewright/physics-core';

/** k points per reciprocal axis of the Chern / Berry-curvature mesh. */
export const BANDS_MESH = 24;
/** Points along the whole high-symmetry path. */
export const BANDS_PATH_POINTS = 161;

export interface BandsView {
  nBands: number;
  path: {
    /** Cumulative path length at each k point. */
    distance: number[];
    labels: { label: string; index: number }[];
    /** energies[band][i], bands ascending. */
    energies: number[][];
  };
  /** Null on one-dimensional lattices. */
  chern: {
    mesh: number;
    groups: { bands: number[]; chern: number; directGapAbove: number | null }[];
    total: number;
  } | null;
  /**
   * Berry curvature Ω(k) of the lowest band group on the mesh plaquettes, row-major [i][j] with
   * plaquette (i, j) spanning k = (i/N … (i+1)/N) G₁ + (j/N … (j+1)/N) G₂.
   */
  curvature: { bands: number[]; mesh: number; values: number[]; reciprocal: [number[], number[]] } | null;
  /** Smallest direct gap between consecutive bands (path and mesh), for each pair. */
  gaps: { below: number; above: number; direct: number }[];
  warnings: string[];
  /** Wall time of the computation (ms), for the reader's curiosity and for our measurements. */
  ms: number;
}

/** Bands, Berry curvature and Chern numbers of `model` with `parameters` applied, for one particle. */
export function computeBands(model: ModelSpec, parameters: Record<string, number>, mesh = BANDS_MESH): BandsView {
  const t0 = performance.now();
  const report = bandsOfSpec(model, { path: { points: BANDS_PATH_POINTS }, chern: { mesh, curvature: true } }, parameters);
  let curvature: BandsView['curvature'] = null;
  const lowest = report.chern?.groups[0];
  if (report.chern && lowest?.curvature) {
    curvature = { bands: lowest.bands, mesh: report.chern.mesh, values: lowest.curvature, reciprocal: [report.chern.reciprocal[0], report.chern.reciprocal[1]] };
  }
  return {
    nBands: report.nBands,
    path: { distance: report.path.distance, labels: report.path.labels, energies: report.path.energies },
    chern: report.chern
      ? { mesh: report.chern.mesh, total: report.chern.total, groups: report.chern.groups.map((g) => ({ bands: g.bands, chern: g.chern, directGapAbove: g.directGapAbove })) }
      : null,
    curvature,
    gaps: report.gaps.map((g) => ({ below: g.below, above: g.above, direct: g.direct })),
    warnings: report.warnings,
    ms: performance.now() - t0,
  };
}

/** Signed integer with a true minus sign: "+1", "−2", "0". */
export function signed(n: number): string {
  return n > 0 ? `+${n}` : n < 0 ? `−${-n}` : '0';
}

/** "band 1", "bands 2–3" (1-based, as people count bands). */
export function bandNames(bands: number[]): string {
  return bands.length === 1 ? `band ${bands[0] + 1}` : `bands ${bands[0] + 1}–${bands[bands.length - 1] + 1}`;
}

/** Direct gaps below this are reported as (nearly) closed: the Chern number is then not to be trusted. */
export const SMALL_GAP = 1e-3;
