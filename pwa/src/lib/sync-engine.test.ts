import { canonicalJson, type MapPoint } from '@phasewright/physics-core';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { forgetAccessToken, startSession } from './auth.js';
import { db, pointRow, queueChange } from './db.js';
import { applyPulled, pointsDigest, pushProject, resolveKeepMine, resolveTakeTheirs } from './sync-engine.js';

const P = '11111111-1111-4111-8111-111111111111';
const L = '22222222-2222-4222-8222-222222222222';
const M = '33333333-3333-4333-8333-333333333333';

function point(V: number, label = 'sf'): MapPoint {
  return {
    parameters: { V },
    level: 0,
    energy: -1 - V,
    observables: { gap: 0.5 },
    convergence: { converged: true, iterations: 3, residual: 1e-12 },
    wallMs: 1,
    seed: 7,
    computed: { at: '2030-01-01T00:00:00.000Z', runtime: { kind: 'browser', version: 't', cores: 1 } },
    label: { id: label, confidence: 1, evidence: {} },
  };
}

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json' } });

afterEach(async () => {
  forgetAccessToken();
  await Promise.all([db.session.clear(), db.outbox.clear(), db.labels.clear(), db.conflicts.clear(), db.maps.clear(), db.points.clear(), db.syncState.clear()]);
});

describe('pointsDigest', () => {
  it("matches the server's definition computed independently with Web Crypto (SHA-256 of sorted `key\\tsha256(point)\\n` lines)", async () => {
    const points = { 'V=1': point(1), 'V=0.5': point(0.5, 'dw'), 'V=0': point(0) };
    const h = async (s: string) => [...new Uint8Array(await crypto.subtle.digest('SHA-256', new TextEncoder().encode(s)))].map((b) => b.toString(16).padStart(2, '0')).join('');
    const lines = (await Promise.all(['V=0', 'V=0.5', 'V=1'].map(async (k) => `${k}\t${await h(canonicalJson(points[k as keyof typeof points]))}\n`))).join('');
    const expected = await h(lines);
    expect(pointsDigest(points)).toBe(expected);
    // Any change of a point changes the digest; the order of insertion does not.
    expect(pointsDigest({ 'V=0': point(0), 'V=1': point(1), 'V=0.5': point(0.5, 'dw') })).toBe(expected);
    expect(pointsDigest({ ...points, 'V=1': point(1, 'dw') })).not.toBe(expected);
  });
});

describe('applyPulled', () => {
  it('writes maps, points and annotations with their server revision and moves the cursor; a record with a local edit waiting is left alone', async () => {
    await db.labels.put({ id: L, mapId: M, labelId: 'sf', name: 'mine', rev: 2, syncedRev: 1, updatedAt: 1 });
    await queueChange(db, P, 'label', L);
    const sweep = { spec: 'phasewright.sweep/1', name: 'cut', method: 'ed', model: { lattice: { kind: 'chain', size: [4] } }, axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 1, points: 2 }] };
    await applyPulled(
      P,
      [
        { seq: 3, kind: 'map', id: M, data: { spec: 'phasewright.map/1', id: 'abc', sweep, provenance: { coreVersion: '0' } }, updatedBy: 'u2', updatedAt: '2030-01-01T00:00:00Z' },
        { seq: 5, kind: 'points', id: M, data: { points: { 'V=0': point(0), 'V=1': point(1) } } },
        { seq: 6, kind: 'annotation', id: L, revision: 2, data: { mapId: M, labelId: 'sf', name: 'theirs' } },
      ],
      6,
    );
    const map = await db.maps.get(M);
    expect([map?.projectId, map?.identity, map?.pointCount, map?.method]).toEqual([P, 'abc', 2, 'ed']);
    expect((await db.labels.get(L))?.name).toBe('mine');
    expect((await db.syncState.get(P))?.cursor).toBe(6);
  });
});

describe('pushProject', () => {
  it('sends one batch with the stored revision as base; a 409 becomes a conflict; "keep mine" re-queues on the server revision, "take theirs" applies the server version', async () => {
    await startSession({ accessToken: 'A', expiresIn: 900, refreshToken: 'R', refreshExpiresAt: '2099-01-01T00:00:00Z', user: { id: 'u1', email: 'a@example.org', displayName: 'A', siteRole: 'member' } });
    await db.labels.put({ id: L, mapId: M, labelId: 'sf', name: 'ordered solid', rev: 3, syncedRev: 1, updatedAt: 1 });
    await queueChange(db, P, 'label', L);
    const bodies: { batchId: string; changes: { kind: string; baseRevision?: number; data: Record<string, unknown> }[] }[] = [];
    const answers = [
      json(409, { statusCode: 409, error: 'Conflict', message: 'stale', details: { conflicts: [{ kind: 'annotation', id: L, baseRevision: 1, yours: { mapId: M, labelId: 'sf', name: 'ordered solid' }, theirs: { revision: 2, data: { mapId: M, labelId: 'sf', name: 'crystal' }, updatedBy: 'u2', updatedAt: '2030-01-01T00:00:00Z' } }] } }),
      json(200, { batchId: 'x', cursor: 9, results: [{ kind: 'annotation', id: L, status: 'updated', revision: 3 }] }),
    ];
    vi.stubGlobal('fetch', async (_url: string, init: RequestInit) => {
      bodies.push(JSON.parse(String(init.body)) as (typeof bodies)[number]);
      const a = answers.shift();
      if (!a) throw new Error('no more answers');
      return a;
    });

    expect(await pushProject(P)).toEqual({ pushed: 0, conflicts: 1 });
    expect(bodies[0].changes).toEqual([{ kind: 'annotation', id: L, baseRevision: 1, data: { mapId: M, labelId: 'sf', name: 'ordered solid' } }]);
    const [conflict] = await db.conflicts.toArray();
    expect([conflict.entity, conflict.theirs?.revision]).toEqual(['label', 2]);
    // Held: nothing more is sent while the conflict is open.
    expect(await pushProject(P)).toEqual({ pushed: 0, conflicts: 0 });
    expect(bodies).toHaveLength(1);

    await resolveKeepMine(conflict.id, { name: 'ordered solid (agreed)' });
    expect(await pushProject(P)).toEqual({ pushed: 1, conflicts: 0 });
    expect(bodies[1].changes[0]).toMatchObject({ baseRevision: 2, data: { name: 'ordered solid (agreed)' } });
    expect(bodies[1].batchId).not.toBe(bodies[0].batchId);
    expect((await db.labels.get(L))?.syncedRev).toBe(3);
    expect(await db.outbox.count()).toBe(0);

    // "Take theirs": the server's version replaces mine and nothing waits.
    await db.conflicts.put({ ...conflict, id: 'annotation:again' });
    await queueChange(db, P, 'label', L);
    await resolveTakeTheirs('annotation:again');
    expect((await db.labels.get(L))?.name).toBe('crystal');
    expect(await db.outbox.count()).toBe(0);
  });

  it("a map the server stored under another id (storedAs) is re-keyed to it: later points go there and the next pull does not show the map twice", async () => {
    await startSession({ accessToken: 'A', expiresIn: 900, refreshToken: 'R', refreshExpiresAt: '2099-01-01T00:00:00Z', user: { id: 'u1', email: 'a@example.org', displayName: 'A', siteRole: 'member' } });
    const S = '44444444-4444-4444-8444-444444444444';
    const sweep = { spec: 'phasewright.sweep/1', name: 'cut', method: 'ed', model: { lattice: { kind: 'chain', size: [4] } }, axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 1, points: 1502 }] };
    await db.maps.put({ id: M, projectId: P, ownerId: 'u1', name: 'my cut', createdAt: 1, updatedAt: 1, sweepId: '', identity: 'abc', sweep: sweep as never, provenance: { coreVersion: '0' } as never, method: 'ed', lattice: 'chain', pointCount: 1502 });
    // More points than one request carries (1500), so a second request sends the rest.
    await db.points.bulkPut(Array.from({ length: 1502 }, (_, i) => pointRow(M, `V=${i}`, point(i))));
    await queueChange(db, P, 'map', M);
    const bodies: { changes: { kind: string; id: string }[] }[] = [];
    const answers = [
      json(200, { batchId: 'b', cursor: 4, results: [{ kind: 'map', id: M, status: 'merged', storedAs: S, points: { received: 1500, added: 1500, updated: 0, unchanged: 0, disputed: 0 } }] }),
      json(200, { batchId: 'c', cursor: 5, results: [{ kind: 'points', id: S, status: 'merged' }] }),
    ];
    vi.stubGlobal('fetch', async (_url: string, init: RequestInit) => {
      bodies.push(JSON.parse(String(init.body)) as (typeof bodies)[number]);
      const a = answers.shift();
      if (!a) throw new Error('no more answers');
      return a;
    });
    expect(await pushProject(P)).toEqual({ pushed: 1, conflicts: 0 });
    expect(bodies.map((b) => b.changes.map((c) => `${c.kind}:${c.id}`))).toEqual([[`map:${M}`], [`points:${S}`]]);
    expect(await db.maps.get(M)).toBeUndefined();
    expect(await db.maps.get(S)).toMatchObject({ name: 'my cut', pointCount: 1502 });
    expect(await db.outbox.count()).toBe(0);
    expect((await db.mapAliases.get(M))?.mapId).toBe(S);

    // The pull brings the server's map S (with a point this device lacked): still one map.
    await applyPulled(
      P,
      [
        { seq: 4, kind: 'map', id: S, data: { spec: 'phasewright.map/1', id: 'abc', sweep, provenance: { coreVersion: '0' } }, updatedBy: 'u2', updatedAt: '2030-01-01T00:00:00Z' },
        { seq: 5, kind: 'points', id: S, data: { points: { 'V=1502': point(1502) } } },
      ],
      5,
    );
    expect((await db.maps.where('projectId').equals(P).toArray()).map((m) => m.id)).toEqual([S]);
    expect((await db.maps.get(S))?.pointCount).toBe(1503);
    await Promise.all([db.mapAliases.clear(), db.runs.clear(), db.sweeps.clear()]);
  });
});
