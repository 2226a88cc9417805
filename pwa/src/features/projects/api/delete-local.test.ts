import type { MapPoint, ModelSpec, SweepSpec } from '@phasewright/physics-core';
import { beforeEach, describe, expect, it } from 'vitest';
import { db, LOCAL_PROJECT_ID, pointRow } from '../../../lib/db.js';
import { deleteLocal, describeDeletion, LocalDeleteError, planLocalDelete } from './delete-local.js';

const spec = {} as ModelSpec;
const sweepSpec = {} as SweepSpec;
const point = { energy: -1, convergence: { converged: true } } as unknown as MapPoint;

async function seed(projectId = LOCAL_PROJECT_ID) {
  await db.models.add({ id: 'model', projectId, ownerId: null, name: 'chain', spec, createdAt: 1, updatedAt: 1 });
  for (const n of [1, 2]) {
    await db.sweeps.add({ id: `sweep${n}`, projectId, ownerId: null, name: `cut ${n}`, modelId: 'model', mapId: `map${n}`, spec: sweepSpec, createdAt: 1, updatedAt: 1 });
    await db.maps.add({ id: `map${n}`, projectId, ownerId: null, name: `cut ${n}`, sweepId: `sweep${n}`, identity: `id${n}`, sweep: sweepSpec, provenance: {} as never, method: 'ed', lattice: 'chain', pointCount: 3, createdAt: 1, updatedAt: 1 });
    await db.points.bulkAdd([0, 1, 2].map((k) => pointRow(`map${n}`, `V=${k}`, point)));
    await db.runs.add({ id: `sweep${n}`, mapId: `map${n}`, state: 'done', done: 3, total: 3, failed: 0, startedAt: 1, updatedAt: 1 });
    await db.labels.add({ id: `label${n}`, mapId: `map${n}`, labelId: 'superfluid', name: 'SF', rev: 1, updatedAt: 1 });
  }
  // An unrelated map that must survive.
  await db.maps.add({ id: 'other', projectId, ownerId: null, name: 'other', sweepId: null, identity: 'x', sweep: sweepSpec, provenance: {} as never, method: 'ed', lattice: 'chain', pointCount: 1, createdAt: 1, updatedAt: 1 } as never);
  await db.points.add(pointRow('other', 'V=0', point));
}

const counts = async () => ({
  models: await db.models.count(),
  sweeps: await db.sweeps.count(),
  maps: await db.maps.count(),
  points: await db.points.count(),
  runs: await db.runs.count(),
  labels: await db.labels.count(),
});

beforeEach(async () => {
  await Promise.all([db.models, db.sweeps, db.maps, db.points, db.runs, db.labels, db.mapAliases].map((t) => t.clear()));
});

describe('deleting from this device', () => {
  it('a model goes with its sweeps, their maps, points, runs and labels; nothing else', async () => {
    await seed();
    const plan = await planLocalDelete('model', 'model');
    expect(describeDeletion(plan)).toBe('the model "chain" with 2 sweeps, 2 maps and 6 computed points');
    await deleteLocal(plan);
    expect(await counts()).toEqual({ models: 0, sweeps: 0, maps: 1, points: 1, runs: 0, labels: 0 });
    expect(await db.maps.get('other')).toBeDefined();
  });

  it('a map goes with its sweep (one run), the model stays', async () => {
    await seed();
    const plan = await planLocalDelete('map', 'map1');
    expect(describeDeletion(plan)).toBe('the map "cut 1" with its sweep and 3 computed points');
    await deleteLocal(plan);
    expect(await counts()).toEqual({ models: 1, sweeps: 1, maps: 2, points: 4, runs: 1, labels: 1 });
    expect(await db.sweeps.get('sweep2')).toBeDefined();
  });

  it('refuses a server project, and a sweep that is running, changing nothing', async () => {
    await seed('p-shared');
    await expect(planLocalDelete('sweep', 'sweep1')).rejects.toThrow(LocalDeleteError);
    await expect(planLocalDelete('sweep', 'sweep1')).rejects.toThrow(/belongs to a server project/);
    await Promise.all([db.models, db.sweeps, db.maps, db.points, db.runs, db.labels].map((t) => t.clear()));
    await seed();
    await expect(planLocalDelete('model', 'model', (id) => id === 'sweep2')).rejects.toThrow('The sweep "cut 2" is running: cancel it first.');
    expect(await counts()).toEqual({ models: 1, sweeps: 2, maps: 3, points: 7, runs: 2, labels: 2 });
    await expect(planLocalDelete('map', 'gone')).rejects.toThrow(/no longer on this device/);
  });
});
