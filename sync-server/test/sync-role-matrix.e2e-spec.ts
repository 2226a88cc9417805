import { randomUUID } from 'node:crypto';
import { createMap, type MapPoint, type SweepSpec } from '@phasewright/physics-core';
import request from 'supertest';
import { bearer, register, type Session, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

/**
 * Every route of map sync, maps, reviews, spot-checks, uploads and exports × every kind of caller.
 * The route list is checked against the OpenAPI document (tags below), so a new route without a
 * row fails here. One project serves all rows; rows run in order, callers of a row side by side.
 */
const ROLES = ['anonymous', 'outsider', 'viewer', 'reviewer', 'editor', 'owner', 'admin'] as const;
type Role = (typeof ROLES)[number];
type Expect = Record<Role, number>;
const TAGS = ['sync', 'maps', 'reviews', 'spot-checks', 'uploads', 'exports'];
const ANY: Role[] = ['viewer', 'reviewer', 'editor', 'owner'];
const members = (ok: number, allowed: Role[], denied = 403): Expect => ({
  anonymous: 401,
  outsider: 404,
  admin: 404,
  viewer: allowed.includes('viewer') ? ok : denied,
  reviewer: allowed.includes('reviewer') ? ok : denied,
  editor: allowed.includes('editor') ? ok : denied,
  owner: allowed.includes('owner') ? ok : denied,
});

const sweep: SweepSpec = {
  spec: 'phasewright.sweep/1',
  name: 'matrix map',
  model: { spec: 'phasewright.model/1', lattice: { kind: 'chain', size: [4], boundary: ['periodic'] }, particles: { kind: 'hardcore', filling: 0.5 }, parameters: { J: 1, V: 1 }, terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J' }] },
  axes: [{ parameter: 'V', kind: 'list', values: [0, 1] }],
  method: 'ed',
};

interface Row {
  method: 'get' | 'post' | 'delete';
  route: string;
  expect: Expect;
  call(role: Role): { path: string; body?: object; file?: { name: string; type: string; text: string; fields?: Record<string, string> } };
}

describe('role matrix of map sync, reviews, spot-checks, uploads and exports', () => {
  let db: TestDatabase;
  let t: TestApp;
  const sessions = {} as Record<Exclude<Role, 'anonymous'>, Session>;
  let projectId: string;
  const mapId = randomUUID();
  let reviewId: string;
  let uploadId: string;

  beforeAll(async () => {
    db = await createTestDatabase();
    t = await startTestApp(db.config);
    for (const role of ROLES) if (role !== 'anonymous') sessions[role] = await register(t.http, `m-${role}@example.org`, `Matrix ${role}`, 'matrix-password-8080');
    await db.sequelize.query("UPDATE users SET site_role = 'admin' WHERE id = ?", { replacements: [sessions.admin.user.id] });
    await request(t.http).post('/api/projects').set('authorization', bearer(sessions.outsider)).send({ name: 'Elsewhere' }).expect(201);
    projectId = (await request(t.http).post('/api/projects').set('authorization', bearer(sessions.owner)).send({ name: 'Matrix' }).expect(201)).body.id;
    for (const role of ['viewer', 'reviewer', 'editor'] as const) {
      await db.sequelize.query('INSERT INTO memberships (project_id, user_id, role) VALUES (?, ?, ?)', { replacements: [projectId, sessions[role].user.id, role] });
    }
    // TEST FIXTURE: a two-point map with made-up energies.
    const map = createMap(sweep, { kind: 'node', version: 'matrix', cores: 1 });
    for (const V of [0, 1]) {
      const point: MapPoint = { parameters: { V }, level: 0, energy: -2 + V, observables: {}, convergence: { converged: true, iterations: 1, residual: 0 }, wallMs: 0, seed: 0, computed: { at: '2025-01-01T00:00:00Z', runtime: { kind: 'node', version: 'matrix', cores: 1 } } };
      map.points[`V=${V}`] = point;
    }
    await request(t.http).post(`/api/projects/${projectId}/sync/push`).set('authorization', bearer(sessions.owner)).send({ batchId: randomUUID(), changes: [{ kind: 'map', id: mapId, data: map }] }).expect(200);
    reviewId = (await request(t.http).post(`/api/projects/${projectId}/maps/${mapId}/reviews`).set('authorization', bearer(sessions.owner)).send({ reviewerId: sessions.reviewer.user.id }).expect(201)).body.id;
    uploadId = (
      await request(t.http).post(`/api/projects/${projectId}/uploads/measurements`).set('authorization', bearer(sessions.owner)).field('parameters', 'V').attach('file', Buffer.from('V,density\n0,0.5\n'), { filename: 'm.csv', contentType: 'text/csv' }).expect(201)
    ).body.id;
  });

  afterAll(async () => {
    await t?.close();
    await db?.drop();
  });

  const p = (path: string) => `/api/projects/${projectId}${path}`;
  const lattice = JSON.stringify({ kind: 'custom', size: [2], boundary: ['open'], custom: { sites: [{ x: 0, y: 0 }], translations: [[1, 0]] } });
  const rows: Row[] = [
    { method: 'post', route: '/api/projects/{projectId}/sync/push', expect: members(200, ['editor', 'owner']), call: () => ({ path: p('/sync/push'), body: { batchId: randomUUID(), changes: [{ kind: 'note', id: randomUUID(), data: { text: 'n' } }] } }) },
    { method: 'get', route: '/api/projects/{projectId}/sync/pull', expect: members(200, ANY), call: () => ({ path: p('/sync/pull') }) },
    { method: 'get', route: '/api/projects/{projectId}/maps', expect: members(200, ANY), call: () => ({ path: p('/maps') }) },
    { method: 'get', route: '/api/projects/{projectId}/maps/{mapId}', expect: members(200, ANY), call: () => ({ path: p(`/maps/${mapId}`) }) },
    { method: 'post', route: '/api/projects/{projectId}/maps/{mapId}/reviews', expect: members(201, ['editor', 'owner']), call: () => ({ path: p(`/maps/${mapId}/reviews`), body: { reviewerId: sessions.reviewer.user.id } }) },
    { method: 'get', route: '/api/projects/{projectId}/maps/{mapId}/reviews', expect: members(200, ANY), call: () => ({ path: p(`/maps/${mapId}/reviews`) }) },
    { method: 'get', route: '/api/projects/{projectId}/reviews/{reviewId}', expect: members(200, ANY), call: () => ({ path: p(`/reviews/${reviewId}`) }) },
    { method: 'get', route: '/api/projects/{projectId}/reviews', expect: members(200, ANY), call: () => ({ path: p('/reviews') }) },
    { method: 'post', route: '/api/projects/{projectId}/reviews/{reviewId}/comments', expect: members(201, ['reviewer', 'editor', 'owner']), call: () => ({ path: p(`/reviews/${reviewId}/comments`), body: { body: 'c' } }) },
    // The owner passes the role check but is not the requested reviewer: 403 from the service.
    { method: 'post', route: '/api/projects/{projectId}/reviews/{reviewId}/verdict', expect: members(200, ['reviewer']), call: () => ({ path: p(`/reviews/${reviewId}/verdict`), body: { verdict: 'approved', note: 'ok' } }) },
    // Allowed callers reach the sample bound (400) without starting workers.
    { method: 'post', route: '/api/projects/{projectId}/maps/{mapId}/spot-checks', expect: members(400, ['reviewer', 'editor', 'owner']), call: () => ({ path: p(`/maps/${mapId}/spot-checks`), body: { sample: 100000 } }) },
    { method: 'get', route: '/api/projects/{projectId}/maps/{mapId}/spot-checks', expect: members(200, ANY), call: () => ({ path: p(`/maps/${mapId}/spot-checks`) }) },
    { method: 'get', route: '/api/projects/{projectId}/maps/{mapId}/export/package.json', expect: members(200, ANY), call: () => ({ path: p(`/maps/${mapId}/export/package.json`) }) },
    { method: 'get', route: '/api/projects/{projectId}/maps/{mapId}/export/points.csv', expect: members(200, ANY), call: () => ({ path: p(`/maps/${mapId}/export/points.csv`) }) },
    { method: 'get', route: '/api/projects/{projectId}/maps/{mapId}/export/methods.txt', expect: members(200, ANY), call: () => ({ path: p(`/maps/${mapId}/export/methods.txt`) }) },
    { method: 'post', route: '/api/projects/{projectId}/uploads/measurements', expect: members(201, ['editor', 'owner']), call: () => ({ path: p('/uploads/measurements'), file: { name: 'x.csv', type: 'text/csv', text: 'V,density\n1,0.4\n', fields: { parameters: 'V' } } }) },
    { method: 'post', route: '/api/projects/{projectId}/uploads/lattices', expect: members(201, ['editor', 'owner']), call: () => ({ path: p('/uploads/lattices'), file: { name: 'l.json', type: 'application/json', text: lattice } }) },
    { method: 'get', route: '/api/projects/{projectId}/uploads', expect: members(200, ANY), call: () => ({ path: p('/uploads') }) },
    { method: 'get', route: '/api/projects/{projectId}/uploads/{uploadId}', expect: members(200, ANY), call: () => ({ path: p(`/uploads/${uploadId}`) }) },
    { method: 'get', route: '/api/projects/{projectId}/uploads/{uploadId}/content', expect: members(200, ANY), call: () => ({ path: p(`/uploads/${uploadId}/content`) }) },
    // Uploaded by the owner: only the owner may delete it (the uploader rule is tested in uploads.e2e-spec.ts); run last.
    { method: 'delete', route: '/api/projects/{projectId}/uploads/{uploadId}', expect: members(204, ['owner']), call: () => ({ path: p(`/uploads/${uploadId}`) }) },
  ];

  it('gives every caller the expected status on every route', async () => {
    const doc = (await request(t.http).get('/api/docs-json').expect(200)).body as { paths: Record<string, Record<string, { tags?: string[] }>> };
    const ours = Object.entries(doc.paths).flatMap(([path, ops]) => Object.entries(ops).filter(([, op]) => (op.tags ?? []).some((tag) => TAGS.includes(tag))).map(([m]) => `${m.toUpperCase()} ${path}`));
    expect(rows.map((r) => `${r.method.toUpperCase()} ${r.route}`).sort()).toEqual(ours.sort());
    const mismatches: string[] = [];
    for (const row of rows) {
      const got: Record<string, number> = {};
      const runOne = async (role: Role) => {
        const c = row.call(role);
        let req = request(t.http)[row.method](c.path);
        if (role !== 'anonymous') req = req.set('authorization', bearer(sessions[role]));
        if (c.file) {
          for (const [k, v] of Object.entries(c.file.fields ?? {})) req = req.field(k, v);
          req = req.attach('file', Buffer.from(c.file.text), { filename: c.file.name, contentType: c.file.type });
        } else if (c.body) req = req.send(c.body);
        got[role] = (await req).status;
      };
      if (row.method === 'delete') {
        // The others first, so that the owner's 204 does not turn their 403 into 404.
        await Promise.all(ROLES.filter((r) => r !== 'owner').map(runOne));
        await runOne('owner');
      } else {
        await Promise.all(ROLES.map(runOne));
      }
      for (const role of ROLES) if (got[role] !== row.expect[role]) mismatches.push(`${row.method.toUpperCase()} ${row.route} as ${role}: got ${got[role]}, expected ${row.expect[role]}`);
    }
    expect(mismatches).toEqual([]);
  });
});
