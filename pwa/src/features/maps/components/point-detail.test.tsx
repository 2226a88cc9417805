import { describe, expect, it } from 'vitest';
import { compileModel, solveEd, type ModelSpec } from '@phasewright/physics-core';
import { edSolverNote } from './point-detail.js';

/** The note is read from real physics-core results (no hand-made fixtures). */
const ring = (boundary: 'periodic' | 'open', phase = '0'): ModelSpec => ({
  spec: 'phasewright.model/1',
  lattice: { kind: 'chain', size: [6], boundary: [boundary] },
  particles: { kind: 'hardcore', count: 1 },
  parameters: { J: 1 },
  terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J', phase }],
});

describe('edSolverNote', () => {
  it('names the sectors and the ground momentum of a translation-invariant ring', () => {
    const note = edSolverNote(solveEd(compileModel(ring('periodic'))));
    expect(note).toMatch(/6 sites, 6 basis states, solved in 6 momentum sectors; ground state at k = \(2π·0\/6\)/);
    expect(note).toMatch(/only these momenta/);
  });

  it('says when a flux-π ring has its degenerate ground states at two momenta', () => {
    // One particle, phase π/6 per bond: E(k) = −2J cos(k + π/6) is lowest at two momenta (Bloch's theorem).
    const note = edSolverNote(solveEd(compileModel(ring('periodic', 'pi/6*dx')), { states: 2 }));
    expect(note).toMatch(/spans several momenta/);
  });

  it('says full basis and why for an open chain', () => {
    const note = edSolverNote(solveEd(compileModel(ring('open'))));
    expect(note).toMatch(/full basis \(no momentum sectors: no periodic axis/);
  });
});
