/** Measured data uploaded to a project (what the server read from the CSV) and its place on a 1D cut. */

export interface MeasurementRow {
  /** Line in the uploaded file. */
  line: number;
  parameters: Record<string, number>;
  values: Record<string, number>;
  uncertainties: Record<string, number>;
}

export interface MeasurementsSummary {
  parameters: string[];
  observables: { name: string; uncertainty: boolean }[];
  rows: MeasurementRow[];
}

export interface MeasuredPoint {
  x: number;
  y: number;
  /** One standard uncertainty (the X_err column), when given. */
  err?: number;
  line: number;
}

/**
 * The measured points that belong on a cut of `observable` along `axis`: rows that give the axis
 * parameter and the observable, and, when the cut is a row of a 2D grid (`fixed`), whose value of
 * the fixed parameter matches it (rows that do not give that parameter are kept).
 */
export function measuredOnCut(rows: MeasurementRow[], axis: string, observable: string, fixed?: { parameter: string; value: number }): MeasuredPoint[] {
  const out: MeasuredPoint[] = [];
  for (const r of rows) {
    const x = r.parameters[axis];
    const y = r.values[observable];
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    if (fixed && fixed.parameter in r.parameters && Math.abs(r.parameters[fixed.parameter] - fixed.value) > 1e-12 * Math.max(1, Math.abs(fixed.value))) continue;
    const err = r.uncertainties[observable];
    out.push({ x, y, line: r.line, ...(Number.isFinite(err) ? { err: Math.abs(err) } : {}) });
  }
  return out.sort((a, b) => a.x - b.x);
}
