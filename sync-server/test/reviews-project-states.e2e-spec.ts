import { randomUUID } from 'node:crypto';
import { InProcessExecutor, type PhaseMap, runSweep, solvePoint, type SweepSpec } from '@phasewright/physics-core';
import request from 'supertest';
import { bearer, register, type Session, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';
import { CHAIN_6 } from './support/chain-model.js';

const sweepTo = (to: number, points: number): SweepSpec => ({
  spec: 'phasewright.sweep/1',
  name: `chain V to ${to}`,
  model: CHAIN_6,
  axes: [{ parameter: 'V', kind: 'linear', from: 0, to, points }],
  method: 'ed',
  seed: 5,
});
const run = async (spec: SweepSpec, chunk?: { index: number; count: number }): Promise<PhaseMap> =>
  (await runSweep(spec, { executor: new InProcessExecutor(solvePoint), runtime: { kind: 'node', version: 'test', cores: 1 }, author: 'Eli Sand', chunk })).map;

describe('GET /api/projects/:id/reviews (latest review state per map) against the private MariaDB', () => {
  let db: TestDatabase;
  let t: TestApp;
  let editor: Session;
  let reviewer: Session;
  let viewer: Session;
  let stranger: Session;
  let projectId: string;
  const mapA = randomUUID(); // reviewed, approved, then new points → outdated
  const mapB = randomUUID(); // never reviewed → none
  const mapC = randomUUID(); // changes requested, then asked again → requested

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config);
    editor = await register(t.http, 'eli.sand@example.org', 'Eli Sand', 'harbor-thistle-5512');
    reviewer = await register(t.http, 'rua.venn@example.org', 'Rua Venn', 'juniper-socket-8841');
    viewer = await register(t.http, 'tam.oak@example.org', 'Tam Oak', 'saffron-ledge-2290');
    stranger = await register(t.http, 'ola.fern@example.org', 'Ola Fern', 'pebble-cinder-7403');
    projectId = (await request(t.http).post('/api/projects').set('authorization', bearer(editor)).send({ name: 'Review states' }).expect(201)).body.id;
    for (const [s, role] of [[reviewer, 'reviewer'], [viewer, 'viewer']] as const) {
      await db.sequelize.query('INSERT INTO memberships (project_id, user_id, role) VALUES (?, ?, ?)', { replacements: [projectId, s.user.id, role] });
    }
    const changes = [
      { kind: 'map', id: mapA, data: await run(sweepTo(2, 5), { index: 1, count: 2 }) },
      { kind: 'map', id: mapB, data: await run(sweepTo(1, 3)) },
      { kind: 'map', id: mapC, data: await run(sweepTo(3, 4)) },
    ];
    await request(t.http).post(api('/sync/push')).set('authorization', bearer(editor)).send({ batchId: randomUUID(), changes }).expect(200);
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  const api = (path: string) => `/api/projects/${projectId}${path}`;
  const states = async (who: Session = viewer) => {
    const body = (await request(t.http).get(api('/reviews')).set('authorization', bearer(who)).expect(200)).body as { mapId: string; state: string; reviewerName: string | null; pointCount: number; updatedAt: string | null; reviewId: string | null }[];
    return Object.fromEntries(body.map((s) => [s.mapId, s]));
  };
  const ask = async (mapId: string) =>
    (await request(t.http).post(api(`/maps/${mapId}/reviews`)).set('authorization', bearer(editor)).send({ reviewerId: reviewer.user.id }).expect(201)).body.id as string;
  const judge = (reviewId: string, verdict: 'approved' | 'changes-requested') =>
    request(t.http).post(api(`/reviews/${reviewId}/verdict`)).set('authorization', bearer(reviewer)).send({ verdict, note: `${verdict} (test)` }).expect(200);
  const pointCountOf = async (mapId: string) => (await request(t.http).get(api(`/maps/${mapId}`)).set('authorization', bearer(viewer)).expect(200)).body.pointCount as number;

  it('lists every map: none → requested → approved → outdated after new points, with reviewer, time and current point count', async () => {
    let s = await states();
    expect(Object.keys(s).sort()).toEqual([mapA, mapB, mapC].sort());
    expect(s[mapB]).toEqual({ mapId: mapB, state: 'none', reviewId: null, reviewerId: null, reviewerName: null, updatedAt: null, pointCount: 3 });

    const reviewA = await ask(mapA);
    s = await states();
    expect(s[mapA]).toMatchObject({ state: 'requested', reviewId: reviewA, reviewerId: reviewer.user.id, reviewerName: 'Rua Venn' });
    const requestedAt = Date.parse(s[mapA]!.updatedAt!);

    await judge(reviewA, 'approved');
    s = await states();
    expect(s[mapA]).toMatchObject({ state: 'approved', reviewId: reviewA });
    expect(Date.parse(s[mapA]!.updatedAt!)).toBeGreaterThanOrEqual(requestedAt);
    const before = s[mapA]!.pointCount;
    expect(before).toBe(await pointCountOf(mapA));

    // The other half of the sweep arrives: the approval no longer covers the map.
    await request(t.http).post(api('/sync/push')).set('authorization', bearer(editor)).send({ batchId: randomUUID(), changes: [{ kind: 'map', id: mapA, data: await run(sweepTo(2, 5)) }] }).expect(200);
    s = await states();
    expect(s[mapA]!.state).toBe('outdated');
    expect(s[mapA]!.pointCount).toBe(5);
    expect(s[mapA]!.pointCount).toBeGreaterThan(before);
    // The per-map route agrees (the state the PWA used to compute from it).
    const perMap = (await request(t.http).get(api(`/maps/${mapA}/reviews`)).set('authorization', bearer(viewer)).expect(200)).body;
    expect(perMap).toHaveLength(1);
    expect(perMap[0]).toMatchObject({ status: 'approved', outdated: true });
  });

  it('the latest review wins: changes requested, then a new request shows "requested"', async () => {
    const first = await ask(mapC);
    await judge(first, 'changes-requested');
    expect((await states())[mapC]).toMatchObject({ state: 'changes-requested', reviewId: first });
    const second = await ask(mapC);
    expect((await states())[mapC]).toMatchObject({ state: 'requested', reviewId: second });
    // Same request time to the millisecond: the id decides, as a stable order.
    await db.sequelize.query('UPDATE reviews SET created_at = (SELECT t.c FROM (SELECT created_at AS c FROM reviews WHERE id = ?) t) WHERE id = ?', { replacements: [first, second] });
    const latestId = [first, second].sort()[1];
    expect((await states())[mapC]!.reviewId).toBe(latestId);
  });

  it('any member may read it; outsiders get the 404 of a missing project, no token a 401', async () => {
    for (const who of [editor, reviewer, viewer]) expect(Object.keys(await states(who))).toHaveLength(3);
    const outsider = await request(t.http).get(api('/reviews')).set('authorization', bearer(stranger)).expect(404);
    const missing = await request(t.http).get(`/api/projects/${randomUUID()}/reviews`).set('authorization', bearer(stranger)).expect(404);
    expect(outsider.body).toEqual(missing.body);
    await request(t.http).get(api('/reviews')).expect(401);
  });
});
