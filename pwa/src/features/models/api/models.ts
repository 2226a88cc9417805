/** Models in the local database: live reads for components, and the save used by the editor. */
import type { ModelSpec } from '@phasewright/physics-core';
import { useLiveQuery } from 'dexie-react-hooks';
import { LOCAL_PROJECT_ID, db, newId, queueChange, type ModelRecord } from '../../../lib/db.js';

/**
 * Saves (creates or updates) a model; queues it for the sync engine. New models go into
 * `target.projectId` (default: this device's local space). Returns its id.
 */
export async function saveModel(spec: ModelSpec, id?: string, target: { projectId?: string; ownerId?: string | null } = {}): Promise<string> {
  const now = Date.now();
  const modelId = id ?? newId();
  await db.transaction('rw', db.models, db.outbox, async () => {
    const existing = id ? await db.models.get(id) : undefined;
    const record: ModelRecord = {
      id: modelId,
      projectId: existing?.projectId ?? target.projectId ?? LOCAL_PROJECT_ID,
      ownerId: existing?.ownerId ?? target.ownerId ?? null,
      name: spec.name ?? 'unnamed model',
      createdAt: existing?.createdAt ?? now,
      updatedAt: now,
      spec,
      ...(existing?.syncedRev !== undefined ? { syncedRev: existing.syncedRev } : {}),
    };
    await db.models.put(record);
    await queueChange(db, record.projectId, 'model', modelId);
  });
  return modelId;
}

/** One model; `undefined` while loading, `null` when there is none with that id. */
export function useModel(id: string | undefined): ModelRecord | null | undefined {
  return useLiveQuery(async () => (id ? ((await db.models.get(id)) ?? null) : null), [id]);
}
