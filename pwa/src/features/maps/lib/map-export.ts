/**
 * Exports of a map kept on this device (not synced): the data package (the map document with its
 * provenance) and one CSV line per point. Same columns as the server's export of a synced map.
 */
import { CORE_VERSION, exportFileStem, pointsCsv as corePointsCsv, type MapPoint, type PhaseMap } from '@phasewright/physics-core';
import type { MapRecord } from '../../../lib/db.js';

/** The map as a phasewright.map/1 document. */
export function mapDocument(map: MapRecord, points: Record<string, MapPoint>): PhaseMap {
  return { spec: 'phasewright.map/1', id: map.identity, sweep: map.sweep, points, provenance: map.provenance } as PhaseMap;
}

export function exportFileName(map: Pick<MapRecord, 'id' | 'sweep'>): string {
  return exportFileStem(map.sweep.name, map.id);
}

/** The data package of a local map (JSON text). */
export function localDataPackage(map: MapRecord, points: Record<string, MapPoint>, exportedAt = new Date().toISOString()): string {
  const pkg = { format: 'phasewright.data-package/1', exportedAt, exportedBy: { physicsCore: CORE_VERSION, from: 'this device' }, mapId: map.id, pointCount: Object.keys(points).length, map: mapDocument(map, points) };
  return `${JSON.stringify(pkg, null, 1)}\n`;
}

/** One line per point (physics-core's points CSV, the same columns as the server's export). */
export function pointsCsv(map: Pick<MapRecord, 'sweep'>, points: Record<string, MapPoint>): string {
  return corePointsCsv({ sweep: map.sweep, points });
}
