import type { MapPoint, MapProvenance, SweepSpec } from '@phasewright/physics-core';
import { afterEach, describe, expect, it } from 'vitest';
import { db, LOCAL_PROJECT_ID, pointRow, queueChange, type MapRecord } from './db.js';
import { currentMapId, rekeyMap } from './rekey-map.js';

const P = '11111111-1111-4111-8111-111111111111';
const LOCAL = 'aaaaaaaa-0000-4000-8000-000000000001';
const SERVER = 'bbbbbbbb-0000-4000-8000-000000000002';
const SWEEP = 'cccccccc-0000-4000-8000-000000000003';
const LABEL = 'dddddddd-0000-4000-8000-000000000004';

function point(V: number, energy = -1 - V): MapPoint {
  return {
    parameters: { V },
    level: 0,
    energy,
    observables: {},
    convergence: { converged: true, iterations: 3, residual: 1e-12 },
    wallMs: 1,
    seed: 7,
    computed: { at: '2030-01-01T00:00:00.000Z', runtime: { kind: 'browser', version: 't', cores: 1 } },
  };
}

const sweep = { spec: 'phasewright.sweep/1', name: 'cut', method: 'ed', model: { lattice: { kind: 'chain', size: [4] } }, axes: [] } as unknown as SweepSpec;
const mapRecord = (id: string, projectId = P, pointCount = 0): MapRecord => ({
  id,
  projectId,
  ownerId: 'u1',
  name: `map ${id.slice(0, 4)}`,
  createdAt: 1,
  updatedAt: 1,
  sweepId: id === LOCAL ? SWEEP : '',
  identity: 'same-identity',
  sweep,
  provenance: { coreVersion: '0' } as unknown as MapProvenance,
  method: 'ed',
  lattice: 'chain',
  pointCount,
});

async function localMapWithSweepAndLabel(projectId = P) {
  await db.maps.put(mapRecord(LOCAL, projectId, 2));
  await db.points.bulkPut([pointRow(LOCAL, 'V=0', point(0)), pointRow(LOCAL, 'V=1', point(1))]);
  await db.sweeps.put({ id: SWEEP, projectId, ownerId: 'u1', name: 'cut', modelId: 'm', mapId: LOCAL, spec: sweep, createdAt: 1, updatedAt: 1, syncedRev: 1 });
  await db.labels.put({ id: LABEL, mapId: LOCAL, labelId: 'sf', name: 'mine', rev: 1, updatedAt: 1 });
  await db.runs.put({ id: SWEEP, mapId: LOCAL, state: 'done', done: 2, total: 2, failed: 0, startedAt: 1, updatedAt: 1 });
}

afterEach(async () => {
  await Promise.all([db.maps.clear(), db.points.clear(), db.sweeps.clear(), db.labels.clear(), db.runs.clear(), db.outbox.clear(), db.mapAliases.clear()]);
});

describe('rekeyMap', () => {
  it("moves a map to the server's id with its points, sweep, annotation and run; the old id becomes an alias; sweep and annotation are queued", async () => {
    await localMapWithSweepAndLabel();
    await db.outbox.add({ projectId: P, entity: 'point', entityId: LOCAL, op: 'put', createdAt: 2 });
    expect(await rekeyMap(db, LOCAL, SERVER)).toBe('rekeyed');

    expect(await db.maps.get(LOCAL)).toBeUndefined();
    const moved = await db.maps.get(SERVER);
    expect([moved?.name, moved?.pointCount, moved?.sweepId, moved?.identity]).toEqual(['map aaaa', 2, SWEEP, 'same-identity']);
    expect(await db.points.where('mapId').equals(LOCAL).count()).toBe(0);
    expect((await db.points.where('mapId').equals(SERVER).toArray()).map((r) => r.key).sort()).toEqual(['V=0', 'V=1']);
    expect((await db.sweeps.get(SWEEP))?.mapId).toBe(SERVER);
    expect((await db.labels.get(LABEL))?.mapId).toBe(SERVER);
    expect((await db.runs.get(SWEEP))?.mapId).toBe(SERVER);
    expect(await currentMapId(db, LOCAL)).toBe(SERVER);
    expect(await currentMapId(db, SERVER)).toBe(SERVER);
    const outbox = (await db.outbox.toArray()).map((e) => `${e.entity}:${e.entityId}`).sort();
    expect(outbox).toEqual([`label:${LABEL}`, `point:${SERVER}`, `sweep:${SWEEP}`]);
  });

  it("merges into a copy of the server's map already on this device: its points win, missing ones are added", async () => {
    await localMapWithSweepAndLabel();
    await db.maps.put({ ...mapRecord(SERVER, P, 2), name: 'pulled earlier' });
    await db.points.bulkPut([pointRow(SERVER, 'V=1', point(1, -7)), pointRow(SERVER, 'V=2', point(2))]);
    expect(await rekeyMap(db, LOCAL, SERVER)).toBe('merged');
    expect(await db.maps.count()).toBe(1);
    const map = await db.maps.get(SERVER);
    expect([map?.name, map?.pointCount, map?.sweepId]).toEqual(['pulled earlier', 3, SWEEP]);
    const rows = await db.points.where('mapId').equals(SERVER).sortBy('key');
    expect(rows.map((r) => [r.key, r.point.energy])).toEqual([
      ['V=0', -1],
      ['V=1', -7],
      ['V=2', -3],
    ]);
  });

  it('waits while a sweep still writes into the map; does nothing for an unknown map or the same id', async () => {
    await localMapWithSweepAndLabel();
    await db.runs.update(SWEEP, { state: 'running' });
    expect(await rekeyMap(db, LOCAL, SERVER)).toBe('deferred');
    expect(await db.maps.get(LOCAL)).toBeDefined();
    expect(await db.maps.get(SERVER)).toBeUndefined();
    expect(await rekeyMap(db, 'eeeeeeee-0000-4000-8000-000000000005', SERVER)).toBe('nothing');
    expect(await rekeyMap(db, LOCAL, LOCAL)).toBe('nothing');
  });

  it('in the local-only space nothing is queued for the server', async () => {
    await localMapWithSweepAndLabel(LOCAL_PROJECT_ID);
    await queueChange(db, LOCAL_PROJECT_ID, 'model', 'm'); // unrelated entry stays as it is
    expect(await rekeyMap(db, LOCAL, SERVER)).toBe('rekeyed');
    expect((await db.outbox.toArray()).map((e) => e.entity)).toEqual(['model']);
  });
});
