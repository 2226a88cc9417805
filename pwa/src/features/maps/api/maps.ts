/** Maps, their points and the label annotations, read live from the local database. */
import { useLiveQuery } from 'dexie-react-hooks';
import { db, newId, type LabelAnnotation, type MapRecord, type PointRow } from '../../../lib/db.js';

export function useMapRecord(id: string | undefined): MapRecord | null | undefined {
  return useLiveQuery(async () => (id ? ((await db.maps.get(id)) ?? null) : null), [id]);
}

export function useMapPoints(mapId: string | undefined): PointRow[] | undefined {
  return useLiveQuery(async () => (mapId ? db.points.where('mapId').equals(mapId).toArray() : []), [mapId]);
}

export function useAnnotations(mapId: string | undefined): LabelAnnotation[] | undefined {
  return useLiveQuery(async () => (mapId ? db.labels.where('mapId').equals(mapId).toArray() : []), [mapId]);
}

/** Renames or recolours a phase label on one map (an annotation; the points keep the classifier's id). */
export async function annotateLabel(mapId: string, labelId: string, patch: Pick<LabelAnnotation, 'name' | 'color' | 'note'>): Promise<void> {
  await db.transaction('rw', db.labels, db.maps, db.outbox, async () => {
    const existing = await db.labels.where('[mapId+labelId]').equals([mapId, labelId]).first();
    const now = Date.now();
    const record: LabelAnnotation = existing
      ? { ...existing, ...patch, rev: existing.rev + 1, updatedAt: now }
      : { id: newId(), mapId, labelId, ...patch, rev: 1, updatedAt: now };
    await db.labels.put(record);
    const map = await db.maps.get(mapId);
    await db.outbox.add({ projectId: map?.projectId ?? 'device', entity: 'label', entityId: record.id, op: 'put', createdAt: now });
  });
}
