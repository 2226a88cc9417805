/**
 * The unit cell of a lattice (translations, basis, named bond classes) and the canonical bond
 * orientation shared by every lattice. Internal to `lattice/`; the public shape is `Lattice`.
 */
import type { LatticeKind } from '../model/types.js';

/** A bond of the infinite lattice: from basis site `from` in cell 0 to basis site `to` in cell `offset`. */
export interface CellBond {
  from: number;
  to: number;
  offset: number[];
  dx: number;
  dy: number;
  /** Neighbour shell by distance (1 = nearest). */
  shell: number;
  classes: string[];
}

export interface UnitCell {
  kind: LatticeKind;
  /** Primitive translations, one [x, y] per axis (1 or 2 axes). */
  translations: number[][];
  /** Basis sites relative to the cell origin; `sublattice` is a label (equals the index for built-in lattices). */
  basis: { x: number; y: number; sublattice: number }[];
  /** Lattice-specific classes added to automatic (shell) bonds, by geometry. */
  classify?: (b: Omit<CellBond, 'classes'>) => string[];
  /** Explicitly named bonds (custom lattices), oriented as given. */
  named?: { class: string; from: number; to: number; offset: number[] }[];
  /** Every bond class this lattice defines (always including `nn` and `nnn`). */
  classes: string[];
}

/** Relative tolerance for equal distances (shells) and for zero components of vectors. */
export const DISTANCE_TOLERANCE = 1e-6;

/**
 * Canonical orientation of a bond or path between basis sites `a` → `b` with displacement
 * (dx, dy): from the lower basis index to the higher; within one basis index, towards +x, or
 * towards +y when dx = 0 (|dx| below tolerance × `scale`).
 */
export function isCanonical(a: number, b: number, dx: number, dy: number, scale: number): boolean {
  if (a !== b) return a < b;
  const eps = DISTANCE_TOLERANCE * scale;
  if (dx > eps) return true;
  if (dx < -eps) return false;
  return dy > eps;
}
