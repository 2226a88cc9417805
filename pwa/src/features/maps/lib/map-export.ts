/**
 * Exports of a map kept on this device (not synced): the data package (the map document with its
 * provenance) and one CSV line per point. Same columns as the server's export of a synced map.
 */
import { CORE_VERSION, type MapPoint, type PhaseMap } from '@phasewright/physics-core';
import type { MapRecord } from '../../../lib/db.js';

const csvField = (v: unknown): string => {
  if (v === undefined || v === null) return '';
  const s = String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

/** The map as a phasewright.map/1 document. */
export function mapDocument(map: MapRecord, points: Record<string, MapPoint>): PhaseMap {
  return { spec: 'phasewright.map/1', id: map.identity, sweep: map.sweep, points, provenance: map.provenance } as PhaseMap;
}

export function exportFileName(map: Pick<MapRecord, 'id' | 'sweep'>): string {
  const base = (map.sweep.name ?? 'map').toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 60);
  return `${base || 'map'}-${map.id.slice(0, 8)}`;
}

/** The data package of a local map (JSON text). */
export function localDataPackage(map: MapRecord, points: Record<string, MapPoint>, exportedAt = new Date().toISOString()): string {
  const pkg = { format: 'phasewright.data-package/1', exportedAt, exportedBy: { physicsCore: CORE_VERSION, from: 'this device' }, mapId: map.id, pointCount: Object.keys(points).length, map: mapDocument(map, points) };
  return `${JSON.stringify(pkg, null, 1)}\n`;
}

/** One line per point: parameters, energy, label, convergence, provenance, scalar observables. */
export function pointsCsv(map: Pick<MapRecord, 'sweep'>, points: Record<string, MapPoint>): string {
  const params = map.sweep.axes.map((a) => a.parameter);
  const entries = Object.entries(points).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
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
  return `${lines.join('\r\n')}\r\n`;
}
