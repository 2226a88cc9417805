/**
 * The value range of a line plot. Differences below 1e-9 of the values' size (or of 1, the model's
 * energy unit, near zero) are rounding noise of the solvers, not structure: such a series is drawn
 * flat in a range of ±8% around it, instead of magnifying the noise into a full-height zigzag with
 * tick labels a dozen digits long. Otherwise the data range with 8% padding.
 */
export function plotDomain(values: readonly number[]): [number, number] {
  const finite = values.filter(Number.isFinite);
  if (finite.length === 0) return [0, 1];
  const lo = Math.min(...finite);
  const hi = Math.max(...finite);
  const size = Math.max(Math.abs(lo), Math.abs(hi), 1);
  if (hi - lo <= 1e-9 * size) {
    const mid = Math.abs((lo + hi) / 2) < 1e-9 ? 0 : (lo + hi) / 2;
    const half = 0.08 * Math.max(Math.abs(mid), 1);
    return [mid - half, mid + half];
  }
  const pad = (hi - lo) * 0.08;
  return [lo - pad, hi + pad];
}

/** d3's tick formatter with "~g": as many significant digits as the tick step needs, no trailing zeros. */
export const TICK_SPECIFIER = '~g';
