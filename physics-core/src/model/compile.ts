/**
 * Compile a model spec to operator-level terms over site indices (`CompiledModel`).
 *
 * Selection of what a term acts on:
 * - hop / interaction: the bonds with `shell === neighbors` and/or carrying `class`; with both,
 *   the intersection; with neither, the nearest-neighbour shell (class `nn`).
 * - conditional-hop: the two-step paths from → via → to whose pair (from, to) is selected like a
 *   hop's (`neighbors`: the shell of the pair's distance; `class`: the pair is joined by a bond of
 *   that class with the same periodic image; neither: nn), and whose two steps are both bonds of
 *   class `legs` (default `nn`).
 * - onsite: every site.
 * Entries with amplitude exactly 0 are KEPT, so a sweep can re-weight a term's entries.
 * `lattice.paths` is filled only when the model has a conditional-hop term (it is [] otherwise).
 *
 * Per-entry variables in the expressions:
 * - hop and interaction (one bond from → to): dx, dy = displacement from → to (unwrapped);
 *   x, y = the bond's midpoint, unwrapped from `from` (on a periodic axis x, y are not
 *   single-valued: an expression in x or y is only consistent with a periodic axis along which it
 *   does not vary); turn = 0.
 * - conditional-hop (path from → via → to): dx, dy = total displacement from → to; x, y =
 *   midpoint of from and to (unwrapped); turn = the path's turn (+1 ccw, −1 cw, 0 straight).
 * - onsite: x, y = the site's position; sublattice = its sublattice label.
 *
 * Values: a hop entry carries t = amplitude · e^{i·phase} · e^{i·Σ_a wrap_a·twist_a} as
 * (re, im) and means t·b†_to b_from + h.c.; a conditional hop t·b†_to (1−n_via) b_from + h.c.
 * (`when: 'empty'`) or t·b†_to n_via b_from + h.c. (`'occupied'`), with the twist of the path's
 * total wrap; an interaction value·n_i n_j; an onsite value·n_i.
 */
import { SpecError } from '../errors.js';
import { buildLattice } from '../lattice/lattices.js';
import { shellOf } from '../lattice/neighbors.js';
import { compileExpression, evaluateReal, type CompiledExpression } from './expressions.js';
import type {
  Bond,
  CompiledModel,
  CompiledTerm,
  ConditionalHopEntry,
  HopEntry,
  InteractionEntry,
  Lattice,
  ModelSpec,
  OnsiteEntry,
  Path,
  Site,
  TermSpec,
} from './types.js';
import { ENTRY_VARIABLES, evaluateParameters, parseModelSpec, requiredShells } from './validate.js';

/** Bonds a hop or interaction term acts on (see the file comment). */
export function selectBonds(lattice: Lattice, term: Pick<TermSpec, 'neighbors' | 'class'>): Bond[] {
  const { neighbors, class: cls } = term;
  if (neighbors === undefined && cls === undefined) return lattice.bonds.filter((b) => b.classes.includes('nn'));
  return lattice.bonds.filter(
    (b) => (neighbors === undefined || b.shell === neighbors) && (cls === undefined || b.classes.includes(cls)),
  );
}

/** Paths a conditional-hop term acts on (see the file comment). */
export function selectPaths(lattice: Lattice, term: Pick<TermSpec, 'neighbors' | 'class' | 'legs'>): Path[] {
  const legs = term.legs ?? 'nn';
  const cls = term.neighbors === undefined && term.class === undefined ? 'nn' : term.class;
  const { bonds, shellDistances } = lattice;
  return lattice.paths.filter((p) => {
    if (!bonds[p.first.bond].classes.includes(legs) || !bonds[p.second.bond].classes.includes(legs)) return false;
    if (term.neighbors !== undefined) {
      const shell = p.pair ? bonds[p.pair.bond].shell : shellOf(shellDistances, Math.hypot(p.dx, p.dy));
      if (shell !== term.neighbors) return false;
    }
    if (cls !== undefined && !(p.pair && bonds[p.pair.bond].classes.includes(cls))) return false;
    return true;
  });
}

const twistAngle = (wrap: number[], twist: number[]) => wrap.reduce((s, w, a) => s + w * twist[a], 0);

/** Evaluates an expression once when it reads no per-entry variable, per entry otherwise. */
export function evaluator(
  expr: CompiledExpression,
  base: Record<string, number>,
  perEntry: string[],
  path: string,
): (vars: Record<string, number>, where?: () => string) => number {
  if (!expr.symbols.some((s) => perEntry.includes(s))) {
    const v = evaluateReal(expr, base, path, '');
    return () => v;
  }
  // One scope object per expression, updated in place: creating a fresh scope per entry makes
  // mathjs evaluation about ten times slower.
  const scope: Record<string, number> = { ...base };
  for (const v of perEntry) scope[v] = 0;
  return (vars, where) => {
    for (const k in vars) scope[k] = vars[k];
    return evaluateReal(expr, scope, path, where ? where() : '');
  };
}

type EntryEvaluate = (vars: Record<string, number>, where?: () => string) => number;

/**
 * The compiled amplitude and phase expressions of every term of `spec` (they depend on the
 * parameter names only); `bind` gives evaluators for parameter values `base` (with `pi`).
 */
export function termExpressions(spec: ModelSpec): {
  bind(base: Record<string, number>): { amp: EntryEvaluate; phase: EntryEvaluate }[];
} {
  const names = ['pi', ...Object.keys(spec.parameters)];
  const compiled = spec.terms.map((t, termIndex) => {
    const path = `$.terms[${termIndex}]`;
    const per = ENTRY_VARIABLES[t.kind];
    const scope = [...names, ...per];
    return {
      path,
      per,
      amp: compileExpression(t.amplitude, scope, `${path}.amplitude`),
      phase: t.phase === undefined ? undefined : compileExpression(t.phase, scope, `${path}.phase`),
    };
  });
  return {
    bind: (base) =>
      compiled.map((c) => ({
        amp: evaluator(c.amp, base, c.per, `${c.path}.amplitude`),
        phase: c.phase ? evaluator(c.phase, base, c.per, `${c.path}.phase`) : () => 0,
      })),
  };
}

/** Per-entry expression variables of a bond (hop, interaction): displacement, midpoint, turn 0. */
export function bondVariables(lattice: Lattice, b: Bond): Record<string, number> {
  const s = lattice.sites[b.from];
  return { dx: b.dx, dy: b.dy, x: s.x + b.dx / 2, y: s.y + b.dy / 2, turn: 0 };
}

/** Per-entry expression variables of a two-step path (conditional hop): total displacement, midpoint of the ends, turn. */
export function pathVariables(lattice: Lattice, p: Path): Record<string, number> {
  const s = lattice.sites[p.from];
  return { dx: p.dx, dy: p.dy, x: s.x + p.dx / 2, y: s.y + p.dy / 2, turn: p.turn };
}

/** Per-entry expression variables of a site (onsite): position and sublattice label. */
export function siteVariables(lattice: Lattice, s: Site): Record<string, number> {
  return { x: s.x, y: s.y, sublattice: lattice.basis[s.sublattice].sublattice };
}

/**
 * Compile a spec (validated again here) with optional parameter overrides (numbers; parameters
 * defined from them follow). Throws SpecError on any problem.
 */
export function compileModel(spec: ModelSpec, overrides: Record<string, number> = {}): CompiledModel {
  const parsed = parseModelSpec(spec);
  const { values, issues } = evaluateParameters(parsed.parameters, overrides);
  if (issues.length) throw new SpecError(issues);
  const base: Record<string, number> = { pi: Math.PI, ...values };
  const dim = parsed.lattice.size.length;
  const twist = (parsed.lattice.twist ?? new Array<number>(dim).fill(0)).map((t, a) => {
    const path = `$.lattice.twist[${a}]`;
    return evaluateReal(compileExpression(t, Object.keys(base), path), base, path, '');
  });
  const lattice = buildLattice(parsed.lattice, {
    shells: requiredShells(parsed.terms),
    twist,
    paths: parsed.terms.some((t) => t.kind === 'conditional-hop'),
  });
  const nSites = lattice.sites.length;
  const pc = parsed.particles;
  const nParticles = pc.count ?? Math.round((pc.filling ?? 0) * nSites);

  const evaluators = termExpressions(parsed).bind(base);
  const terms: CompiledTerm[] = parsed.terms.map((t, termIndex) => {
    const { amp, phase } = evaluators[termIndex];
    switch (t.kind) {
      case 'hop': {
        const entries: HopEntry[] = selectBonds(lattice, t).map((b) => {
          const vars = bondVariables(lattice, b);
          const where = () => `bond ${b.index} (${b.from}→${b.to}, dx=${fmt(b.dx)}, dy=${fmt(b.dy)})`;
          const a = amp(vars, where);
          const angle = phase(vars, where) + twistAngle(b.wrap, lattice.twist);
          return { from: b.from, to: b.to, re: a * Math.cos(angle), im: a * Math.sin(angle), bond: b.index };
        });
        return { termIndex, kind: 'hop', entries };
      }
      case 'conditional-hop': {
        const entries: ConditionalHopEntry[] = selectPaths(lattice, t).map((p) => {
          const vars = pathVariables(lattice, p);
          const where = () => `path ${p.index} (${p.from}→${p.via}→${p.to}, turn=${p.turn})`;
          const a = amp(vars, where);
          const angle = phase(vars, where) + twistAngle(p.wrap, lattice.twist);
          return { from: p.from, via: p.via, to: p.to, re: a * Math.cos(angle), im: a * Math.sin(angle), path: p.index };
        });
        return { termIndex, kind: 'conditional-hop', when: t.when ?? 'empty', entries };
      }
      case 'interaction': {
        const entries: InteractionEntry[] = selectBonds(lattice, t).map((b) => {
          const vars = bondVariables(lattice, b);
          const where = () => `bond ${b.index} (${b.from}–${b.to})`;
          return { i: b.from, j: b.to, value: amp(vars, where), bond: b.index };
        });
        return { termIndex, kind: 'interaction', entries };
      }
      case 'onsite': {
        const entries: OnsiteEntry[] = lattice.sites.map((s) => ({
          i: s.index,
          value: amp(siteVariables(lattice, s), () => `site ${s.index}`),
        }));
        return { termIndex, kind: 'onsite', entries };
      }
    }
  });

  const outSpec: ModelSpec = { ...parsed, parameters: { ...parsed.parameters, ...overrides } };
  return { spec: outSpec, parameters: values, lattice, nSites, nParticles, terms };
}

function fmt(v: number): string {
  return Number(v.toFixed(6)).toString();
}
