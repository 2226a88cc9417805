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
import { compileExpression, evaluateReal, type CompiledExpression } from '../model/expressions.js';
import type { CompiledModel, ModelSpec } from '../model/types.js';
import { ENTRY_VARIABLES, evaluateParameters } from '../model/validate.js';
import type { SupercellModel } from './supercell-model.js';

type Evaluate = (vars: Record<string, number>) => number;

/** Compiled expressions of a spec's terms (depend on the parameter names only). */
export interface TermEvaluators {
  build(values: Record<string, number>): { amp: Evaluate; phase: Evaluate }[];
}

export function termEvaluators(spec: ModelSpec): TermEvaluators {
  const names = ['pi', ...Object.keys(spec.parameters)];
  const compiled = spec.terms.map((t, k) => {
    const scope = [...names, ...ENTRY_VARIABLES[t.kind]];
    const path = `$.terms[${k}]`;
    return {
      per: ENTRY_VARIABLES[t.kind],
      amp: compileExpression(t.amplitude, scope, `${path}.amplitude`),
      phase: t.phase === undefined ? undefined : compileExpression(t.phase, scope, `${path}.phase`),
      path,
    };
  });
  const make = (expr: CompiledExpression, base: Record<string, number>, per: string[], path: string): Evaluate => {
    if (!expr.symbols.some((s) => per.includes(s))) {
      const v = evaluateReal(expr, base, path, '');
      return () => v;
    }
    const scope: Record<string, number> = { ...base };
    return (vars) => {
      for (const k in vars) scope[k] = vars[k];
      return evaluateReal(expr, scope, path, '');
    };
  };
  return {
    build(values) {
      const base = { pi: Math.PI, ...values };
      return compiled.map((c) => ({
        amp: make(c.amp, base, c.per, `${c.path}.amplitude`),
        phase: c.phase ? make(c.phase, base, c.per, `${c.path}.phase`) : () => 0,
      }));
    },
  };
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
    const b = lattice.bonds[e.bond];
    const s = lattice.sites[b.from];
    const vars = { dx: b.dx, dy: b.dy, x: s.x + b.dx / 2, y: s.y + b.dy / 2, turn: 0 };
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
    const p = lattice.paths[e.path];
    const s = lattice.sites[p.from];
    const vars = { dx: p.dx, dy: p.dy, x: s.x + p.dx / 2, y: s.y + p.dy / 2, turn: p.turn };
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
    const b = lattice.bonds[term.entries[model.inter.source[k]].bond];
    const s = lattice.sites[b.from];
    interValue[k] = evaluators[model.inter.term[k]].amp({ dx: b.dx, dy: b.dy, x: s.x + b.dx / 2, y: s.y + b.dy / 2, turn: 0 });
  }
  const onsite = new Float64Array(model.nSites);
  for (const o of model.onsiteSources) {
    const term = compiled.terms[o.term];
    if (term.kind !== 'onsite') throw new Error('internal: onsite source mismatch');
    const s = lattice.sites[term.entries[o.source].i];
    onsite[o.site] += evaluators[o.term].amp({ x: s.x, y: s.y, sublattice: lattice.basis[s.sublattice].sublattice });
  }
  return {
    ...model,
    hop: { ...model.hop, re: hopRe, im: hopIm },
    cond: { ...model.cond, re: condRe, im: condIm },
    inter: { ...model.inter, value: interValue },
    onsite,
  };
}
