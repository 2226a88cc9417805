import { describe, expect, it } from 'vitest';
import { SpecError } from '../errors.js';
import { checkExpression, compileExpression, evaluateConstant, evaluateReal } from './expressions.js';

describe('expressions', () => {
  it('evaluates against Math (reference: the JavaScript Math library)', () => {
    const e = compileExpression('g*cos(turn*theta) + sqrt(dx^2+dy^2) - atan2(dy, dx) + (turn > 0 ? 1 : -1)', ['g', 'theta', 'turn', 'dx', 'dy'], '$');
    const s = { g: 0.4, theta: 2.1, turn: -1, dx: 0.5, dy: -0.7 };
    expect(evaluateReal(e, s, '$', '')).toBeCloseTo(
      0.4 * Math.cos(-2.1) + Math.hypot(0.5, -0.7) - Math.atan2(-0.7, 0.5) - 1,
      14,
    );
    expect(evaluateConstant('2*pi/3', {}, '$')).toBeCloseTo((2 * Math.PI) / 3, 15);
    expect(evaluateConstant(1.5, {}, '$')).toBe(1.5);
  });

  it('reports syntax errors with the offending position', () => {
    const c = checkExpression('2*+*J', ['J']);
    expect(c.ok).toBe(false);
    if (!c.ok) expect(c.message).toMatch(/Value expected.*at '\*J' \(character 4\)/);
    const d = checkExpression('(g + 1', ['g']);
    expect(d.ok).toBe(false);
  });

  it('names unknown symbols and functions and lists what is in scope', () => {
    const c = checkExpression('g*q + foo(dx)', ['g', 'dx']);
    expect(c.ok).toBe(false);
    if (!c.ok) {
      expect(c.message).toContain("unknown symbol 'q' (in scope here: g, dx)");
      expect(c.message).toContain("unknown function 'foo'");
    }
    const a = checkExpression('g = 3', ['g']);
    expect(a.ok).toBe(false);
  });

  it('refuses non-real and non-finite values, naming the path and the entry', () => {
    const e = compileExpression('sqrt(-dx)', ['dx'], '$.terms[0].amplitude');
    let err: unknown;
    try {
      evaluateReal(e, { dx: 1 }, '$.terms[0].amplitude', 'bond 3 (0→1)');
    } catch (x) {
      err = x;
    }
    expect(err).toBeInstanceOf(SpecError);
    expect((err as SpecError).issues[0]).toMatchObject({ path: '$.terms[0].amplitude' });
    expect((err as SpecError).issues[0].message).toContain('bond 3 (0→1)');
    expect(() => evaluateReal(compileExpression('1/dy', ['dy'], '$'), { dy: 0 }, '$', 'x')).toThrow(/not a finite real/);
  });
});
