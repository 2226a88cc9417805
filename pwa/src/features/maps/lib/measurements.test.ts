import { describe, expect, it } from 'vitest';
import { measuredOnCut, type MeasurementRow } from './measurements.js';

const rows: MeasurementRow[] = [
  { line: 2, parameters: { V: 1, mu: 0 }, values: { density: 0.5 }, uncertainties: { density: 0.02 } },
  { line: 3, parameters: { V: 0 }, values: { density: 0.4 }, uncertainties: {} },
  { line: 4, parameters: { V: 2, mu: 1 }, values: { density: 0.7 }, uncertainties: { density: -0.05 } },
  { line: 5, parameters: { V: 3, mu: 0 }, values: { other: 1 }, uncertainties: {} },
];

describe('measuredOnCut', () => {
  it('keeps rows with the axis and the observable, sorted along the axis, errors as given (absolute)', () => {
    expect(measuredOnCut(rows, 'V', 'density')).toEqual([
      { x: 0, y: 0.4, line: 3 },
      { x: 1, y: 0.5, err: 0.02, line: 2 },
      { x: 2, y: 0.7, err: 0.05, line: 4 },
    ]);
  });
  it('on a row of a grid, drops rows whose fixed parameter differs', () => {
    expect(measuredOnCut(rows, 'V', 'density', { parameter: 'mu', value: 0 }).map((p) => p.line)).toEqual([3, 2]);
  });
  it('a cut of an observable nobody measured is empty', () => {
    expect(measuredOnCut(rows, 'V', 'structure')).toEqual([]);
  });
});
