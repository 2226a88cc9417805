/**
 * A map's points as CSV (RFC 4180 quoting): one row per point, rows in the order of the sweep's
 * axes (numerically), columns `key`, the axis parameters, energy, label, convergence, provenance
 * of the point, then every scalar observable (sorted by name). The CLI, the PWA (maps kept on
 * the device) and the server (synced maps) all export with this one function.
 */
import type { MapPoint, PhaseMap } from './map-format.js';

/** A CSV field, quoted when it holds a comma, a quote or a line break. */
export function csvField(v: unknown): string {
  const s = v === undefined || v === null ? '' : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export interface PointsCsvOptions {
  /** Line ending. @default '\r\n' (RFC 4180) */
  lineEnd?: '\r\n' | '\n';
}

export function pointsCsv(map: Pick<PhaseMap, 'sweep' | 'points'>, options: PointsCsvOptions = {}): string {
  const eol = options.lineEnd ?? '\r\n';
  const params = map.sweep.axes.map((a) => a.parameter);
  const entries: [string, MapPoint][] = Object.entries(map.points).sort(([ka, a], [kb, b]) => {
    for (const p of params) if (a.parameters[p] !== b.parameters[p]) return a.parameters[p] - b.parameters[p];
    return ka < kb ? -1 : ka > kb ? 1 : 0;
  });
  const scalars = [...new Set(entries.flatMap(([, p]) => Object.entries(p.observables).filter(([, v]) => typeof v === 'number').map(([k]) => k)))].sort();
  const header = ['key', ...params, 'energy', 'label', 'label_confidence', 'converged', 'iterations', 'residual', 'level', 'seed', 'wall_ms', 'computed_at', 'computed_by', 'runtime', 'disputed_results', 'other_results', ...scalars];
  const lines = [header.map(csvField).join(',')];
  for (const [key, p] of entries) {
    lines.push(
      [
        key,
        ...params.map((n) => p.parameters[n]),
        p.energy,
        p.label?.id,
        p.label?.confidence,
        p.convergence.converged,
        p.convergence.iterations,
        p.convergence.residual,
        p.level,
        p.seed,
        p.wallMs,
        p.computed.at,
        p.computed.author,
        `${p.computed.runtime.kind} ${p.computed.runtime.version}`,
        p.disputed?.length ?? 0,
        p.history?.length ?? 0,
        ...scalars.map((s) => p.observables[s]),
      ]
        .map(csvField)
        .join(','),
    );
  }
  return `${lines.join(eol)}${eol}`;
}

/** A file-name stem for exports of a map: the sweep's name in kebab case and the first 8 characters of `id`. */
export function exportFileStem(sweepName: string | undefined, id: string): string {
  const base = (sweepName ?? 'map').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60);
  return `${base || 'map'}-${id.slice(0, 8)}`;
}
