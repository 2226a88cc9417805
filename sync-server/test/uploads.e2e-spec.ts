import { QueryTypes } from 'sequelize';
import request from 'supertest';
import type { App } from 'supertest/types.js';
import { loadSyncConfig } from '../src/sync/sync-config.js';
import { bearer, register, type Session, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';

describe('uploads against the private MariaDB', () => {
  let db: TestDatabase;
  let app: TestApp['app'];
  let server: App;
  let owner: Session;
  let editor: Session;
  let other: Session;
  let projectId: string;

  beforeAll(async () => {
    db = await createTestDatabase();
    const sync = { ...loadSyncConfig({}), uploads: { maxBytes: 4096 } };
    ({ app, http: server } = await startTestApp(db.config, {}, sync));
    owner = await register(server, 'ida.wren@example.org', 'Ida Wren', 'meadow-cipher-7713');
    editor = await register(server, 'jo.pike@example.org', 'Jo Pike', 'anvil-sprout-6642');
    other = await register(server, 'kai.lund@example.org', 'Kai Lund', 'violet-hinge-5531');
    projectId = (await request(server).post('/api/projects').set('authorization', bearer(owner)).send({ name: 'Measured ladders' }).expect(201)).body.id;
    for (const s of [editor, other]) await db.sequelize.query("INSERT INTO memberships (project_id, user_id, role) VALUES (?, ?, 'editor')", { replacements: [projectId, s.user.id] });
  });

  afterAll(async () => {
    await app?.close();
    await db?.drop();
  });

  const count = async () => Number((await db.sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM uploads', { type: QueryTypes.SELECT }))[0]!.n);
  const csv = (who: Session, text: string, fields: Record<string, string> = {}, name = 'run.csv') => {
    const r = request(server).post(`/api/projects/${projectId}/uploads/measurements`).set('authorization', bearer(who));
    for (const [k, v] of Object.entries(fields)) r.field(k, v);
    return r.attach('file', Buffer.from(text), { filename: name, contentType: 'text/csv' });
  };

  it('stores a measurements CSV with uploader and time; lists, downloads (signed in only), deletes by uploader or owner', async () => {
    const text = 'V,mu,density,density_err,gap\n0.5,0,0.50,0.01,0.8\n1.0,0,0.52,,0.6\n';
    const up = await csv(editor, text, { parameters: 'V,mu' }).expect(201);
    expect(up.body).toMatchObject({ kind: 'measurements', fileName: 'run.csv', size: text.length, uploadedBy: editor.user.id });
    expect(up.body.summary.observables).toEqual([{ name: 'density', uncertainty: true }, { name: 'gap', uncertainty: false }]);
    expect(up.body.summary.rows[1]).toEqual({ line: 3, parameters: { V: 1, mu: 0 }, values: { density: 0.52, gap: 0.6 }, uncertainties: {} });
    const list = await request(server).get(`/api/projects/${projectId}/uploads`).set('authorization', bearer(other)).expect(200);
    expect(list.body.map((u: { id: string }) => u.id)).toEqual([up.body.id]);
    const file = await request(server).get(`/api/projects/${projectId}/uploads/${up.body.id}/content`).set('authorization', bearer(other)).expect(200);
    expect(file.text).toBe(text);
    expect(file.headers['content-disposition']).toBe('attachment; filename="run.csv"');
    await request(server).get(`/api/projects/${projectId}/uploads/${up.body.id}/content`).expect(401);
    await request(server).delete(`/api/projects/${projectId}/uploads/${up.body.id}`).set('authorization', bearer(other)).expect(403);
    await request(server).delete(`/api/projects/${projectId}/uploads/${up.body.id}`).set('authorization', bearer(owner)).expect(204);
    expect(await count()).toBe(0);
  });

  it('refuses broken CSV naming the line and column, and stores nothing', async () => {
    const cases: [string, string, RegExp][] = [
      ['V,density\n0.5,0.5\n1.0,abc\n', 'V', /line 3, column 2 \(density\): "abc" is not a number/],
      ['V,density\n0.5,0.5\n1.0\n', 'V', /line 3: the row has 1 fields but the header has 2/],
      ['V,density\n0.5,"0.5\n', 'V', /line \d+: .*quote/i],
      ['V,density,gap_err\n0.5,0.5,0.1\n', 'V', /line 1, column 3: "gap_err" is an uncertainty column but there is no observable column "gap"/],
      ['V,density\n0.5,0.5\n', 'V,mu', /the header has no column for the model parameter "mu"/],
      ['V,density,density_err\n0.5,0.5,-1\n', 'V', /line 2, column 3 \(density_err\): an uncertainty must be ≥ 0/],
    ];
    for (const [text, parameters, message] of cases) {
      const res = await csv(editor, text, { parameters }).expect(400);
      expect(res.body.message).toMatch(/^The CSV file was refused; nothing was stored: /);
      expect(res.body.message).toMatch(message);
    }
    const big = await csv(editor, `V,density\n${'0.5,0.5\n'.repeat(700)}`, { parameters: 'V' }).expect(413);
    expect(big.body.message).toBe('The file is larger than 4096 bytes, the upload limit (PW_UPLOAD_MAX_BYTES); nothing was stored');
    await csv(editor, 'V,density\n0.5,0.5\n', { parameters: 'V' }, 'run.exe').expect(415);
    expect(await count()).toBe(0);
  });

  it('accepts a custom lattice checked by physics-core and refuses a broken one with its JSON path', async () => {
    // A two-site unit cell on a line with a named bond: effectively a chain of 2 × 3 sites.
    const lattice = { kind: 'custom', size: [3], boundary: ['periodic'], custom: { sites: [{ x: 0, y: 0 }, { x: 0.5, y: 0 }], translations: [[1, 0]], bonds: [{ class: 'inner', from: 0, to: 1, offset: [0] }] } };
    const send = (body: unknown) =>
      request(server).post(`/api/projects/${projectId}/uploads/lattices`).set('authorization', bearer(editor)).attach('file', Buffer.from(JSON.stringify(body)), { filename: 'cell.json', contentType: 'application/json' });
    const ok = await send(lattice).expect(201);
    expect(ok.body.summary.summary).toMatchObject({ kind: 'custom', sitesPerCell: 2, sites: 6 });
    const bad = await send({ ...lattice, custom: { ...lattice.custom, translations: [] } }).expect(400);
    expect(bad.body.message).toMatch(/^The lattice file was refused; nothing was stored: \$\.custom\.translations/);
    expect(await count()).toBe(1);
  });
});
