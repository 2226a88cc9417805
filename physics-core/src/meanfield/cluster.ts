/**
 * Compiling a model on a periodic cluster that is a multiple of a supercell (the first step of
 * the supercell reduction shared by mean-field and bands).
 */
import { PhasewrightError } from '../errors.js';
import { unitCellOf } from '../lattice/lattices.js';
import { compileModel } from '../model/compile.js';
import type { CompiledModel, ModelSpec } from '../model/types.js';
import { parseModelSpec } from '../model/validate.js';
import { resolveSupercell, type Supercell, type SupercellSpec } from './supercell.js';

/** Validates `spec` and returns its lattice's primitive translations. */
export function specTranslations(spec: ModelSpec): number[][] {
  // Clear errors (JSON paths) before any geometry; mean-field treats the filling as a density,
  // so it need not give a whole number of particles on the spec's cluster.
  parseModelSpec(spec, { integerParticles: false });
  const translations = unitCellOf(spec.lattice).translations;
  if (!Array.isArray(spec.lattice.size) || spec.lattice.size.length !== translations.length) {
    throw new PhasewrightError(`needs ${translations.length} entries for a ${spec.lattice.kind} lattice`, 'spec', '$.lattice.size');
  }
  return translations;
}

/**
 * Compiles `spec` (parameter `overrides` applied) on a fully periodic, untwisted cluster whose
 * length per axis is the smallest multiple of the supercell's period that is ≥ `minCells`.
 */
export function compileOnSupercellCluster(
  spec: ModelSpec,
  supercellSpec: SupercellSpec | undefined,
  minCells: number,
  overrides: Record<string, number> = {},
  path = '$.solver.supercell',
): { compiled: CompiledModel; supercell: Supercell } {
  const translations = specTranslations(spec);
  const supercell = resolveSupercell(supercellSpec, translations, path);
  const size = supercell.period.map((p) => p * Math.ceil(minCells / p));
  const clusterSpec: ModelSpec = {
    ...spec,
    lattice: { ...spec.lattice, size, boundary: size.map(() => 'periodic'), twist: size.map(() => 0) },
    particles: { kind: 'hardcore', count: 1 }, // irrelevant here; always valid
  };
  return { compiled: compileModel(clusterSpec, overrides), supercell };
}
