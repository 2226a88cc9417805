import { Dexie } from 'dexie';
import type { MapPoint } from '@phasewright/physics-core';
import { afterEach, describe, expect, it } from 'vitest';
import { LOCAL_PROJECT_ID, PhasewrightDb, SCHEMA_V1, newId, pointRow, queueChange } from './db.js';

function point(label: string | undefined, converged: boolean, V: number): MapPoint {
  return {
    parameters: { V },
    level: 0,
    energy: -1 - V,
    observables: { energyPerSite: -0.1 },
    convergence: { converged, iterations: 10, residual: converged ? 1e-12 : 1e-3 },
    wallMs: 1,
    seed: 1,
    computed: { at: '2030-01-01T00:00:00.000Z', runtime: { kind: 'browser', version: 'test', cores: 1 } },
    ...(label ? { label: { id: label, confidence: 1, evidence: {} } } : {}),
  };
}

const opened: Dexie[] = [];
afterEach(async () => {
  for (const d of opened.splice(0)) {
    d.close();
    await Dexie.delete(d.name);
  }
});

describe('PhasewrightDb', () => {
  it('stores and finds records by project, newest first, and points by map', async () => {
    const db = new PhasewrightDb(`t-${newId()}`);
    opened.push(db);
    const now = Date.now();
    await db.models.bulkPut([
      { id: 'a', projectId: LOCAL_PROJECT_ID, ownerId: null, name: 'older', createdAt: now - 10, updatedAt: now - 10, spec: {} as never },
      { id: 'b', projectId: LOCAL_PROJECT_ID, ownerId: null, name: 'newer', createdAt: now, updatedAt: now, spec: {} as never },
      { id: 'c', projectId: 'elsewhere', ownerId: 'u1', name: 'other project', createdAt: now, updatedAt: now + 5, spec: {} as never },
    ]);
    const local = await db.models.orderBy('updatedAt').reverse().filter((m) => m.projectId === LOCAL_PROJECT_ID).toArray();
    expect(local.map((m) => m.name)).toEqual(['newer', 'older']);

    await db.points.bulkPut([pointRow('m1', 'V=0', point('superfluid', true, 0)), pointRow('m1', 'V=1', point('density-wave', false, 1)), pointRow('m2', 'V=0', point(undefined, true, 0))]);
    expect(await db.points.where('mapId').equals('m1').count()).toBe(2);
    const dw = await db.points.where('[mapId+labelId]').equals(['m1', 'density-wave']).toArray();
    expect(dw.map((r) => r.key)).toEqual(['V=1']);
    expect(await db.points.where('[mapId+converged]').equals(['m1', 0]).count()).toBe(1);
    // Writing the same point twice replaces it (key = map + parameter key).
    await db.points.put(pointRow('m1', 'V=0', point('mott', true, 0)));
    expect(await db.points.where('mapId').equals('m1').count()).toBe(2);
    expect((await db.points.get(['m1', 'V=0']))?.labelId).toBe('mott');
  });

  it('the outbox numbers entries in order', async () => {
    const db = new PhasewrightDb(`t-${newId()}`);
    opened.push(db);
    const s1 = await db.outbox.add({ projectId: LOCAL_PROJECT_ID, entity: 'model', entityId: 'a', op: 'put', createdAt: 1 });
    const s2 = await db.outbox.add({ projectId: LOCAL_PROJECT_ID, entity: 'label', entityId: 'b', op: 'put', createdAt: 2 });
    expect(Number(s2)).toBeGreaterThan(Number(s1));
  });

  it('upgrades a version-1 database to v4: points gain their label and convergence fields, the outbox its entity index', async () => {
    const name = `t-${newId()}`;
    // A browser that ran the first release: only version 1, points without the v2 fields.
    const v1 = new Dexie(name);
    v1.version(1).stores(SCHEMA_V1);
    await v1.table('points').bulkPut([
      { mapId: 'm', key: 'V=0', point: point('superfluid', true, 0) },
      { mapId: 'm', key: 'V=2', point: point('density-wave', false, 2) },
      { mapId: 'm', key: 'V=3', point: point(undefined, true, 3) },
    ]);
    await v1.table('models').put({ id: 'x', projectId: LOCAL_PROJECT_ID, ownerId: null, name: 'kept', createdAt: 1, updatedAt: 1, spec: {} });
    await v1.table('outbox').add({ projectId: 'p1', entity: 'model', entityId: 'x', op: 'put', createdAt: 1 });
    v1.close();

    const db = new PhasewrightDb(name);
    opened.push(db);
    await db.open();
    expect(db.verno).toBe(4);
    expect(await db.mapAliases.count()).toBe(0);
    // v3: the outbox entry is found by entity, the new tables are there and empty.
    expect(await db.outbox.where('[entity+entityId]').equals(['model', 'x']).count()).toBe(1);
    expect(await db.session.count()).toBe(0);
    expect(await db.conflicts.count()).toBe(0);
    expect((await db.models.get('x'))?.name).toBe('kept');
    const rows = await db.points.where('mapId').equals('m').sortBy('key');
    expect(rows.map((r) => [r.key, r.labelId, r.converged])).toEqual([
      ['V=0', 'superfluid', 1],
      ['V=2', 'density-wave', 0],
      ['V=3', '', 1],
    ]);
    expect(await db.points.where('[mapId+labelId]').equals(['m', 'density-wave']).count()).toBe(1);
    expect(await db.points.where('[mapId+converged]').equals(['m', 0]).count()).toBe(1);
  });

  it('queues one waiting entry per entity; an entry already being pushed does not count', async () => {
    const db = new PhasewrightDb(`t-${newId()}`);
    opened.push(db);
    await queueChange(db, 'p', 'map', 'm1');
    await queueChange(db, 'p', 'map', 'm1');
    expect(await db.outbox.count()).toBe(1);
    const [first] = await db.outbox.toArray();
    await db.outbox.update(first.seq as number, { batchId: 'b1' });
    await queueChange(db, 'p', 'map', 'm1');
    await queueChange(db, 'p', 'model', 'm1');
    expect((await db.outbox.toArray()).map((e) => [e.entity, e.batchId ?? null])).toEqual([
      ['map', 'b1'],
      ['map', null],
      ['model', null],
    ]);
  });
});
