/**
 * The shared contract of physics-core: model spec v1 as JSON (what users write), the lattice
 * geometry built from it, and the compiled model (operator-level terms over site indices) that
 * every solver consumes. Data flows one way: ModelSpec → Lattice → CompiledModel → solver → Result.
 */

/* ------------------------------------------------------------------ model spec v1 (JSON) -- */

export const MODEL_SPEC_ID = 'phasewright.model/1';

export type LatticeKind =
  | 'chain'
  | 'ladder'
  | 'zigzag'
  | 'square'
  | 'triangular'
  | 'honeycomb'
  | 'kagome'
  | 'custom';

export type BoundaryKind = 'open' | 'periodic';

/** A site of a custom lattice's unit cell. */
export interface CustomSiteSpec {
  x: number;
  y: number;
  /** Sublattice label; defaults to the site's position in `sites`. */
  sublattice?: number;
}

/** A named bond of a custom lattice: from cell-site `from` in cell 0 to `to` in cell `offset`. */
export interface CustomBondSpec {
  class: string;
  from: number;
  to: number;
  offset: number[];
}

export interface CustomLatticeSpec {
  /** Sites of one unit cell, in Cartesian coordinates. */
  sites: CustomSiteSpec[];
  /** Primitive translation vectors (one per axis of `size`), each [x, y]. */
  translations: number[][];
  /** Optional named bond classes beyond the automatic `nn`/`nnn` shells. */
  bonds?: CustomBondSpec[];
}

export interface LatticeSpec {
  kind: LatticeKind;
  /** Unit cells per axis. */
  size: number[];
  /** Open or periodic per axis. */
  boundary: BoundaryKind[];
  /** Boundary phase in radians per axis (expression or number); used on periodic axes. */
  twist?: (number | string)[];
  /** Only for kind `custom`. */
  custom?: CustomLatticeSpec;
}

export interface ParticlesSpec {
  kind: 'hardcore';
  filling?: number;
  count?: number;
}

export type TermKind = 'hop' | 'conditional-hop' | 'interaction' | 'onsite';

export interface TermSpec {
  kind: TermKind;
  /** n-th shell of distances (1 = nearest). For conditional hops, the shell of the pair (i, j). */
  neighbors?: number;
  /** Only pairs (i, j) joined by a bond of this class. */
  class?: string;
  /** Conditional hops: both steps j→k and k→i must be bonds of this class. */
  legs?: string;
  /** Conditional hops: how the intermediate site is found. */
  via?: 'common-neighbor';
  /** Conditional hops: the hop is allowed only when k is empty (1−n_k) or occupied (n_k). */
  when?: 'empty' | 'occupied';
  /** mathjs expression over parameters, `pi`, `turn`, `dx`, `dy`; or a number. */
  amplitude: number | string;
  /** Peierls phase in radians (hop terms only), expression or number. @default 0 */
  phase?: number | string;
}

export interface ModelSpec {
  spec: typeof MODEL_SPEC_ID;
  name?: string;
  lattice: LatticeSpec;
  particles: ParticlesSpec;
  parameters: Record<string, number | string>;
  terms: TermSpec[];
}

/* ------------------------------------------------------------------- lattice geometry -- */

export interface Site {
  index: number;
  x: number;
  y: number;
  /** Index of the site within its unit cell. */
  sublattice: number;
  /** Unit-cell coordinates, one integer per axis. */
  cell: number[];
}

/**
 * A directed bond `from` → `to` (the lattice's documented orientation). A hop on it reads
 * t·b†_to b_from + h.c.; dx, dy are the displacement from `from` to `to` in the unwrapped plane.
 * Distinct periodic images of the same pair are distinct bonds.
 */
export interface Bond {
  index: number;
  from: number;
  to: number;
  dx: number;
  dy: number;
  /** Neighbour shell (1 = nearest), by distance with tolerance. */
  shell: number;
  /** Bond classes: always `nn` for shell 1 and `nnn` for shell 2, plus lattice-specific ones. */
  classes: string[];
  /** Signed number of boundary crossings per axis going from → to (0 on open axes). */
  wrap: number[];
}

/** A two-step path from → via → to through a common neighbour (for conditional hops). */
export interface Path {
  index: number;
  from: number;
  via: number;
  to: number;
  /** Bond indices of the two steps and whether each is traversed along (+1) or against (−1) the bond. */
  first: { bond: number; sign: 1 | -1 };
  second: { bond: number; sign: 1 | -1 };
  /** +1 counter-clockwise, −1 clockwise, 0 straight (sign of the cross product of the two steps). */
  turn: -1 | 0 | 1;
  /** Total displacement from → to. */
  dx: number;
  dy: number;
  /** Total boundary crossings per axis going from → to. */
  wrap: number[];
  /**
   * The bond joining the two ends with this displacement (same periodic image), when one was
   * built; sign +1 when the path runs along the bond's orientation. (Added compatibly.)
   */
  pair?: { bond: number; sign: 1 | -1 };
}

/** A smallest loop, sites listed counter-clockwise. */
export interface Plaquette {
  index: number;
  sites: number[];
  /** The loop's steps as bonds with the traversal sign (+1 along the bond's orientation). */
  steps: { bond: number; sign: 1 | -1 }[];
  area: number;
  cx: number;
  cy: number;
}

export interface Lattice {
  kind: LatticeKind;
  size: number[];
  boundary: BoundaryKind[];
  /** Twist angles in radians per axis (0 on open axes). */
  twist: number[];
  /** Primitive translations, one [x, y] per axis. */
  translations: number[][];
  /** Unit cell sites (positions relative to the cell origin). */
  basis: { x: number; y: number; sublattice: number }[];
  sites: Site[];
  bonds: Bond[];
  paths: Path[];
  plaquettes: Plaquette[];
  /** Distances of the neighbour shells found, shell n at index n−1. */
  shellDistances: number[];
  /** Momenta allowed by the cluster (periodic axes: 2π m / L along reciprocal vectors), each [qx, qy]. */
  momenta: number[][];
}

/* --------------------------------------------------------------------- compiled model -- */

/** t·b†_to b_from + h.c. with t = re + i·im (twist phase included). */
export interface HopEntry {
  from: number;
  to: number;
  re: number;
  im: number;
  bond: number;
}

/** t·b†_to (1−n_via) b_from + h.c. (when `empty`) or t·b†_to n_via b_from + h.c. (when `occupied`). */
export interface ConditionalHopEntry {
  from: number;
  via: number;
  to: number;
  re: number;
  im: number;
  path: number;
}

/** value·n_i n_j */
export interface InteractionEntry {
  i: number;
  j: number;
  value: number;
  bond: number;
}

/** value·n_i */
export interface OnsiteEntry {
  i: number;
  value: number;
}

interface CompiledTermBase {
  /** Index of the term in the spec's `terms` (its coupling family). */
  termIndex: number;
}

export type CompiledTerm =
  | (CompiledTermBase & { kind: 'hop'; entries: HopEntry[] })
  | (CompiledTermBase & {
      kind: 'conditional-hop';
      when: 'empty' | 'occupied';
      entries: ConditionalHopEntry[];
    })
  | (CompiledTermBase & { kind: 'interaction'; entries: InteractionEntry[] })
  | (CompiledTermBase & { kind: 'onsite'; entries: OnsiteEntry[] });

export interface CompiledModel {
  /** The validated spec this was compiled from (parameter overrides already applied). */
  spec: ModelSpec;
  /** Parameters evaluated to numbers. */
  parameters: Record<string, number>;
  lattice: Lattice;
  nSites: number;
  nParticles: number;
  terms: CompiledTerm[];
}
