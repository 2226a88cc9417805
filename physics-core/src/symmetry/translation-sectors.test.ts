import { describe, expect, it } from 'vitest';
import { compileModel } from '../model/compile.js';
import type { ModelSpec } from '../model/types.js';
import { EdOperator } from '../operators/ed-operator.js';
import { compileDiagonalTerms, compileDirectedMoves, fillCoefficients } from '../operators/directed-terms.js';
import { buildFixedNumberBasis } from '../hilbert/fixed-number-basis.js';
import { denseFromMatvec, denseHermitianEigen } from '../ed/test-models.js';
import {
  buildOrbitStructure,
  buildSector,
  expandSectorVector,
  sectorMatvec,
  permuteState,
  sectorMomenta,
  translationGroup,
  type TranslationGroup,
} from './translation-sectors.js';

/**
 * Checks against invariants and a dense reference (ml-matrix through denseHermitianEigen):
 * the sector blocks together hold exactly the spectrum of H; every block is Hermitian; a sector
 * eigenvector expanded to the full basis is an eigenvector of H with the same energy, of unit
 * norm, and picks up e^{i k·n} under each translation (Bloch's theorem).
 */
const cases: { name: string; spec: ModelSpec }[] = [
  {
    name: 'zigzag strip, conditional hops with phase turn·θ, nearest interactions, 8 sites, half filling',
    spec: {
      spec: 'phasewright.model/1',
      name: 'zigzag',
      lattice: { kind: 'zigzag', size: [4], boundary: ['periodic'], twist: [0] },
      particles: { kind: 'hardcore', filling: 0.5 },
      parameters: { J: 1, g: 0.7, theta: 'pi/3', V: 0.9 },
      terms: [
        { kind: 'hop', class: 'zig', amplitude: '-J' },
        { kind: 'conditional-hop', class: 'leg', legs: 'zig', via: 'common-neighbor', when: 'empty', amplitude: '-g', phase: 'turn*theta' },
        { kind: 'interaction', neighbors: 1, amplitude: 'V' },
      ],
    },
  },
  {
    name: 'chain of 8 sites at half filling (states like 10101010 have a stabilizer of 4)',
    spec: {
      spec: 'phasewright.model/1',
      name: 'chain',
      lattice: { kind: 'chain', size: [8], boundary: ['periodic'] },
      particles: { kind: 'hardcore', count: 4 },
      parameters: { J: 1, V: 1.3, V2: 0.4 },
      terms: [
        { kind: 'hop', neighbors: 1, amplitude: '-J', phase: '0.4*dx' },
        { kind: 'interaction', neighbors: 1, amplitude: 'V' },
        { kind: 'interaction', neighbors: 2, amplitude: 'V2' },
      ],
    },
  },
  {
    name: 'honeycomb 3×3 cells, conditional second-neighbour hops, 2 particles',
    spec: {
      spec: 'phasewright.model/1',
      name: 'honeycomb',
      lattice: { kind: 'honeycomb', size: [3, 3], boundary: ['periodic', 'periodic'] },
      particles: { kind: 'hardcore', count: 2 },
      parameters: { t1: 1, t2: 0.3, theta: 'pi/2', V: 0.5 },
      terms: [
        { kind: 'hop', neighbors: 1, amplitude: '-t1' },
        { kind: 'conditional-hop', neighbors: 2, legs: 'nn', via: 'common-neighbor', when: 'occupied', amplitude: '-t2', phase: 'turn*theta' },
        { kind: 'interaction', neighbors: 1, amplitude: 'V' },
      ],
    },
  },
  {
    name: 'square 3×3 torus with a uniform hop phase, 3 particles (full rows are translation invariant)',
    spec: {
      spec: 'phasewright.model/1',
      name: 'square',
      lattice: { kind: 'square', size: [3, 3], boundary: ['periodic', 'periodic'] },
      particles: { kind: 'hardcore', count: 3 },
      parameters: { J: 1, V: 0.6 },
      terms: [
        { kind: 'hop', neighbors: 1, amplitude: '-J', phase: '0.3*dx - 0.2*dy' },
        { kind: 'interaction', neighbors: 1, amplitude: 'V' },
      ],
    },
  },
];

function setup(spec: ModelSpec): { group: TranslationGroup; op: EdOperator; parts: ReturnType<typeof parts> } {
  const model = compileModel(spec);
  const p = parts(model);
  const check = translationGroup(model, p.moves, p.table, p.diagonalTerms);
  if (!check.group) throw new Error(`expected a translation group: ${check.reason}`);
  return { group: check.group, op: new EdOperator(model, { storage: 'csr' }), parts: p };
}

function parts(model: ReturnType<typeof compileModel>) {
  const moves = compileDirectedMoves(model);
  const table = new Float64Array(2 * moves.coefficientCount);
  fillCoefficients(model, table);
  const diagonalTerms = compileDiagonalTerms(model);
  const basis = buildFixedNumberBasis(model.nSites, model.nParticles);
  return { model, moves, table, diagonalTerms, basis };
}

describe('translation sectors', () => {
  for (const { name, spec } of cases) {
    it(`${name}: the sectors hold the spectrum of H, and expanded eigenvectors are Bloch eigenvectors of H`, () => {
      const { group, op, parts: p } = setup(spec);
      const orbits = buildOrbitStructure(group, p.basis, p.moves);
      const full = denseFromMatvec((x, y) => op.matvec(x, y), op.dimension);
      const reference = denseHermitianEigen(full.re, full.im, op.dimension).values;
      const union: number[] = [];
      let dims = 0;
      for (const momentum of sectorMomenta(group)) {
        const sector = buildSector(orbits, momentum, p.table, op.diagonal);
        dims += sector.dimension;
        if (sector.dimension === 0) continue;
        const block = denseFromMatvec((x, y) => sectorMatvec(sector, x, y), sector.dimension);
        const n = sector.dimension;
        for (let r = 0; r < n; r++) {
          for (let c = 0; c < n; c++) {
            expect(Math.abs(block.re[r * n + c] - block.re[c * n + r])).toBeLessThan(1e-13);
            expect(Math.abs(block.im[r * n + c] + block.im[c * n + r])).toBeLessThan(1e-13);
          }
        }
        const eig = denseHermitianEigen(block.re, block.im, n);
        union.push(...eig.values);
        // The lowest state of the block, expanded, solves H ψ = E ψ in the full basis.
        const psi = expandSectorVector(orbits, sector, eig.vectors[0]);
        const hpsi = new Float64Array(psi.length);
        op.matvec(psi, hpsi);
        let norm = 0;
        let res = 0;
        for (let q = 0; q < psi.length; q++) {
          norm += psi[q] ** 2;
          res += (hpsi[q] - eig.values[0] * psi[q]) ** 2;
        }
        expect(norm).toBeCloseTo(1, 12);
        expect(Math.sqrt(res)).toBeLessThan(1e-10);
        // T_e ψ = e^{i k·n_e} ψ: ψ(T_e s) = e^{i k·n_e}·ψ(s)... checked through the generator of each axis.
        expectBloch(group, p.basis, psi, momentum);
      }
      expect(dims).toBe(op.dimension);
      union.sort((a, b) => a - b);
      expect(union.length).toBe(reference.length);
      for (let i = 0; i < union.length; i++) expect(Math.abs(union[i] - reference[i])).toBeLessThan(1e-10);
    });
  }

  it('refuses a twisted ring and says why', () => {
    const model = compileModel({
      ...cases[1].spec,
      lattice: { kind: 'chain', size: [8], boundary: ['periodic'], twist: [0.3] },
    });
    const p = parts(model);
    const check = translationGroup(model, p.moves, p.table, p.diagonalTerms);
    expect(check.group).toBeNull();
    expect('reason' in check && check.reason).toMatch(/hop amplitude changes under translation/);
  });

  it('refuses an open chain', () => {
    const model = compileModel({ ...cases[1].spec, lattice: { kind: 'chain', size: [8], boundary: ['open'] } });
    const p = parts(model);
    expect(translationGroup(model, p.moves, p.table, p.diagonalTerms).group).toBeNull();
  });
});

/** (T_g ψ)(s) = ψ(T_g^{-1} s); a momentum eigenstate has ψ(T_g s) = e^{−i k·n_g} ψ(s) for every s. */
function expectBloch(group: TranslationGroup, basis: ReturnType<typeof buildFixedNumberBasis>, psi: Float64Array, momentum: number[]): void {
  const d = group.lengths.length;
  for (let e = 1; e < group.order; e++) {
    let turns = 0;
    for (let a = 0; a < d; a++) turns += (momentum[a] * group.shifts[e * d + a]) / group.lengths[a];
    const cr = Math.cos(2 * Math.PI * turns);
    const ci = -Math.sin(2 * Math.PI * turns);
    let worst = 0;
    for (let r = 0; r < basis.dimension; r++) {
      const s = basis.states[r];
      const t = permuteState(group, e, s);
      const q = basis.offsetOfHigh[t >>> basis.nLow] + basis.rankOfLow[t & basis.lowMask];
      const wr = cr * psi[2 * r] - ci * psi[2 * r + 1];
      const wi = cr * psi[2 * r + 1] + ci * psi[2 * r];
      worst = Math.max(worst, Math.hypot(psi[2 * q] - wr, psi[2 * q + 1] - wi));
    }
    expect(worst).toBeLessThan(1e-12);
  }
}
