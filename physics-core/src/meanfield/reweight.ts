/**
 * Fast re-evaluation of a supercell model for new parameter values (sweeps): the geometry and
 * the selection of entries do not depend on the parameters, so a cached supercell model only
 * needs its home entries' values recomputed — with the same per-entry variables as
 * model/compile.ts (hop/interaction: dx, dy, bond midpoint x, y, turn 0; conditional hop: total
 * dx, dy, midpoint of from and to, path turn; onsite: x, y, sublattice). The cluster is compiled
 * untwisted, so only the supercell twist (θ_a/L_a per cell step) is added. A test checks that
 * this agrees with a fresh compile.
 */
import { SpecError } from '../errors.js';
import { bondVariables, pathVariables, siteVariables, termExpressions } from '../model/compile.js';
import type { CompiledModel, ModelSpec } from '../model/types.js';
import { evaluateParameters } from '../model/validate.js';
import type { SupercellModel } from './supercell-model.js';

type Evaluate = (vars: Record<string, number>) => number;

/** Compiled expressions of a spec's terms, bound to parameter values on demand (model/compile.ts's own evaluators). */
export interface TermEvaluators {
  build(values: Record<string, number>): { amp: Evaluate; phase: Evaluate }[];
}

export function termEvaluators(spec: ModelSpec): TermEvaluators {
  const expressions = termExpressions(spec);
  return { build: (values) => expressions.bind({ pi: Math.PI, ...values }) };
}

/** Parameter values of `spec` with `overrides` (SpecError on problems). */
export function parameterValues(spec: ModelSpec, overrides: Record<string, number>): Record<string, number> {
  const { values, issues } = evaluateParameters(spec.parameters, overrides);
  if (issues.length) throw new SpecError(issues);
  return values;
}

/**
 * A copy of `model` (built from `compiled`) with every value recomputed for `values`; structure
 * arrays are shared, value arrays are new.
 */
export function reweightSupercellModel(
  model: SupercellModel,
  compiled: CompiledModel,
  evaluators: { amp: Evaluate; phase: Evaluate }[],
  twistPerCell: number[],
): SupercellModel {
  const lattice = compiled.lattice;
  const phaseOf = (dcell: Int32Array, k: number): number => dcell[2 * k] * (twistPerCell[0] ?? 0) + dcell[2 * k + 1] * (twistPerCell[1] ?? 0);
  const hopRe = new Float64Array(model.hop.re.length);
  const hopIm = new Float64Array(model.hop.re.length);
  for (let k = 0; k < hopRe.length; k++) {
    const term = compiled.terms[model.hop.term[k]];
    if (term.kind !== 'hop') throw new Error('internal: hop source mismatch');
    const e = term.entries[model.hop.source[k]];
    const vars = bondVariables(lattice, lattice.bonds[e.bond]);
    const ev = evaluators[model.hop.term[k]];
    const a = ev.amp(vars);
    const angle = ev.phase(vars) + phaseOf(model.hop.dcell, k);
    hopRe[k] = a * Math.cos(angle);
    hopIm[k] = a * Math.sin(angle);
  }
  const condRe = new Float64Array(model.cond.re.length);
  const condIm = new Float64Array(model.cond.re.length);
  for (let k = 0; k < condRe.length; k++) {
    const term = compiled.terms[model.cond.term[k]];
    if (term.kind !== 'conditional-hop') throw new Error('internal: conditional-hop source mismatch');
    const e = term.entries[model.cond.source[k]];
    const vars = pathVariables(lattice, lattice.paths[e.path]);
    const ev = evaluators[model.cond.term[k]];
    const a = ev.amp(vars);
    const angle = ev.phase(vars) + phaseOf(model.cond.dcell, k);
    condRe[k] = a * Math.cos(angle);
    condIm[k] = a * Math.sin(angle);
  }
  const interValue = new Float64Array(model.inter.value.length);
  for (let k = 0; k < interValue.length; k++) {
    const term = compiled.terms[model.inter.term[k]];
    if (term.kind !== 'interaction') throw new Error('internal: interaction source mismatch');
    interValue[k] = evaluators[model.inter.term[k]].amp(bondVariables(lattice, lattice.bonds[term.entries[model.inter.source[k]].bond]));
  }
  const onsite = new Float64Array(model.nSites);
  for (const o of model.onsiteSources) {
    const term = compiled.terms[o.term];
    if (term.kind !== 'onsite') throw new Error('internal: onsite source mismatch');
    onsite[o.site] += evaluators[o.term].amp(siteVariables(lattice, lattice.sites[term.entries[o.source].i]));
  }
  return {
    ...model,
    hop: { ...model.hop, re: hopRe, im: hopIm },
    cond: { ...model.cond, re: condRe, im: condIm },
    inter: { ...model.inter, value: interValue },
    onsite,
  };
}
