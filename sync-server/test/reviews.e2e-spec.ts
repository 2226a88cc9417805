import { randomUUID } from 'node:crypto';
import { InProcessExecutor, type PhaseMap, parseMap, runSweep, solvePoint, type SweepSpec } from '@phasewright/physics-core';
import request from 'supertest';
import type { App } from 'supertest/types.js';
import { loadSyncConfig } from '../src/sync/sync-config.js';
import { bearer, register, type Session, type StoredMail, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';
import { CHAIN_6 } from './support/chain-model.js';

const sweep: SweepSpec = { spec: 'phasewright.sweep/1', name: 'chain V cut for review', model: CHAIN_6, axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 2, points: 5 }], method: 'ed', seed: 5 };
const run = async (chunk: number) =>
  (await runSweep(sweep, { executor: new InProcessExecutor(solvePoint), runtime: { kind: 'node', version: 'test', cores: 1 }, author: 'Eli Sand', chunk: { index: chunk, count: 2 } })).map;

describe('reviews, spot-checks and exports against the private MariaDB', () => {
  let db: TestDatabase;
  let app: TestApp['app'];
  let server: App;
  let editor: Session;
  let reviewer: Session;
  let viewer: Session;
  let admin: Session;
  let projectId: string;
  const mapId = randomUUID();
  let first: PhaseMap;

  beforeAll(async () => {
    db = await createTestDatabase();
    const sync = { ...loadSyncConfig({}), spotCheck: { maxSample: 4, perUser: 1, maxRunning: 4, workers: 2, timeoutS: 60 } };
    ({ app, http: server } = await startTestApp(db.config, {}, sync));
    editor = await register(server, 'eli.sand@example.org', 'Eli Sand', 'harbor-thistle-5512');
    reviewer = await register(server, 'rua.venn@example.org', 'Rua Venn', 'juniper-socket-8841');
    viewer = await register(server, 'tam.oak@example.org', 'Tam Oak', 'saffron-ledge-2290');
    admin = await register(server, 'keeper@example.org', 'Keeper', 'granite-spoke-1618');
    await db.sequelize.query("UPDATE users SET site_role = 'admin' WHERE id = ?", { replacements: [admin.user.id] });
    projectId = (await request(server).post('/api/projects').set('authorization', bearer(editor)).send({ name: 'Chain review' }).expect(201)).body.id;
    for (const [s, role] of [[reviewer, 'reviewer'], [viewer, 'viewer']] as const) {
      await db.sequelize.query('INSERT INTO memberships (project_id, user_id, role) VALUES (?, ?, ?)', { replacements: [projectId, s.user.id, role] });
    }
    first = await run(1);
    // A deliberately wrong stored energy (test alteration) that the spot-check must catch.
    const spoiled = structuredClone(first);
    spoiled.points['V=0']!.energy += 0.1;
    await request(server).post(`/api/projects/${projectId}/sync/push`).set('authorization', bearer(editor)).send({ batchId: randomUUID(), changes: [{ kind: 'map', id: mapId, data: spoiled }] }).expect(200);
  });

  afterAll(async () => {
    await app?.close();
    await db?.drop();
  });

  const api = (path: string) => `/api/projects/${projectId}${path}`;

  it('the stored ED energy at V = 0 is the free-fermion value −4J', () => {
    // Jordan–Wigner: hardcore bosons on a ring with N = 3 (odd) map to free fermions with periodic
    // boundary conditions; E = −2J Σ cos k over k = 0, ±2π/6 = −4J (Lieb, Schultz, Mattis, Ann. Phys. 16, 1961).
    expect(first.points['V=0']!.energy).toBeCloseTo(-4, 9);
  });

  it('request → e-mail → comments → spot-check → verdict; new points mark the approval outdated', async () => {
    const asked = await request(server).post(api(`/maps/${mapId}/reviews`)).set('authorization', bearer(editor)).send({ reviewerId: reviewer.user.id, message: 'Check the small-V end' }).expect(201);
    expect(asked.body).toMatchObject({ status: 'requested', reviewerId: reviewer.user.id, mailSent: true, outdated: false });
    const reviewId = asked.body.id as string;
    const mail = (await request(server).get('/api/admin/mail').query({ to: 'rua.venn@example.org' }).set('authorization', bearer(admin)).expect(200)).body as StoredMail[];
    expect(mail[0]!.subject).toBe('Eli Sand asks you to review a map in "Chain review"');
    expect(mail[0]!.text).toContain('Their note: Check the small-V end');
    expect(mail[0]!.links).toContain(`http://127.0.0.1:8080/projects/${projectId}/maps/${mapId}/reviews/${reviewId}`);

    await request(server).post(api(`/maps/${mapId}/reviews`)).set('authorization', bearer(editor)).send({ reviewerId: viewer.user.id }).expect(400);
    await request(server).post(api(`/reviews/${reviewId}/comments`)).set('authorization', bearer(reviewer)).send({ body: 'Provenance looks complete.' }).expect(201);
    await request(server).post(api(`/reviews/${reviewId}/comments`)).set('authorization', bearer(reviewer)).send({ body: 'This energy looks high.', pointKey: 'V=0' }).expect(201);
    const noPoint = await request(server).post(api(`/reviews/${reviewId}/comments`)).set('authorization', bearer(reviewer)).send({ body: 'x', pointKey: 'V=7' }).expect(400);
    expect(noPoint.body.details[0].path).toBe('pointKey');
    await request(server).post(api(`/reviews/${reviewId}/comments`)).set('authorization', bearer(viewer)).send({ body: 'me too' }).expect(403);

    // Spot-check all stored points in worker threads: the altered point is caught, the others reproduce.
    const keys = Object.keys(first.points);
    const check = await request(server).post(api(`/maps/${mapId}/spot-checks`)).set('authorization', bearer(reviewer)).send({ sample: keys.length, seed: 3, reviewId }).expect(201);
    expect(check.body.points.map((p: { key: string }) => p.key)).toEqual([...keys].sort());
    const bad = check.body.points.find((p: { key: string }) => p.key === 'V=0');
    if (bad.outcome === 'not-run') throw new Error(`spot-check point was not re-run: ${bad.problem}`);
    expect(bad.freshEnergy).toBeCloseTo(-4, 9);
    expect(bad.absEnergyDifference).toBeCloseTo(0.1, 9);
    expect(bad).toMatchObject({ outcome: 'differs', problem: expect.stringMatching(/relative \|ΔE\| = 2\.56e-2 > 1e-8/) }); // 0.1 / 3.9
    for (const p of check.body.points.filter((x: { key: string }) => x.key !== 'V=0')) expect(p).toMatchObject({ outcome: 'reproduced', relEnergyDifference: expect.any(Number) });
    for (const p of check.body.points.filter((x: { key: string }) => x.key !== 'V=0')) expect(p.relEnergyDifference).toBeLessThanOrEqual(1e-8);
    expect(check.body).toMatchObject({ method: 'ed', pass: false, failed: 0, differs: 1, reproduced: keys.length - 1, worstKey: 'V=0', tolerance: 1e-8, runtime: { node: process.version } });
    expect(check.body.timing.workers).toBe(2);
    const tooMany = await request(server).post(api(`/maps/${mapId}/spot-checks`)).set('authorization', bearer(reviewer)).send({ sample: 5 }).expect(400);
    expect(tooMany.body.message).toMatch(/at most 4 points per spot-check/);

    const verdictByEditor = await request(server).post(api(`/reviews/${reviewId}/verdict`)).set('authorization', bearer(editor)).send({ verdict: 'approved', note: 'self-approval' }).expect(403);
    expect(verdictByEditor.body.message).toMatch(/reviewer/);
    const approved = await request(server).post(api(`/reviews/${reviewId}/verdict`)).set('authorization', bearer(reviewer)).send({ verdict: 'approved', note: 'Reproduces apart from V=0; fine for a draft.' }).expect(200);
    const summary = (await request(server).get(api(`/maps/${mapId}`)).set('authorization', bearer(viewer)).expect(200)).body;
    expect(approved.body).toMatchObject({ status: 'approved', outdated: false, mapIdentity: first.id, pointsDigest: summary.pointsDigest, pointCount: keys.length });
    expect(approved.body.comments.map((c: { pointKey: string | null; authorName: string }) => [c.pointKey, c.authorName])).toEqual([[null, 'Rua Venn'], ['V=0', 'Rua Venn']]);
    expect(approved.body.spotChecks).toHaveLength(1);

    // More points of the same map arrive: the approval no longer covers the map.
    await request(server).post(api('/sync/push')).set('authorization', bearer(editor)).send({ batchId: randomUUID(), changes: [{ kind: 'map', id: mapId, data: await run(2) }] }).expect(200);
    const later = (await request(server).get(api(`/reviews/${reviewId}`)).set('authorization', bearer(viewer)).expect(200)).body;
    expect(later).toMatchObject({ status: 'approved', outdated: true });
  });

  it('bounds spot-checks per user: a second one while the first runs is a 429', async () => {
    const [a, b] = await Promise.all([
      request(server).post(api(`/maps/${mapId}/spot-checks`)).set('authorization', bearer(reviewer)).send({ sample: 2, seed: 9 }),
      request(server).post(api(`/maps/${mapId}/spot-checks`)).set('authorization', bearer(reviewer)).send({ sample: 2, seed: 10 }),
    ]);
    expect([a.status, b.status].sort()).toEqual([201, 429]);
    expect([a, b].find((r) => r.status === 429)!.body.message).toMatch(/already have 1 spot-check running/);
  });

  it('exports the map as a data package, a points CSV and a methods summary', async () => {
    const pkg = await request(server).get(api(`/maps/${mapId}/export/package.json`)).set('authorization', bearer(viewer)).expect(200);
    expect(pkg.headers['content-disposition']).toMatch(/attachment; filename="chain-v-cut-for-review-[0-9a-f]{8}\.json"/);
    const body = JSON.parse(pkg.text);
    const map = parseMap(body.map);
    expect(Object.keys(map.points)).toHaveLength(5);
    expect(map.provenance.sources).toHaveLength(2);
    const csv = await request(server).get(api(`/maps/${mapId}/export/points.csv`)).set('authorization', bearer(viewer)).expect(200);
    const lines = csv.text.trim().split('\r\n');
    expect(lines).toHaveLength(6);
    expect(lines[0]!.split(',').slice(0, 4)).toEqual(['key', 'V', 'energy', 'label']);
    const methods = await request(server).get(api(`/maps/${mapId}/export/methods.txt`)).set('authorization', bearer(viewer)).expect(200);
    expect(methods.headers['content-type']).toMatch(/^text\/plain/);
    expect(methods.text).toContain('chain lattice of 6 unit cells (6 sites), boundary conditions periodic; 3 particles');
    expect(methods.text).toContain('tolerance = 1e-10');
    expect(methods.text).toMatch(/finite clusters/);
    await request(server).get(api(`/maps/${mapId}/export/methods.txt`)).expect(401);
  });
});
