/**
 * Single-excitation bands of a model spec: Bloch model of the unit cell, bands along the
 * high-symmetry path, Chern numbers of isolated band groups (two-dimensional lattices).
 */
import { buildSupercellModel } from '../meanfield/supercell-model.js';
import { compileOnSupercellCluster } from '../meanfield/cluster.js';
import type { ModelSpec } from '../model/types.js';
import { bandPath, blochModelFromCell, droppedForOneParticle, type BandPath, type BandPathOptions, type BlochModel } from './bloch.js';
import { chernNumbers, type ChernOptions, type ChernResult } from './chern.js';

/** Bloch model of `spec`'s unit cell (twist ignored; see bloch.ts for the one-particle rules). */
export function blochModelFromSpec(spec: ModelSpec, overrides: Record<string, number> = {}): { model: BlochModel; warnings: string[] } {
  const { compiled, supercell } = compileOnSupercellCluster(spec, undefined, 7, overrides, '$.lattice');
  const cell = buildSupercellModel(compiled, supercell, new Array<number>(supercell.dim).fill(0));
  const model = blochModelFromCell({ nBasis: cell.nSites, translations: compiled.lattice.translations, hop: cell.hop, cond: cell.cond, onsite: cell.onsite });
  const warnings: string[] = [];
  const dropped = droppedForOneParticle(compiled);
  if (dropped.interactions > 0) warnings.push('interaction terms do not act on a single particle and are left out');
  if (dropped.occupiedHops > 0) warnings.push("conditional hops with when: 'occupied' never act on a single particle and are left out");
  if ((spec.lattice.twist ?? []).some((t) => t !== 0 && t !== '0')) warnings.push('the boundary twist is ignored by the band structure');
  return { model, warnings };
}

export interface BandsOptions {
  path?: BandPathOptions;
  chern?: ChernOptions;
}

export interface BandsReport {
  nBands: number;
  path: BandPath;
  /** Null on one-dimensional lattices. */
  chern: ChernResult | null;
  /** Between consecutive bands: smallest direct gap (along the path and on the Chern mesh) and indirect gap (min above − max below). */
  gaps: { below: number; above: number; direct: number; indirect: number }[];
  warnings: string[];
}

export function bandsOfSpec(spec: ModelSpec, options: BandsOptions = {}, overrides: Record<string, number> = {}): BandsReport {
  const { model, warnings } = blochModelFromSpec(spec, overrides);
  const path = bandPath(model, options.path);
  const chern = model.translations.length === 2 ? chernNumbers(model, options.chern) : null;
  const gaps: BandsReport['gaps'] = [];
  for (let b = 0; b + 1 < model.nBands; b++) {
    const lo = path.energies[b];
    const hi = path.energies[b + 1];
    let direct = Infinity;
    for (let i = 0; i < lo.length; i++) direct = Math.min(direct, hi[i] - lo[i]);
    const group = chern?.groups.find((g) => g.bands[g.bands.length - 1] === b);
    if (group && group.directGapAbove !== null) direct = Math.min(direct, group.directGapAbove);
    const indirect = Math.min(...hi) - Math.max(...lo);
    gaps.push({ below: b, above: b + 1, direct, indirect });
  }
  return { nBands: model.nBands, path, chern, gaps, warnings };
}
