import { CORE_VERSION } from '../version.js';
import { describe, expect, it } from 'vitest';
import { canonicalHash, hashModel, mapIdentity, pointSeed, sha256Hex } from './provenance.js';
import { chainSweep } from '../sweep/fake-solver.js';

describe('hashing', () => {
  it('SHA-256 matches the FIPS 180-2 test vector for "abc"', () => {
    // FIPS PUB 180-2, Appendix B.1 (NIST, 2002).
    expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('hashes meaning, not spelling', () => {
    expect(canonicalHash({ a: 1, b: [0.5] })).toBe(canonicalHash(JSON.parse('{"b":[5e-1],"a":1.0}')));
    expect(canonicalHash({ a: 1 })).not.toBe(canonicalHash({ a: 1.0000000000000002 }));
  });

  it('map identity ignores the sweep name and refinement settings but not physics', () => {
    const s = chainSweep();
    const id = mapIdentity(s, CORE_VERSION);
    expect(mapIdentity({ ...s, name: 'other', refine: { maxDepth: 5, on: ['fidelity'] } }, CORE_VERSION)).toBe(id);
    expect(mapIdentity({ ...s, solver: { tolerance: 1e-9 } }, CORE_VERSION)).not.toBe(id);
    expect(mapIdentity({ ...s, seed: 8 }, CORE_VERSION)).not.toBe(id);
    expect(mapIdentity(s, '9.9.9')).not.toBe(id);
    expect(mapIdentity({ ...s, model: { ...s.model, parameters: { ...s.model.parameters, J: 2 } } }, CORE_VERSION)).not.toBe(id);
    expect(hashModel(s.model)).toMatch(/^[0-9a-f]{64}$/);
  });

  it('point seeds depend on seed and key only', () => {
    expect(pointSeed(1, 'V=0.5')).toBe(pointSeed(1, 'V=0.5'));
    expect(pointSeed(1, 'V=0.5')).not.toBe(pointSeed(2, 'V=0.5'));
    expect(pointSeed(1, 'V=0.5')).not.toBe(pointSeed(1, 'V=1'));
  });
});
