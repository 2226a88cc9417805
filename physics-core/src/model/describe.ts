/** Size estimates and human-readable summaries of compiled models (for the CLI and the UI). */
import type { CompiledModel } from './types.js';

/**
 * Dimension of the fixed-number hardcore-boson space, C(nSites, nParticles), as a float
 * (exact below 2^53). 0 when nParticles is outside 0…nSites.
 */
export function estimateHilbertDimension(nSites: number, nParticles: number): number {
  if (!Number.isInteger(nSites) || !Number.isInteger(nParticles) || nParticles < 0 || nParticles > nSites) return 0;
  const k = Math.min(nParticles, nSites - nParticles);
  let c = 1;
  for (let i = 1; i <= k; i++) c = (c * (nSites - k + i)) / i;
  return Math.round(c);
}

export interface ModelSummary {
  name?: string;
  lattice: { kind: string; size: number[]; boundary: string[]; twist: number[] };
  nSites: number;
  nParticles: number;
  hilbertDimension: number;
  bonds: { shell: number; count: number }[];
  paths: number;
  plaquettes: number;
  terms: { termIndex: number; kind: string; entries: number; nonzero: number }[];
  /** One line per item, for printing. */
  lines: string[];
}

/** Counts of sites, bonds per shell, and entries per term. */
export function describeModel(compiled: CompiledModel): ModelSummary {
  const { lattice } = compiled;
  const shells = new Map<number, number>();
  for (const b of lattice.bonds) shells.set(b.shell, (shells.get(b.shell) ?? 0) + 1);
  const bonds = [...shells].sort((a, b) => a[0] - b[0]).map(([shell, count]) => ({ shell, count }));
  const terms = compiled.terms.map((t) => {
    const values: number[] =
      t.kind === 'hop' || t.kind === 'conditional-hop'
        ? t.entries.map((e) => Math.hypot(e.re, e.im))
        : t.entries.map((e) => e.value);
    return { termIndex: t.termIndex, kind: t.kind, entries: values.length, nonzero: values.filter((v) => v !== 0).length };
  });
  const hilbertDimension = estimateHilbertDimension(compiled.nSites, compiled.nParticles);
  const lines = [
    `${compiled.spec.name ?? 'model'}: ${lattice.kind} ${lattice.size.join('×')} (${lattice.boundary.join(', ')}), ` +
      `${compiled.nSites} sites, ${compiled.nParticles} particles, dimension ${hilbertDimension}`,
    `bonds: ${bonds.map((b) => `shell ${b.shell}: ${b.count}`).join(', ')}; paths: ${lattice.paths.length}; plaquettes: ${lattice.plaquettes.length}`,
    ...terms.map((t) => `term ${t.termIndex} (${t.kind}): ${t.entries} entries, ${t.nonzero} nonzero`),
  ];
  return {
    name: compiled.spec.name,
    lattice: { kind: lattice.kind, size: lattice.size, boundary: lattice.boundary, twist: lattice.twist },
    nSites: compiled.nSites,
    nParticles: compiled.nParticles,
    hilbertDimension,
    bonds,
    paths: lattice.paths.length,
    plaquettes: lattice.plaquettes.length,
    terms,
    lines,
  };
}
