/** Maps, their points and the label annotations, read live from the local database. */
import { useLiveQuery } from 'dexie-react-hooks';
import { sha256Hex } from '@phasewright/physics-core';
import { LOCAL_PROJECT_ID, db, queueChange, type LabelAnnotation, type MapRecord, type PointRow } from '../../../lib/db.js';

export function useMapRecord(id: string | undefined): MapRecord | null | undefined {
  return useLiveQuery(async () => (id ? ((await db.maps.get(id)) ?? null) : null), [id]);
}

export function useMapPoints(mapId: string | undefined): PointRow[] | undefined {
  return useLiveQuery(async () => (mapId ? db.points.where('mapId').equals(mapId).toArray() : []), [mapId]);
}

export function useAnnotations(mapId: string | undefined): LabelAnnotation[] | undefined {
  return useLiveQuery(async () => (mapId ? db.labels.where('mapId').equals(mapId).toArray() : []), [mapId]);
}

/**
 * The id of the annotation of one label on one map: the same on every device (UUID-shaped, from
 * SHA-256 of map id and label id), so that two people renaming the same label edit one record and
 * the server can tell a stale edit (a conflict) instead of keeping two names.
 */
export function labelAnnotationId(mapId: string, labelId: string): string {
  const h = sha256Hex(`phasewright.label\n${mapId}\n${labelId}`);
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-${((parseInt(h[16], 16) & 0x3) | 0x8).toString(16)}${h.slice(17, 20)}-${h.slice(20, 32)}`;
}

/** Renames or recolours a phase label on one map (an annotation; the points keep the classifier's id). */
export async function annotateLabel(mapId: string, labelId: string, patch: Pick<LabelAnnotation, 'name' | 'color' | 'note'>): Promise<void> {
  await db.transaction('rw', db.labels, db.maps, db.outbox, async () => {
    const existing = await db.labels.where('[mapId+labelId]').equals([mapId, labelId]).first();
    const now = Date.now();
    const record: LabelAnnotation = existing
      ? { ...existing, ...patch, rev: existing.rev + 1, updatedAt: now }
      : { id: labelAnnotationId(mapId, labelId), mapId, labelId, ...patch, rev: 1, updatedAt: now };
    await db.labels.put(record);
    const map = await db.maps.get(mapId);
    await queueChange(db, map?.projectId ?? LOCAL_PROJECT_ID, 'label', record.id);
  });
}
