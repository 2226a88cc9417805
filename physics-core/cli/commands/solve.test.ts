import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { solveCommand, parseOverrides, parseSupercell } from './solve.js';
import { PhasewrightError } from '../../src/errors.js';

const example = fileURLToPath(new URL('../../examples/chain-extended.json', import.meta.url));

describe('phasewright solve', () => {
  it('prints one Result with energies, convergence and a provenance hash; --set changes the answer', () => {
    const a = JSON.parse(solveCommand(example, { method: 'ed', set: [], states: '2' }));
    const b = JSON.parse(solveCommand(example, { method: 'ed', set: ['V1=3'], states: '2' }));
    expect(a.spec).toBe('phasewright.result/1');
    expect(a.energies).toHaveLength(2);
    expect(a.convergence.converged).toBe(true);
    expect(a.provenance.modelHash).toMatch(/^[0-9a-f]{64}$/);
    expect(b.provenance.modelHash).not.toBe(a.provenance.modelHash);
    expect(b.energy).not.toBeCloseTo(a.energy, 6);
  });

  it('rejects bad flags with a message naming the flag', () => {
    expect(() => parseOverrides(['g'])).toThrow(/--set expects name=value/);
    expect(() => parseOverrides(['g=x'])).toThrow(PhasewrightError);
    expect(() => solveCommand(example, { method: 'simplex', set: [] })).toThrow(/--method/);
    expect(() => solveCommand(example, { method: 'ed', set: [], states: '0' })).toThrow(/--states/);
    expect(() => solveCommand(example, { method: 'ed', set: [], symmetry: 'mirror' })).toThrow(/--symmetry must be 'auto' or 'none'/);
  });

  it('--symmetry none solves the periodic ring on the full basis, auto in momentum sectors, with the same levels', () => {
    const auto = JSON.parse(solveCommand(example, { method: 'ed', set: [], states: '2' }));
    const none = JSON.parse(solveCommand(example, { method: 'ed', set: [], states: '2', symmetry: 'none' }));
    expect(auto.extras.symmetry.kind).toBe('translations');
    expect(none.extras.symmetry.kind).toBe('none');
    expect(auto.energies[0]).toBeCloseTo(none.energies[0], 9);
    expect(auto.energies[1]).toBeCloseTo(none.energies[1], 9);
    expect(auto.provenance.solver.symmetry).toBe('auto');
  });

  it('mean-field flags reach the solver: a two-site supercell of the V1 = 3 ring finds the density wave', () => {
    // Classical XXZ picture (Matsubara & Matsuda, Prog. Theor. Phys. 1956): above V1 = 2J the
    // checkerboard (no occupied nearest pairs: E/site = 0 with V2 = 0) beats the superfluid (−J/2 + V1/4 per bond).
    const r = JSON.parse(solveCommand(example, { method: 'meanfield', set: ['V1=3', 'V2=0'], supercell: '2', starts: '4', seed: '3' }));
    expect(r.method).toBe('meanfield');
    expect(r.convergence.starts).toBe(4);
    const densities = r.sites.map((s: { density: number }) => s.density).sort();
    expect(densities[0]).toBeCloseTo(0, 6);
    expect(densities[1]).toBeCloseTo(1, 6);
    expect(r.energyPerSite).toBeCloseTo(0, 7);
    expect(r.energy).toBeCloseTo(r.energyPerSite * 12, 9);
  });

  it('parses supercells and names the flag when one is wrong', () => {
    expect(parseSupercell('2x1')).toEqual([2, 1]);
    expect(parseSupercell('sqrt3')).toBe('sqrt3');
    expect(parseSupercell('[[2,1],[-1,1]]')).toEqual([[2, 1], [-1, 1]]);
    expect(() => parseSupercell('2y1')).toThrow(/--supercell/);
    expect(() => solveCommand(example, { method: 'meanfield', set: [], starts: '0' })).toThrow(/--starts/);
  });
});
