import type { CompiledModel } from '../model/types.js';
import { popcount32 as popcount, rankState, type FixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import type { DiagonalTerms, DirectedMoves } from '../operators/directed-terms.js';
import { packedHermitianMatvec } from '../operators/csr-complex.js';

/**
 * Lattice translations as a symmetry of H, and H block-diagonalized into momentum sectors.
 *
 * T_g moves every site by the lattice vector n_g (unit cells along the periodic axes; a
 * permutation of the bits of a basis state, done with four byte tables per element). When the
 * directed moves and the diagonal are unchanged by T (checked term by term: `translationGroup`),
 * [H, T_g] = 0 and H splits into blocks of fixed crystal momentum k (k_a = 2π m_a / L_a).
 *
 * Sector basis (e.g. Sandvik, AIP Conf. Proc. 1297, 135 (2010), §4.1, for spin chains; the same
 * construction for any abelian translation group): for each orbit the representative r is its
 * numerically smallest state; with S_r its stabilizer (translations that leave r unchanged),
 *
 *   |r, k⟩ = (|G|·|S_r|)^(−1/2) Σ_{g∈G} e^{−i k·n_g} T_g |r⟩,
 *
 * which is non-zero (and normalized) only when e^{i k·n_g} = 1 on S_r. Then T_h |r,k⟩ =
 * e^{i k·n_h} |r,k⟩, and if a move sends |r⟩ to |s⟩ with T_j |s⟩ = |r'⟩ (r' the representative of
 * s's orbit), ⟨r,k|H|r',k⟩ collects ⟨r|H|s⟩·e^{+i k·n_j}·(|S_{r'}|/|S_r|)^{1/2} from every such move.
 * Hardcore bosons carry no exchange sign, so no further phase enters.
 */
export interface TranslationGroup {
  /** Periodic axes used and the number of cells along each (L_a). */
  axes: number[];
  lengths: number[];
  /** |G| = Π L_a (at most 32: the stabilizer of a state is kept as a 32-bit mask). */
  order: number;
  /** Shift of element e along axis a: shifts[e·d + a] (element 0 is the identity). */
  shifts: Int32Array;
  /** Bit permutation of element e: four 256-entry tables at tables[e·1024 + 256·byte + value]. */
  tables: Int32Array;
  /** Site permutation of element e: site i goes to sitePermutations[e][i]. */
  sitePermutations: Int32Array[];
}

export type TranslationCheck = { group: TranslationGroup } | { group: null; reason: string };

/** The translation group of the model's cluster, if H is invariant under it (else why not). */
export function translationGroup(model: CompiledModel, moves: DirectedMoves, table: Float64Array, diagonal: DiagonalTerms): TranslationCheck {
  const lattice = model.lattice;
  const axes: number[] = [];
  const lengths: number[] = [];
  lattice.boundary.forEach((b, a) => {
    if (b === 'periodic' && lattice.size[a] > 1) {
      axes.push(a);
      lengths.push(lattice.size[a]);
    }
  });
  if (axes.length === 0) return { group: null, reason: 'no periodic axis with more than one cell' };
  const order = lengths.reduce((x, y) => x * y, 1);
  if (order > 32) return { group: null, reason: `${order} translations (more than 32 are not supported)` };
  if (model.nSites > 32) return { group: null, reason: 'more than 32 sites' };
  const bySlot = new Map<string, number>();
  for (const s of lattice.sites) bySlot.set(`${s.cell.join(',')}|${s.sublattice}`, s.index);
  const d = axes.length;
  const shifts = new Int32Array(order * d);
  const perms: Int32Array[] = [];
  for (let e = 0; e < order; e++) {
    let rest = e;
    for (let a = 0; a < d; a++) {
      shifts[e * d + a] = rest % lengths[a];
      rest = Math.floor(rest / lengths[a]);
    }
    const perm = new Int32Array(model.nSites);
    for (const s of lattice.sites) {
      const cell = [...s.cell];
      for (let a = 0; a < d; a++) cell[axes[a]] = (cell[axes[a]] + shifts[e * d + a]) % lengths[a];
      const to = bySlot.get(`${cell.join(',')}|${s.sublattice}`);
      if (to === undefined) return { group: null, reason: `site ${s.index} has no image under a translation (cluster is not a full torus)` };
      perm[s.index] = to;
    }
    perms.push(perm);
  }
  // Invariance of the off-diagonal part (moves with equal masks summed) and of the diagonal.
  const hop = new Map<string, [number, number]>();
  for (let m = 0; m < moves.count; m++) {
    const key = `${moves.check[m]}:${moves.want[m]}:${moves.flip[m]}`;
    const c = moves.coefficient[m];
    const v = hop.get(key) ?? [0, 0];
    v[0] += table[2 * c];
    v[1] += table[2 * c + 1];
    hop.set(key, v);
  }
  const diag = new Map<number, number>();
  for (let t = 0; t < diagonal.count; t++) diag.set(diagonal.mask[t], (diag.get(diagonal.mask[t]) ?? 0) + diagonal.value[t]);
  const scale = Math.max(1, ...[...hop.values()].map(([re, im]) => Math.hypot(re, im)), ...[...diag.values()].map(Math.abs));
  const tol = 1e-12 * scale;
  // One generator per axis suffices: every element is a product of generators.
  for (let a = 0; a < d; a++) {
    let e = 1;
    for (let b = 0; b < a; b++) e *= lengths[b];
    const perm = perms[e];
    for (const [key, [re, im]] of hop) {
      const [c, w, f] = key.split(':').map(Number);
      const image = hop.get(`${permuteMask(perm, c)}:${permuteMask(perm, w)}:${permuteMask(perm, f)}`) ?? [0, 0];
      if (Math.hypot(image[0] - re, image[1] - im) > tol) {
        return { group: null, reason: `a hop amplitude changes under translation along axis ${axes[a]} (twist, position-dependent amplitude or a partial term)` };
      }
    }
    for (const [mask, value] of diag) {
      if (Math.abs((diag.get(permuteMask(perm, mask)) ?? 0) - value) > tol) {
        return { group: null, reason: `an interaction or on-site energy changes under translation along axis ${axes[a]}` };
      }
    }
  }
  const tables = new Int32Array(order * 1024);
  for (let e = 0; e < order; e++) {
    const perm = perms[e];
    for (let byte = 0; byte < 4; byte++) {
      for (let v = 0; v < 256; v++) {
        let out = 0;
        for (let i = 0; i < 8; i++) {
          const site = 8 * byte + i;
          if ((v >>> i) & 1 && site < perm.length) out |= 1 << perm[site];
        }
        tables[e * 1024 + 256 * byte + v] = out | 0;
      }
    }
  }
  return { group: { axes, lengths, order, shifts, tables, sitePermutations: perms } };
}

/** The image of a site mask (bit i = site i) under a site permutation, as a signed 32-bit integer like the move masks. */
export function permuteMask(perm: Int32Array, mask: number): number {
  let out = 0;
  for (let rest = mask; rest !== 0; rest &= rest - 1) out |= 1 << perm[31 - Math.clz32(rest & -rest)];
  return out | 0;
}

/** The basis state T_e s (unsigned), through the element's byte tables. */
export function permuteState(group: TranslationGroup, e: number, s: number): number {
  return permute(group.tables, e, s);
}

function permute(tables: Int32Array, e: number, s: number): number {
  const b = e << 10;
  return (tables[b + (s & 255)] | tables[b + 256 + ((s >>> 8) & 255)] | tables[b + 512 + ((s >>> 16) & 255)] | tables[b + 768 + (s >>> 24)]) >>> 0;
}

/**
 * Momentum-independent part of the sector blocks: the orbit representatives with their
 * stabilizers, and for each representative the moves with the representative they reach, the
 * translation that gets there, and the coefficient index. Built once per structure; a sector's
 * block only attaches phases and amplitudes (`buildSector`).
 */
export interface OrbitStructure {
  group: TranslationGroup;
  basis: FixedNumberBasis;
  /** Representatives (ascending) and their stabilizer masks (bit e set ⇔ T_e r = r). */
  reps: Uint32Array;
  stabilizer: Uint32Array;
  rowStart: Int32Array;
  /** Per entry: representative index reached, translation element, coefficient index. */
  target: Int32Array;
  element: Uint8Array;
  coefficient: Uint32Array;
}

export function buildOrbitStructure(group: TranslationGroup, basis: FixedNumberBasis, moves: DirectedMoves): OrbitStructure {
  const { tables, order } = group;
  const { states, dimension } = basis;
  const repOfRank = new Int32Array(dimension).fill(-1);
  const repList: number[] = [];
  const stabList: number[] = [];
  for (let r = 0; r < dimension; r++) {
    const s = states[r];
    let stab = 1;
    let isRep = true;
    for (let e = 1; e < order; e++) {
      const t = permute(tables, e, s);
      if (t < s) {
        isRep = false;
        break;
      }
      if (t === s) stab |= 1 << e;
    }
    if (!isRep) continue;
    repOfRank[r] = repList.length;
    repList.push(s);
    stabList.push(stab >>> 0);
  }
  const reps = Uint32Array.from(repList);
  const stabilizer = Uint32Array.from(stabList);
  const n = reps.length;
  const { check, want, flip } = moves;
  const rowStart = new Int32Array(n + 1);
  for (let i = 0; i < n; i++) {
    const s = reps[i] | 0;
    let c = 0;
    for (let m = 0; m < moves.count; m++) if ((s & check[m]) === want[m]) c++;
    rowStart[i + 1] = rowStart[i] + c;
  }
  const entries = rowStart[n];
  const target = new Int32Array(entries);
  const element = new Uint8Array(entries);
  const coefficient = new Uint32Array(entries);
  let k = 0;
  for (let i = 0; i < n; i++) {
    const s = reps[i] | 0;
    for (let m = 0; m < moves.count; m++) {
      if ((s & check[m]) !== want[m]) continue;
      const t = (s ^ flip[m]) >>> 0;
      let best = t;
      let j = 0;
      for (let e = 1; e < order; e++) {
        const u = permute(tables, e, t);
        if (u < best) {
          best = u;
          j = e;
        }
      }
      const rep = repOfRank[rankState(basis, best)];
      if (rep < 0) throw new Error(`translation sectors: state ${best} should be a representative`);
      target[k] = rep;
      element[k] = j;
      coefficient[k] = moves.coefficient[m];
      k++;
    }
  }
  return { group, basis, reps, stabilizer, rowStart, target, element, coefficient };
}

/** Bytes an orbit structure takes (for the memory estimate): about D/|G| representatives and nnz/|G| entries. */
export function estimateOrbitBytes(dimension: number, nnz: number, order: number): number {
  return 4 * dimension + Math.ceil(dimension / order) * 12 + Math.ceil(nnz / order) * 9;
}

/** Momentum of a sector: integers m_a (k_a = 2π m_a / L_a along each periodic axis used). */
export interface Sector {
  momentum: number[];
  dimension: number;
  /** Representative index of each sector row. */
  rows: Int32Array;
  rowStart: Int32Array;
  /**
   * Per entry, column << valueBits | value index into `valueTable` (coefficient × translation
   * phase): 4 bytes per entry, the values stay in cache. Only entries above the diagonal are kept
   * (the block is Hermitian: the product adds v·x[c] to y[r] and conj(v)·x[r] to y[c]); hops that
   * stay in their orbit are summed into `diagonal`. Entries between orbits with different
   * stabilizers carry an extra factor and sit, in both directions, in the `extra…` lists instead.
   */
  packed: Int32Array;
  valueBits: number;
  valueTable: Float64Array;
  extraRow: Int32Array;
  extraColumn: Int32Array;
  extraValues: Float64Array;
  diagonal: Float64Array;
  /** e^{i k·n_e} per element e (interleaved). */
  character: Float64Array;
}

/** Bytes of a sector block. */
export function sectorBytes(sector: Sector): number {
  return (
    sector.rows.byteLength +
    sector.rowStart.byteLength +
    sector.packed.byteLength +
    sector.valueTable.byteLength +
    sector.extraRow.byteLength +
    sector.extraColumn.byteLength +
    sector.extraValues.byteLength +
    sector.diagonal.byteLength
  );
}

/** All momenta of the group, the zero momentum first. */
export function sectorMomenta(group: TranslationGroup): number[][] {
  const out: number[][] = [];
  for (let e = 0; e < group.order; e++) {
    const d = group.lengths.length;
    out.push(Array.from(group.shifts.subarray(e * d, e * d + d)));
  }
  return out;
}

/** The block of H at momentum `momentum`; `table` holds the complex coefficients, `fullDiagonal` the diagonal of H. */
export function buildSector(orbits: OrbitStructure, momentum: number[], table: Float64Array, fullDiagonal: Float64Array): Sector {
  const { group, reps, stabilizer, rowStart, target, element, coefficient, basis } = orbits;
  const { order, shifts, lengths } = group;
  const d = lengths.length;
  const character = new Float64Array(2 * order);
  let trivial = 0;
  for (let e = 0; e < order; e++) {
    let turns = 0;
    for (let a = 0; a < d; a++) turns += (momentum[a] * shifts[e * d + a]) / lengths[a];
    const frac = turns - Math.round(turns);
    if (Math.abs(frac) < 1e-9) trivial |= 1 << e;
    character[2 * e] = Math.cos(2 * Math.PI * turns);
    character[2 * e + 1] = Math.sin(2 * Math.PI * turns);
  }
  const notTrivial = ~trivial >>> 0;
  const n = reps.length;
  const index = new Int32Array(n).fill(-1);
  const rowList: number[] = [];
  for (let i = 0; i < n; i++) {
    if ((stabilizer[i] & notTrivial) === 0) {
      index[i] = rowList.length;
      rowList.push(i);
    }
  }
  const rows = Int32Array.from(rowList);
  const dim = rows.length;
  // value index = coefficient · order + element
  const coefficients = table.length / 2;
  const values = coefficients * order;
  const valueBits = Math.max(1, Math.ceil(Math.log2(values)));
  if (dim > 2 ** (31 - valueBits)) {
    throw new RangeError(`translation sectors: ${dim} rows and ${values} distinct values do not fit a 32-bit packed entry`);
  }
  const valueTable = new Float64Array(2 * values);
  for (let c = 0; c < coefficients; c++) {
    const tr = table[2 * c];
    const ti = table[2 * c + 1];
    for (let e = 0; e < order; e++) {
      const cr = character[2 * e];
      const ci = character[2 * e + 1];
      valueTable[2 * (c * order + e)] = tr * cr - ti * ci;
      valueTable[2 * (c * order + e) + 1] = tr * ci + ti * cr;
    }
  }
  // One pass: entries of the sector's rows fit in the orbit structure's entry count.
  let capacity = 0;
  for (let q = 0; q < dim; q++) capacity += rowStart[rows[q] + 1] - rowStart[rows[q]];
  const start = new Int32Array(dim + 1);
  const packedAll = new Int32Array(capacity);
  const extraRowList: number[] = [];
  const extraColumnList: number[] = [];
  const extraValueList: number[] = [];
  const diagonal = new Float64Array(dim);
  const selfImaginary = new Float64Array(dim);
  let p = 0;
  for (let q = 0; q < dim; q++) {
    const i = rows[q];
    const si = stabilizer[i];
    diagonal[q] += fullDiagonal[rankState(basis, reps[i])];
    for (let k = rowStart[i], end = rowStart[i + 1]; k < end; k++) {
      const t = target[k];
      const col = index[t];
      if (col < 0) continue;
      const v = coefficient[k] * order + element[k];
      if (stabilizer[t] === si) {
        if (col > q) packedAll[p++] = (col << valueBits) | v;
        else if (col === q) {
          diagonal[q] += valueTable[2 * v];
          selfImaginary[q] += valueTable[2 * v + 1];
        }
      } else {
        const ratio = Math.sqrt(popcount(stabilizer[t]) / popcount(si));
        extraRowList.push(q);
        extraColumnList.push(col);
        extraValueList.push(ratio * valueTable[2 * v], ratio * valueTable[2 * v + 1]);
      }
    }
    start[q + 1] = p;
  }
  // Hops within an orbit add up to a real number (H_k is Hermitian); anything else is a bug.
  for (let q = 0; q < dim; q++) {
    if (Math.abs(selfImaginary[q]) > 1e-9 * (1 + Math.abs(diagonal[q]))) {
      throw new Error(`translation sectors: the block at momentum [${momentum.join(', ')}] is not Hermitian (row ${q})`);
    }
  }
  const packed = p === capacity ? packedAll : packedAll.slice(0, p);
  const extraRow = Int32Array.from(extraRowList);
  const extraColumn = Int32Array.from(extraColumnList);
  const extraValues = Float64Array.from(extraValueList);
  return { momentum: [...momentum], dimension: dim, rows, rowStart: start, packed, valueBits, valueTable, extraRow, extraColumn, extraValues, diagonal, character };
}

/** y = H_k x on a sector (interleaved complex; x and y must not alias). */
export function sectorMatvec(sector: Sector, x: Float64Array, y: Float64Array): void {
  packedHermitianMatvec(sector.rowStart, sector.packed, sector.valueBits, sector.valueTable, sector.diagonal, x, y);
  const { extraRow, extraColumn, extraValues } = sector;
  for (let j = 0; j < extraRow.length; j++) {
    const r = extraRow[j] << 1;
    const c = extraColumn[j] << 1;
    const tr = extraValues[2 * j];
    const ti = extraValues[2 * j + 1];
    y[r] += tr * x[c] - ti * x[c + 1];
    y[r + 1] += tr * x[c + 1] + ti * x[c];
  }
}

/** The full-basis vector (interleaved complex, length 2·D) of a sector vector: Σ_r c_r |r, k⟩. */
export function expandSectorVector(orbits: OrbitStructure, sector: Sector, v: Float64Array): Float64Array {
  const { group, reps, stabilizer, basis } = orbits;
  const { order, tables } = group;
  const out = new Float64Array(2 * basis.dimension);
  const { character } = sector;
  for (let q = 0; q < sector.dimension; q++) {
    const i = sector.rows[q];
    const w = 1 / Math.sqrt(order * popcount(stabilizer[i]));
    const cr = v[2 * q] * w;
    const ci = v[2 * q + 1] * w;
    const s = reps[i];
    for (let e = 0; e < order; e++) {
      const t = e === 0 ? s : permute(tables, e, s);
      const at = 2 * rankState(basis, t);
      // c · e^{−i k·n_e}
      const er = character[2 * e];
      const ei = -character[2 * e + 1];
      out[at] += cr * er - ci * ei;
      out[at + 1] += cr * ei + ci * er;
    }
  }
  return out;
}
