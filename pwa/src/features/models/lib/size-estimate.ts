/**
 * How large an exact diagonalization of a model would be, and whether a browser can hold it.
 * Bytes come from physics-core's own estimates (basis, diagonal, CSR operator, Lanczos vectors),
 * so the editor says what the solver will actually allocate.
 */
import { estimateHilbertDimension, estimateLanczosBytes, estimateOperator, type CompiledModel } from '@phasewright/physics-core';

/** Lanczos window and states the sweep runner uses by default (physics-core's defaults). */
const WINDOW = 20;
const STATES = 2;

/**
 * Thresholds for one worker (rules of thumb, common practice for desktop browsers in 2020s
 * laptops: a tab's typed arrays beyond about 1–2 GiB risk an out-of-memory crash, and each
 * sweep worker holds its own copy).
 */
export const COMFORT_BYTES = 256 * 2 ** 20;
export const BROWSER_LIMIT_BYTES = 1024 * 2 ** 20;

export type SizeVerdict = 'fine' | 'heavy' | 'too-large';

export interface SizeEstimate {
  nSites: number;
  nParticles: number;
  dimension: number;
  /** Bytes with the operator stored as CSR (fastest), and matrix-free (smallest). */
  csrBytes: number;
  matrixFreeBytes: number;
  /** The smaller of the two: what the solver's automatic choice needs at least. */
  bytes: number;
  verdict: SizeVerdict;
}

export function estimateEdSize(model: CompiledModel): SizeEstimate {
  const dimension = estimateHilbertDimension(model.nSites, model.nParticles);
  const lanczos = estimateLanczosBytes(dimension, WINDOW, STATES);
  let csrBytes: number;
  let matrixFreeBytes: number;
  try {
    const op = estimateOperator(model);
    csrBytes = op.totalCsrBytes + lanczos;
    matrixFreeBytes = op.totalMatrixFreeBytes + lanczos;
  } catch {
    // Beyond what the operator code can index: at least the Lanczos vectors.
    csrBytes = Number.POSITIVE_INFINITY;
    matrixFreeBytes = lanczos;
  }
  const bytes = Math.min(csrBytes, matrixFreeBytes);
  const verdict: SizeVerdict = bytes > BROWSER_LIMIT_BYTES ? 'too-large' : csrBytes > COMFORT_BYTES ? 'heavy' : 'fine';
  return { nSites: model.nSites, nParticles: model.nParticles, dimension, csrBytes, matrixFreeBytes, bytes, verdict };
}

/** "12.3 MB", "1.5 GB" (powers of 1024, the unit names people read). */
export function formatBytes(bytes: number): string {
  if (!Number.isFinite(bytes)) return 'more than can be addressed';
  const units = ['B', 'kB', 'MB', 'GB', 'TB', 'PB'];
  let v = bytes;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) {
    v /= 1024;
    u++;
  }
  return `${v >= 100 || u === 0 ? Math.round(v) : v.toFixed(1)} ${units[u]}`;
}

/** 12 870, 2.7 × 10⁹ */
export function formatCount(n: number): string {
  if (n < 1e6) return n.toLocaleString('en-GB').replace(/,/g, ' ');
  const e = Math.floor(Math.log10(n));
  const sup = String(e).replace(/\d/g, (d) => '⁰¹²³⁴⁵⁶⁷⁸⁹'[Number(d)]);
  return `${(n / 10 ** e).toFixed(1)} × 10${sup}`;
}
