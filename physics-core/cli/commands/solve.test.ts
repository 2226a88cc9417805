import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { solveCommand, parseOverrides } from './solve.js';
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
  });
});
