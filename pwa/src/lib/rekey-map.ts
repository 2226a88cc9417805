/**
 * Re-keying a map to the id the server stored it under.
 *
 * The server keeps one map per identity and project: when a pushed map has the identity of a map it
 * already holds under another id (two devices ran the same sweep), it merges the points into that
 * map and answers `storedAs: <its id>`. Without re-keying, the next pull brings the server's map as
 * a second map with the same points. So the local map moves to the server's id: its points (where
 * the server's copy on this device lacks a key; for keys both have, the next pull brings the merged
 * result), the sweeps, label annotations and run records that point at it, and waiting outbox
 * entries. The old id is kept as an alias so that open pages and links still find the map. Sweeps
 * and annotations that moved are queued so that the server's records point at the new id as well.
 */
import { LOCAL_PROJECT_ID, pointRow, queueChange, type PhasewrightDb } from './db.js';

/** Tables `rekeyMap` reads and writes (a caller's transaction must include them). */
export function rekeyTables(database: PhasewrightDb) {
  return [database.maps, database.points, database.sweeps, database.labels, database.runs, database.outbox, database.mapAliases];
}

export type RekeyOutcome = 'rekeyed' | 'merged' | 'deferred' | 'nothing';

/**
 * Moves map `fromId` to `toId` (see the module comment). Returns 'merged' when a map `toId` was
 * already on this device, 'rekeyed' when it was not, 'deferred' while a sweep is still writing into
 * the map (the next push answers `storedAs` again), 'nothing' when there is nothing to move.
 * Runs in its own transaction, or in the caller's when that includes `rekeyTables`.
 */
export async function rekeyMap(database: PhasewrightDb, fromId: string, toId: string): Promise<RekeyOutcome> {
  if (fromId === toId) return 'nothing';
  return database.transaction('rw', rekeyTables(database), async () => {
    const from = await database.maps.get(fromId);
    if (!from) return 'nothing';
    const running = await database.runs.where('mapId').equals(fromId).filter((r) => r.state === 'running').count();
    if (running > 0) return 'deferred';
    const target = await database.maps.get(toId);

    const have = new Set(target ? ((await database.points.where('mapId').equals(toId).primaryKeys()) as [string, string][]).map(([, key]) => key) : []);
    const moving = await database.points.where('mapId').equals(fromId).toArray();
    await database.points.bulkPut(moving.filter((r) => !have.has(r.key)).map((r) => pointRow(toId, r.key, r.point)));
    await database.points.where('mapId').equals(fromId).delete();
    const pointCount = await database.points.where('mapId').equals(toId).count();

    if (target) await database.maps.update(toId, { pointCount, sweepId: target.sweepId || from.sweepId, updatedAt: Math.max(target.updatedAt, from.updatedAt) });
    else await database.maps.put({ ...from, id: toId, pointCount });
    await database.maps.delete(fromId);

    const shared = from.projectId !== LOCAL_PROJECT_ID;
    const sweeps = await database.sweeps.where('mapId').equals(fromId).toArray();
    for (const s of sweeps) {
      await database.sweeps.update(s.id, { mapId: toId });
      if (shared) await queueChange(database, from.projectId, 'sweep', s.id);
    }
    const labels = await database.labels.where('mapId').equals(fromId).toArray();
    for (const l of labels) {
      await database.labels.update(l.id, { mapId: toId });
      if (shared) await queueChange(database, from.projectId, 'label', l.id);
    }
    await database.runs.where('mapId').equals(fromId).modify({ mapId: toId });
    await database.outbox
      .where('[entity+entityId]')
      .anyOf([
        ['map', fromId],
        ['point', fromId],
      ])
      .modify({ entityId: toId });
    // Aliases that pointed at the old id follow too (a map re-keyed twice).
    await database.mapAliases.where('mapId').equals(fromId).modify({ mapId: toId });
    await database.mapAliases.put({ id: fromId, mapId: toId, projectId: from.projectId, createdAt: Date.now() });
    return target ? 'merged' : 'rekeyed';
  });
}

/** The id a map has now: itself, or where it was re-keyed to (undefined when unknown). */
export async function currentMapId(database: PhasewrightDb, id: string): Promise<string | undefined> {
  if (await database.maps.get(id)) return id;
  return (await database.mapAliases.get(id))?.mapId;
}
