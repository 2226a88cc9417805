import { describe, expect, it } from 'vitest';
import { SpecError } from '../errors.js';
import { parseModelSpec } from './validate.js';

const good = () => ({
  spec: 'phasewright.model/1',
  name: 'ok',
  lattice: { kind: 'zigzag', size: [6], boundary: ['periodic'], twist: [0] },
  particles: { kind: 'hardcore', filling: 0.5 },
  parameters: { J: 1, g: 0.4, theta: '2*pi/3' },
  terms: [
    { kind: 'hop', class: 'zig', amplitude: '-J' },
    { kind: 'conditional-hop', class: 'leg', legs: 'zig', via: 'common-neighbor', when: 'empty', amplitude: 'g', phase: 'turn*theta' },
    { kind: 'interaction', neighbors: 1, amplitude: 1 },
  ],
});

function issuesOf(doc: unknown): { path: string; message: string }[] {
  try {
    parseModelSpec(doc);
  } catch (e) {
    if (e instanceof SpecError) return e.issues;
    throw e;
  }
  return [];
}

/** The message of the issue at `path` (fails the test when there is none). */
function at(issues: { path: string; message: string }[], path: string): string {
  const hit = issues.find((i) => i.path === path);
  expect(hit, `no issue at ${path}; got ${JSON.stringify(issues)}`).toBeDefined();
  return hit?.message ?? '';
}

describe('parseModelSpec', () => {
  it('accepts a valid spec and returns a copy', () => {
    const doc = good();
    const spec = parseModelSpec(doc);
    expect(spec).toEqual(doc);
    expect(spec).not.toBe(doc);
  });

  it('collects every problem of a bad spec, each with its path', () => {
    const doc = {
      ...good(),
      colour: 'red',
      lattice: { kind: 'zigzag', size: [6, 2], boundary: ['periodic', 'open'], twist: [0] },
      terms: [
        { kind: 'hop', class: 'rung', amplitude: '-J', when: 'empty' },
        { kind: 'conditional-hop', amplitude: 'g*', phase: 'turn*omega' },
        { kind: 'interaction', neighbors: 1, amplitude: 1, phase: 'theta' },
        { kind: 'onsite', amplitude: 'mu', legs: 'nn' },
        { kind: 'teleport', amplitude: 1 },
      ],
    };
    const issues = issuesOf(doc);
    expect(at(issues, '$.colour')).toContain("unknown field 'colour'");
    expect(at(issues, '$.lattice.size')).toContain('has 2 entries; a zigzag lattice has 1 axis');
    expect(at(issues, '$.lattice.boundary')).toContain('has 2 entries');
    expect(at(issues, '$.terms[0].class')).toBe("unknown bond class 'rung' for a zigzag lattice (it has: nn, nnn, leg, zig)");
    expect(at(issues, '$.terms[0].when')).toContain("'when' applies only to conditional-hop terms");
    expect(at(issues, '$.terms[1].amplitude')).toMatch(/bad expression 'g\*'.*ends too early/);
    expect(at(issues, '$.terms[1].phase')).toContain("unknown symbol 'omega'");
    expect(at(issues, '$.terms[1].phase')).toContain('J, g, theta');
    expect(at(issues, '$.terms[1].when')).toContain('is required');
    expect(at(issues, '$.terms[2].phase')).toContain("'phase' applies only to hop and conditional-hop terms");
    expect(at(issues, '$.terms[3].legs')).toContain('conditional-hop');
    expect(at(issues, '$.terms[3].amplitude')).toContain("unknown symbol 'mu'");
    expect(at(issues, '$.terms[4].kind')).toContain('allowed: hop, conditional-hop, interaction, onsite');
  });

  it('names an unknown lattice kind and lists the allowed ones', () => {
    const issues = issuesOf({ ...good(), lattice: { kind: 'hexagonal', size: [3, 3], boundary: ['open', 'open'] } });
    expect(at(issues, '$.lattice.kind')).toBe(
      "unknown lattice kind 'hexagonal' (allowed: chain, ladder, zigzag, square, triangular, honeycomb, kagome, custom)",
    );
  });

  it('says which particle count a filling gives', () => {
    const issues = issuesOf({
      ...good(),
      lattice: { kind: 'chain', size: [9], boundary: ['periodic'] },
      particles: { kind: 'hardcore', filling: 0.5 },
      terms: [{ kind: 'hop', amplitude: -1 }],
    });
    expect(at(issues, '$.particles.filling')).toContain('filling 0.5 on 9 sites gives 4.5 particles, not an integer');
    // a mean-field caller, for which the filling is a density, may accept it
    const meanField = { ...good(), lattice: { kind: 'chain', size: [9], boundary: ['periodic'] }, terms: [{ kind: 'hop', amplitude: -1 }] };
    expect(parseModelSpec(meanField, { integerParticles: false }).particles.filling).toBe(0.5);
    const both = issuesOf({ ...good(), particles: { kind: 'hardcore', filling: 0.5, count: 6 } });
    expect(at(both, '$.particles')).toContain('not both');
    const many = issuesOf({ ...good(), particles: { kind: 'hardcore', count: 13 } });
    expect(at(many, '$.particles.count')).toContain('do not fit on 12 sites');
  });

  it('evaluates parameter expressions and reports cycles and self references', () => {
    const cyc = issuesOf({ ...good(), parameters: { J: 1, g: 'h+1', h: '2*g', theta: 'theta+1' } });
    expect(at(cyc, '$.parameters.g')).toContain('cycle: g → h → g');
    expect(at(cyc, '$.parameters.theta')).toContain("refers to itself");
    const bad = issuesOf({ ...good(), parameters: { J: 1, g: 'sqrt(-1)', theta: 0, pi: 3 } });
    expect(at(bad, '$.parameters.g')).toContain('not a finite real number');
    expect(at(bad, '$.parameters.pi')).toContain('reserved');
  });

  it('checks twist lengths and twists on open axes', () => {
    const t = issuesOf({
      ...good(),
      lattice: { kind: 'square', size: [4, 3], boundary: ['periodic', 'open'], twist: [0.1, 'theta'] },
      terms: [{ kind: 'hop', amplitude: -1 }],
    });
    expect(at(t, '$.lattice.twist[1]')).toContain('open axis');
    const n = issuesOf({ ...good(), lattice: { kind: 'zigzag', size: [6], boundary: ['periodic'], twist: [0, 0] } });
    expect(at(n, '$.lattice.twist')).toContain('has 2 entries');
  });

  it('refuses periodic clusters too small for the shells the terms use', () => {
    const small = issuesOf({
      ...good(),
      lattice: { kind: 'chain', size: [4], boundary: ['periodic'] },
      terms: [{ kind: 'interaction', neighbors: 2, amplitude: 1 }],
    });
    expect(at(small, '$.lattice.size')).toContain('axis 0 needs length ≥ 5 (has 4)');
    // the same ring with nearest-neighbour terms only is fine
    expect(
      issuesOf({ ...good(), lattice: { kind: 'chain', size: [4], boundary: ['periodic'] }, terms: [{ kind: 'hop', amplitude: -1 }] }),
    ).toEqual([]);
  });

  it('validates custom lattices', () => {
    const issues = issuesOf({
      ...good(),
      lattice: {
        kind: 'custom',
        size: [3, 3],
        boundary: ['periodic', 'periodic'],
        custom: {
          sites: [{ x: 0, y: 0 }, { x: 0, y: 0, spin: 1 }],
          translations: [
            [1, 0],
            [2, 0],
          ],
          bonds: [{ class: 'nn', from: 0, to: 5, offset: [1] }],
        },
      },
      terms: [{ kind: 'hop', class: 'diag', amplitude: -1 }],
    });
    expect(at(issues, '$.lattice.custom.translations')).toContain('parallel');
    expect(at(issues, '$.lattice.custom.sites[1].spin')).toContain("unknown field 'spin'");
    expect(at(issues, '$.lattice.custom.bonds[0].class')).toContain('automatic');
    expect(at(issues, '$.lattice.custom.bonds[0].to')).toContain('site index 0…1');
    expect(at(issues, '$.lattice.custom.bonds[0].offset')).toContain('one per translation');
    expect(at(issues, '$.terms[0].class')).toContain("unknown bond class 'diag'");
  });

  it('rejects what is not a spec at all', () => {
    expect(issuesOf(42)).toEqual([{ path: '$', message: 'a model spec must be a JSON object' }]);
    const i = issuesOf({});
    for (const p of ['$.spec', '$.parameters', '$.lattice', '$.particles', '$.terms']) at(i, p);
  });
});
