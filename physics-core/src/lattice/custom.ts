/**
 * Custom lattices: the user gives one unit cell (sites with Cartesian positions and optional
 * sublattice labels), one translation vector per axis, and optional named bonds
 * `{ class, from, to, offset }` (cell site `from` in cell 0 to cell site `to` in cell `offset`).
 * Shells `nn` and `nnn` are found by distance as for every lattice; a named bond that coincides
 * with an automatic one adds its class to it, otherwise it becomes an extra bond (with the shell
 * of its length). Named bonds are re-oriented to the canonical orientation (lower cell-site index
 * → higher; same index: +x, or +y when dx = 0).
 */
import type { CustomLatticeSpec } from '../model/types.js';
import type { UnitCell } from './unit-cell.js';

export function customUnitCell(spec: CustomLatticeSpec): UnitCell {
  const named = (spec.bonds ?? []).map((b) => ({ class: b.class, from: b.from, to: b.to, offset: b.offset.slice() }));
  const classes = ['nn', 'nnn'];
  for (const b of named) if (!classes.includes(b.class)) classes.push(b.class);
  return {
    kind: 'custom',
    translations: spec.translations.map((t) => [t[0], t[1]]),
    basis: spec.sites.map((s, i) => ({ x: s.x, y: s.y, sublattice: s.sublattice ?? i })),
    named,
    classes,
  };
}

/** Bond classes a custom lattice defines. */
export function customClasses(spec: CustomLatticeSpec): string[] {
  return customUnitCell(spec).classes;
}
