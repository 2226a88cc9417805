import { hash } from 'node:crypto';
import { canonicalJson, MAP_SPEC_ID, type MapPoint, type MapProvenance, mergedPointText, type PhaseMap, type SweepSpec } from '@phasewright/physics-core';

/** A row of `maps` as the services read it (JSON columns still as text). */
export interface MapRow {
  pk: number;
  projectId: string;
  id: string;
  identity: string;
  method: 'ed' | 'meanfield';
  name: string | null;
  sweep: string;
  provenance: string;
  pointCount: number;
  pointsDigest: string;
  seq: number;
  createdBy: string | null;
  updatedBy: string | null;
  createdAt: Date;
  updatedAt: Date;
}

export const MAP_COLUMNS =
  'pk, project_id AS projectId, id, identity, method, name, sweep, provenance, point_count AS pointCount, points_digest AS pointsDigest, ' +
  'seq, created_by AS createdBy, updated_by AS updatedBy, created_at AS createdAt, updated_at AS updatedAt';

/** Numbers come back from BIGINT columns as bigint or string depending on the driver settings. */
export function normaliseMapRow(raw: Record<string, unknown>): MapRow {
  return { ...(raw as unknown as MapRow), pk: Number(raw.pk), seq: Number(raw.seq), pointCount: Number(raw.pointCount) };
}

/** SHA-256 of the UTF-8 bytes of `text`, hex (one-shot `crypto.hash`, Node ≥ 20.12: no Hash object per point). */
export const sha256 = (text: string): string => hash('sha256', text, 'hex');

/**
 * Stored form of a point: its canonical JSON (physics-core; the stored hash is its SHA-256).
 * The canonical text of a merged point (as canonicalJson), written from the stored point's text
 * when the merge kept the stored point and only added disputes or history (physics-core's
 * mergedPointText): `stored` must be the object JSON.parse made of `storedText`.
 */
export function mergedText(point: MapPoint, stored: MapPoint | undefined, storedText: string | undefined): string {
  return stored === undefined || storedText === undefined ? canonicalJson(point) : mergedPointText(point, stored, storedText);
}

/**
 * Digest of a map's point set: SHA-256 of the lines `key<TAB>sha256(canonical point)\n`, sorted by
 * key. Any added, removed or changed point changes it; verdicts record it to notice new points.
 */
export function pointsDigest(entries: Iterable<[string, string]>): string {
  const sorted = [...entries].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  // One string hashed at once: the same bytes as hashing line by line.
  return sha256(sorted.map(([key, h]) => `${key}\t${h}\n`).join(''));
}

/** The PhaseMap of a stored map with the given points. */
export function assembleMap(row: MapRow, points: Record<string, MapPoint>): PhaseMap {
  return {
    spec: MAP_SPEC_ID,
    id: row.identity,
    sweep: JSON.parse(row.sweep) as SweepSpec,
    points,
    provenance: JSON.parse(row.provenance) as MapProvenance,
  };
}
