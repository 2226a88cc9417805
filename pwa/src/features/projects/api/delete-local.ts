/**
 * Deleting from this device's own space (`LOCAL_PROJECT_ID`): nothing there was ever sent to a
 * server, so a delete is final and needs no sync. A model goes with its sweeps, a sweep with its
 * map, a map with its sweep (they are one run's two halves) — each with points, run state, label
 * annotations and re-keying aliases. Records of server projects are refused: deleting shared work
 * would need the server to hand the deletion on to every member, which sync does not do.
 */
import { db, LOCAL_PROJECT_ID, type MapRecord, type ModelRecord, type SweepRecord } from '../../../lib/db.js';

export type LocalItemKind = 'model' | 'sweep' | 'map';

/** What a delete takes with it (shown before the user confirms). */
export interface LocalDeletion {
  kind: LocalItemKind;
  id: string;
  name: string;
  models: ModelRecord[];
  sweeps: SweepRecord[];
  maps: MapRecord[];
  points: number;
}

export class LocalDeleteError extends Error {}

/** Everything a delete of `kind` `id` removes; throws LocalDeleteError when it may not. */
export async function planLocalDelete(kind: LocalItemKind, id: string, isRunning: (sweepId: string) => boolean = () => false): Promise<LocalDeletion> {
  const models: ModelRecord[] = [];
  const sweeps: SweepRecord[] = [];
  const maps: MapRecord[] = [];
  let name: string;
  if (kind === 'model') {
    const model = await db.models.get(id);
    if (!model) throw new LocalDeleteError('This model is no longer on this device.');
    models.push(model);
    name = model.name;
    sweeps.push(...(await db.sweeps.where('modelId').equals(id).toArray()));
    for (const s of sweeps) {
      const map = await db.maps.get(s.mapId);
      if (map) maps.push(map);
    }
  } else if (kind === 'sweep') {
    const sweep = await db.sweeps.get(id);
    if (!sweep) throw new LocalDeleteError('This sweep is no longer on this device.');
    sweeps.push(sweep);
    name = sweep.name;
    const map = await db.maps.get(sweep.mapId);
    if (map) maps.push(map);
  } else {
    const map = await db.maps.get(id);
    if (!map) throw new LocalDeleteError('This map is no longer on this device.');
    maps.push(map);
    name = map.name;
    const sweep = map.sweepId ? await db.sweeps.get(map.sweepId) : undefined;
    if (sweep) sweeps.push(sweep);
  }
  const shared = [...models, ...sweeps, ...maps].find((r) => r.projectId !== LOCAL_PROJECT_ID);
  if (shared) throw new LocalDeleteError(`"${shared.name}" belongs to a server project: only work kept on this device alone can be deleted.`);
  const running = sweeps.find((s) => isRunning(s.id));
  if (running) throw new LocalDeleteError(`The sweep "${running.name}" is running: cancel it first.`);
  let points = 0;
  for (const m of maps) points += await db.points.where('mapId').equals(m.id).count();
  return { kind, id, name, models, sweeps, maps, points };
}

/** Deletes what `planLocalDelete` lists, in one transaction (all or nothing). */
export async function deleteLocal(plan: LocalDeletion): Promise<void> {
  await db.transaction('rw', [db.models, db.sweeps, db.maps, db.points, db.runs, db.labels, db.mapAliases], async () => {
    for (const m of plan.maps) {
      await db.points.where('mapId').equals(m.id).delete();
      await db.labels.where('mapId').equals(m.id).delete();
      await db.mapAliases.where('mapId').equals(m.id).delete();
      await db.runs.where('mapId').equals(m.id).delete();
    }
    await db.maps.bulkDelete(plan.maps.map((m) => m.id));
    await db.runs.bulkDelete(plan.sweeps.map((s) => s.id));
    await db.sweeps.bulkDelete(plan.sweeps.map((s) => s.id));
    await db.models.bulkDelete(plan.models.map((m) => m.id));
  });
}

/** "the model with 2 sweeps, 2 maps and 27 points" — for the confirmation. */
export function describeDeletion(plan: LocalDeletion): string {
  const count = (n: number, one: string) => `${n} ${one}${n === 1 ? '' : 's'}`;
  const parts: string[] = [];
  if (plan.kind === 'model') parts.push(count(plan.sweeps.length, 'sweep'));
  if (plan.kind !== 'map') parts.push(count(plan.maps.length, 'map'));
  if (plan.kind === 'map' && plan.sweeps.length) parts.push('its sweep');
  parts.push(count(plan.points, 'computed point'));
  const last = parts.pop() as string;
  return `the ${plan.kind} "${plan.name}" with ${parts.length ? `${parts.join(', ')} and ` : ''}${last}`;
}
