import { describe, expect, it } from 'vitest';
import { SpecError } from '../errors.js';
import { chainSweep } from './fake-solver.js';
import { parseSweepSpec } from './spec.js';

const issuesOf = (json: unknown): string[] => {
  try {
    parseSweepSpec(json);
  } catch (error) {
    if (error instanceof SpecError) return error.issues.map((i) => `${i.path}: ${i.message}`);
    throw error;
  }
  return [];
};

describe('parseSweepSpec', () => {
  it('accepts a cut, a grid and a stack, and copies them', () => {
    const s = chainSweep({ refine: { maxDepth: 2, on: ['label', 'fidelity'] } });
    expect(parseSweepSpec(JSON.parse(JSON.stringify(s)))).toEqual(s);
    const grid = chainSweep({
      axes: [
        { parameter: 'V', kind: 'linear', from: 0, to: 4, points: 5 },
        { parameter: 'J', kind: 'log', from: 0.1, to: 10, points: 3 },
      ],
    });
    expect(parseSweepSpec(grid).axes).toHaveLength(2);
  });

  it('names every problem with its JSON path', () => {
    const bad = {
      ...chainSweep(),
      axes: [
        { parameter: 'U', kind: 'linear', from: 0, to: 1, points: 3 },
        { parameter: 'V', kind: 'log', from: -1, to: 1, points: 3 },
        { parameter: 'J', kind: 'list', values: [1, 3, 2] },
      ],
      method: 'dmrg',
      extra: 1,
      refine: { maxDepth: 99, on: ['curvature'] },
    };
    const issues = issuesOf(bad);
    expect(issues).toContain('$.axes[0].parameter: "U" is not a parameter of the model (parameters: J, V)');
    expect(issues).toContain('$.axes[1].from: a log axis needs from and to of the same sign, both non-zero');
    expect(issues).toContain('$.axes[2].values[2]: values must be strictly increasing or strictly decreasing');
    expect(issues).toContain('$.method: must be "ed" or "meanfield" (got "dmrg")');
    expect(issues.some((i) => i.startsWith('$.extra: unknown field'))).toBe(true);
    expect(issues).toContain('$.refine.maxDepth: must be an integer from 0 to 10');
    expect(issues).toContain('$.refine.on[0]: must be "label" or "fidelity" (got "curvature")');
  });

  it('refuses repeated parameters, too many axes and newer versions', () => {
    const ax = { parameter: 'V', kind: 'linear', from: 0, to: 1, points: 2 };
    expect(issuesOf({ ...chainSweep(), axes: [ax, ax] })).toContain('$.axes[1].parameter: "V" is already swept by $.axes[0]');
    expect(issuesOf({ ...chainSweep(), axes: [ax, ax, ax, ax] })[0]).toMatch(/^\$\.axes: must be an array of 1/);
    expect(issuesOf({ ...chainSweep(), spec: 'phasewright.sweep/2' })).toEqual([
      '$.spec: this sweep was written by a newer Phasewright (sweep/2); this version reads sweep/1',
    ]);
    expect(issuesOf({ ...chainSweep(), axes: [{ ...ax, points: 2000 }, { parameter: 'J', kind: 'linear', from: 0, to: 1, points: 2000 }] }))
      .toContain('$.axes: 4000000 coarse points exceed the limit of 1000000');
  });
});

describe('the model inside a sweep', () => {
  it('is checked by the model validator, with paths under $.model', () => {
    const bad = chainSweep();
    (bad.model.terms[0] as { amplitude: unknown }).amplitude = '-J*(';
    expect(issuesOf(bad).some((i) => i.startsWith('$.model.terms[0].amplitude'))).toBe(true);
  });
});
