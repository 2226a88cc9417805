/** Custom lattice geometry (the model spec's `lattice` with kind "custom"), checked by physics-core. */
import { BadRequestException } from '@nestjs/common';
import { buildLattice, type LatticeSpec, MODEL_SPEC_ID, parseModelSpec, SpecError } from '@phasewright/physics-core';

export interface LatticeSummary {
  kind: 'custom';
  size: number[];
  boundary: string[];
  sitesPerCell: number;
  sites: number;
  bonds: number;
}

function refused(issues: { path: string; message: string }[]): BadRequestException {
  const first = issues[0];
  return new BadRequestException({ message: `The lattice file was refused; nothing was stored: ${first ? `${first.path}: ${first.message}` : 'invalid'}`, details: issues });
}

export function checkLatticeJson(text: string): { lattice: LatticeSpec; summary: LatticeSummary } {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    throw refused([{ path: '$', message: `not valid JSON (${(error as Error).message})` }]);
  }
  if (typeof json !== 'object' || json === null || (json as { kind?: unknown }).kind !== 'custom') {
    throw refused([{ path: '$.kind', message: 'must be "custom" (a lattice as in the model spec: {kind: "custom", size, boundary, custom: {sites, translations, bonds?}})' }]);
  }
  // The lattice is checked as part of a minimal model (physics-core validates lattices inside model specs).
  const probe = { spec: MODEL_SPEC_ID, name: 'lattice check', lattice: json, particles: { kind: 'hardcore', filling: 0.5 }, parameters: {}, terms: [{ kind: 'onsite', amplitude: 0 }] };
  try {
    const spec = parseModelSpec(probe, { integerParticles: false });
    const lattice = buildLattice(spec.lattice);
    return {
      lattice: spec.lattice,
      summary: { kind: 'custom', size: lattice.size, boundary: lattice.boundary, sitesPerCell: lattice.basis.length, sites: lattice.sites.length, bonds: lattice.bonds.length },
    };
  } catch (error) {
    if (error instanceof SpecError) throw refused(error.issues.map((i) => ({ path: i.path.replace(/^\$\.lattice/, '$'), message: i.message })));
    throw error;
  }
}
