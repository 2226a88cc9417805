/**
 * A plain-text methods summary of a stored map, meant to be adapted into a paper's methods
 * section: model, lattice and cluster, solver and its settings with tolerances (resolved defaults
 * from physics-core), sweep, merge rules, versions, and the limits a reader must keep in mind.
 */
import {
  checkEdOptions,
  checkMeanFieldOptions,
  compileModel,
  describeModel,
  type EdOptions,
  type MeanFieldOptions,
  type PhaseMap,
} from '@phasewright/physics-core';

const fmt = (x: unknown): string => (typeof x === 'number' ? String(x) : JSON.stringify(x));

function settings(obj: Record<string, unknown>, skip: string[] = []): string {
  return Object.entries(obj)
    .filter(([k, v]) => v !== undefined && !skip.includes(k))
    .map(([k, v]) => `${k} = ${fmt(v)}`)
    .join('; ');
}

export function methodsSummary(map: PhaseMap, digest: string): string {
  const sweep = map.sweep;
  const model = sweep.model;
  const points = Object.values(map.points);
  const lines: string[] = [];
  const say = (s = '') => lines.push(s);
  say(`Methods summary — ${sweep.name ?? 'map'} (Phasewright map ${map.id})`);
  say('');
  say('Model');
  try {
    const d = describeModel(compileModel(model));
    say(`  ${model.name ?? 'model'}: hardcore bosons on a ${d.lattice.kind} lattice of ${d.lattice.size.join(' × ')} unit cells (${d.nSites} sites), boundary conditions ${d.lattice.boundary.join(' / ')}${d.lattice.twist.some((t) => t !== 0) ? `, twist ${d.lattice.twist.join(', ')} rad` : ''}; ${d.nParticles} particles (fixed number) at the model's base parameters; Hilbert-space dimension ${d.hilbertDimension}.`);
    for (const l of d.lines.slice(1)) say(`  ${l}`);
  } catch (error) {
    say(`  (the model could not be compiled on the server: ${(error as Error).message})`);
  }
  say(`  Parameters: ${settings(model.parameters as Record<string, unknown>)}.`);
  say('  Terms:');
  for (const t of model.terms) say(`    ${settings(t as unknown as Record<string, unknown>)}`);
  say('');
  say('Sweep');
  for (const a of sweep.axes) {
    say(a.kind === 'list' ? `  ${a.parameter}: ${a.values.length} values ${a.values.join(', ')}` : `  ${a.parameter}: ${a.kind} from ${a.from} to ${a.to}, ${a.points} points`);
  }
  if (sweep.refine && sweep.refine.maxDepth > 0) say(`  Adaptive refinement up to depth ${sweep.refine.maxDepth} on ${sweep.refine.on.join(' and ')}.`);
  const converged = points.filter((p) => p.convergence.converged).length;
  const disputed = points.filter((p) => p.disputed?.length).length;
  say(`  ${points.length} points computed; ${converged} converged; ${disputed} disputed (ED results that disagree beyond tolerance); seeds ${map.provenance.seeds.join(', ')}.`);
  say('');
  say('Solver');
  const solver = (sweep.solver ?? {}) as Record<string, unknown>;
  if (sweep.method === 'ed') {
    say('  Exact diagonalization at fixed particle number: Lanczos for the lowest eigenstates, with a check for missed degenerate copies.');
    try {
      const { fidelity: _f, ...rest } = solver;
      say(`  Settings (defaults resolved): ${settings(checkEdOptions(rest as EdOptions) as unknown as Record<string, unknown>, ['startVector', 'seed'])}.`);
    } catch (error) {
      say(`  Settings as given: ${settings(solver)} (${(error as Error).message}).`);
    }
    if (solver.fidelity !== false) say('  Fidelity susceptibility: forward difference along the first swept parameter (error O(δ)).');
    say('  Merging of results from several runs: ED energies of one point must agree within a relative 1e-8 (absolute floor 1e-12); others are kept as disputed.');
  } else {
    say('  Gutzwiller mean-field (site-factorised variational state) on a finite unit cell, several random starts, L-BFGS minimisation.');
    try {
      say(`  Settings (defaults resolved): ${settings(checkMeanFieldOptions(solver as MeanFieldOptions) as unknown as Record<string, unknown>, ['warm', 'seed'])}.`);
    } catch (error) {
      say(`  Settings as given: ${settings(solver)} (${(error as Error).message}).`);
    }
    say('  Merging of results from several runs: the lower energy wins (the better variational upper bound); the others are kept in the history.');
  }
  say('');
  say('Provenance and versions');
  say(`  physics-core ${map.provenance.coreVersion}; ${map.provenance.sources.length} run(s): ${map.provenance.sources.map((s) => `${s.author ?? 'anonymous'} on ${s.runtime.kind} ${s.runtime.version} (${s.createdAt}${s.finishedAt ? ` – ${s.finishedAt}` : ', unfinished'})`).join('; ')}.`);
  say(`  Map identity (SHA-256 of model, sweep, solver options, core version): ${map.id}. Point-set digest: ${digest}.`);
  if (map.provenance.warnings.length > 0) say(`  Warnings recorded: ${map.provenance.warnings.length} (see the data package).`);
  say('');
  say('Limits');
  say('  Results are for finite clusters: phase boundaries shift with cluster size and boundary conditions, and true transitions need finite-size scaling.');
  if (sweep.method === 'meanfield') say('  Mean-field neglects quantum fluctuations between sites: it overestimates order and can show phases or boundaries that do not survive beyond mean-field.');
  else say('  ED at fixed particle number gives zero ⟨b⟩; condensation shows in the one-body density matrix, not as symmetry breaking.');
  say('  Phase labels come from a classifier with evidence thresholds; fidelity-susceptibility peaks indicate, but do not prove, transitions.');
  return `${lines.join('\n')}\n`;
}
