/**
 * Expressions of model spec v1: numbers or mathjs expressions (parsed and compiled once,
 * evaluated per bond/path/site). Only a small number-only mathjs instance is created, so the
 * worker bundle stays small. Results must be finite real numbers.
 *
 * Functions available: sin cos tan asin acos atan atan2 sinh cosh tanh sqrt cbrt exp log abs
 * sign floor ceil round min max mod pow; operators + − * / ^ % unary ±, comparisons, and/or/not
 * and `c ? a : b`. Variables: the parameters, `pi`, and per entry (see compile.ts) `turn`, `dx`,
 * `dy`, `x`, `y`, `sublattice`.
 */
import {
  absDependencies,
  acosDependencies,
  addDependencies,
  andDependencies,
  asinDependencies,
  atan2Dependencies,
  atanDependencies,
  cbrtDependencies,
  ceilDependencies,
  cosDependencies,
  coshDependencies,
  create,
  divideDependencies,
  equalDependencies,
  expDependencies,
  floorDependencies,
  largerDependencies,
  largerEqDependencies,
  logDependencies,
  maxDependencies,
  minDependencies,
  modDependencies,
  multiplyDependencies,
  notDependencies,
  orDependencies,
  parseDependencies,
  powDependencies,
  roundDependencies,
  signDependencies,
  sinDependencies,
  sinhDependencies,
  smallerDependencies,
  smallerEqDependencies,
  sqrtDependencies,
  subtractDependencies,
  tanDependencies,
  tanhDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
  unequalDependencies,
} from 'mathjs/number';
import type { EvalFunction, MathNode } from 'mathjs';
import { SpecError } from '../errors.js';

const math = create({
  parseDependencies,
  absDependencies,
  acosDependencies,
  addDependencies,
  andDependencies,
  asinDependencies,
  atan2Dependencies,
  atanDependencies,
  cbrtDependencies,
  ceilDependencies,
  cosDependencies,
  coshDependencies,
  divideDependencies,
  equalDependencies,
  expDependencies,
  floorDependencies,
  largerDependencies,
  largerEqDependencies,
  logDependencies,
  maxDependencies,
  minDependencies,
  modDependencies,
  multiplyDependencies,
  notDependencies,
  orDependencies,
  powDependencies,
  roundDependencies,
  signDependencies,
  sinDependencies,
  sinhDependencies,
  smallerDependencies,
  smallerEqDependencies,
  sqrtDependencies,
  subtractDependencies,
  tanDependencies,
  tanhDependencies,
  unaryMinusDependencies,
  unaryPlusDependencies,
  unequalDependencies,
});

/** Functions an expression may call. */
export const EXPRESSION_FUNCTIONS: readonly string[] = [
  'sin', 'cos', 'tan', 'asin', 'acos', 'atan', 'atan2', 'sinh', 'cosh', 'tanh', 'sqrt', 'cbrt',
  'exp', 'log', 'abs', 'sign', 'floor', 'ceil', 'round', 'min', 'max', 'mod', 'pow',
];

const ALLOWED_NODES = new Set([
  'ConstantNode',
  'SymbolNode',
  'OperatorNode',
  'ParenthesisNode',
  'FunctionNode',
  'ConditionalNode',
]);

export interface CompiledExpression {
  /** The source text (a number is kept as its decimal text). */
  source: string;
  /** Variables the expression reads. */
  symbols: string[];
  /** Evaluate; returns whatever mathjs returns (check with `realValue`). */
  run(scope: Record<string, number>): unknown;
}

/** A parse/scope problem of one expression, or a compiled expression. */
export type ExpressionCheck = { ok: true; expr: CompiledExpression } | { ok: false; message: string };

/**
 * Parse and compile an expression, checking its syntax, node kinds, functions and variables
 * against `scope` (the names in scope). Does not throw.
 */
export function checkExpression(src: unknown, scope: readonly string[]): ExpressionCheck {
  if (typeof src === 'number') {
    if (!Number.isFinite(src)) return { ok: false, message: `must be a finite number, got ${src}` };
    return { ok: true, expr: { source: String(src), symbols: [], run: () => src } };
  }
  if (typeof src !== 'string')
    return { ok: false, message: `must be a number or an expression string, got ${src === null ? 'null' : typeof src}` };
  if (src.trim() === '') return { ok: false, message: 'is an empty expression' };
  let node: MathNode;
  try {
    node = math.parse(src);
  } catch (e) {
    const err = e as Error & { char?: number };
    const at = typeof err.char === 'number' ? err.char : undefined;
    // mathjs counts characters from 1; past the end means the expression stopped too early
    const rest = at !== undefined ? src.slice(Math.max(0, at - 1)).trim().slice(0, 8) : '';
    return {
      ok: false,
      message:
        `bad expression '${src}': ${err.message}` +
        (at === undefined ? '' : rest ? ` — at '${rest}' (character ${at})` : ' — it ends too early'),
    };
  }
  const symbols = new Set<string>();
  const problems: string[] = [];
  node.traverse((n: MathNode, path: string, parent: MathNode | null) => {
    if (!ALLOWED_NODES.has(n.type)) {
      problems.push(`'${n.toString()}' (${n.type.replace(/Node$/, '').toLowerCase()}) is not allowed in an expression`);
      return;
    }
    if (n.type === 'SymbolNode') {
      const name = (n as MathNode & { name: string }).name;
      if (parent && parent.type === 'FunctionNode' && path === 'fn') {
        if (!EXPRESSION_FUNCTIONS.includes(name))
          problems.push(`unknown function '${name}' (available: ${EXPRESSION_FUNCTIONS.join(', ')})`);
      } else symbols.add(name);
    }
  });
  for (const s of symbols)
    if (!scope.includes(s)) problems.push(`unknown symbol '${s}' (in scope here: ${scope.join(', ') || 'nothing'})`);
  if (problems.length) return { ok: false, message: `in '${src}': ${problems.join('; ')}` };
  const code: EvalFunction = node.compile();
  return { ok: true, expr: { source: src, symbols: [...symbols], run: (scope) => code.evaluate(scope) } };
}

/** Compile or throw a SpecError at `path`. */
export function compileExpression(src: unknown, scope: readonly string[], path: string): CompiledExpression {
  const c = checkExpression(src, scope);
  if (!c.ok) throw new SpecError([{ path, message: c.message }]);
  return c.expr;
}

/** The value as a finite real number, or undefined (complex, NaN, infinite, not a number). */
export function realValue(v: unknown): number | undefined {
  if (typeof v === 'boolean') return v ? 1 : 0;
  if (typeof v === 'number' && Number.isFinite(v)) return v;
  return undefined;
}

function show(v: unknown): string {
  if (typeof v === 'number') return String(v);
  if (v && typeof v === 'object' && 'toString' in v) return String(v);
  return typeof v;
}

/**
 * Evaluate to a finite real number or throw a SpecError at `path`; `where` names the bond,
 * path or site being evaluated (e.g. "bond 3 (0→1, dx=1, dy=0)").
 */
export function evaluateReal(
  expr: CompiledExpression,
  scope: Record<string, number>,
  path: string,
  where: string | (() => string),
): number {
  let raw: unknown;
  try {
    raw = expr.run(scope);
  } catch {
    raw = undefined;
  }
  if (typeof raw === 'number' && Number.isFinite(raw)) return raw; // fast path
  if (typeof where === 'function') where = where();
  try {
    raw = expr.run(scope);
  } catch (e) {
    throw new SpecError([{ path, message: `'${expr.source}' failed${where ? ` on ${where}` : ''}: ${(e as Error).message}` }]);
  }
  const v = realValue(raw);
  if (v === undefined)
    throw new SpecError([
      {
        path,
        message: `'${expr.source}' is not a finite real number${where ? ` on ${where}` : ''} (got ${show(raw)})`,
      },
    ]);
  return v;
}

/** Evaluate a constant expression (number or string) with `pi` and the given values in scope. */
export function evaluateConstant(src: unknown, values: Record<string, number>, path: string): number {
  const scope = { pi: Math.PI, ...values };
  const expr = compileExpression(src, Object.keys(scope), path);
  return evaluateReal(expr, scope, path, '');
}
