import { describe, expect, it } from 'vitest';
import { PhasewrightError, SpecError } from './errors.js';

describe('error messages', () => {
  it('prefix the JSON path once', () => {
    expect(new PhasewrightError('must be positive', 'options', '$.solver.tol').message).toBe('$.solver.tol: must be positive');
    const spec = new SpecError([{ path: '$', message: 'not valid JSON' }, { path: '$.terms[0]', message: 'unknown field "x"' }]);
    expect(spec.message).toBe('$: not valid JSON; $.terms[0]: unknown field "x"');
    expect(spec.path).toBe('$');
  });
});
