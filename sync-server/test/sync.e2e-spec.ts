import { createHash, randomUUID } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import {
  canonicalJson,
  createMap,
  InProcessExecutor,
  type MapPoint,
  mergeMaps,
  type PhaseMap,
  planSweep,
  pointSeed,
  runSweep,
  solvePoint,
  type SweepSpec,
} from '@phasewright/physics-core';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import type { App } from 'supertest/types.js';
import { loadSyncConfig, type SyncConfig } from '../src/sync/sync-config.js';
import { bearer, register, type Session, startTestApp, type TestApp } from './support/accounts.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';
import { CHAIN_6 } from './support/chain-model.js';

const edSweep: SweepSpec = { spec: 'phasewright.sweep/1', name: 'chain, V cut', model: CHAIN_6, axes: [{ parameter: 'V', kind: 'linear', from: 0, to: 4, points: 9 }], method: 'ed', seed: 7 };
/** A 60 × 60 grid for bulk tests; its points are fixtures (closed-form numbers, not solver output). */
const gridSweep: SweepSpec = {
  spec: 'phasewright.sweep/1',
  name: 'fixture grid',
  model: CHAIN_6,
  axes: [
    { parameter: 'V', kind: 'linear', from: 0, to: 4, points: 60 },
    { parameter: 'J', kind: 'linear', from: 0.5, to: 1.5, points: 60 },
  ],
  method: 'meanfield',
  seed: 3,
};
const runtimeOf = (who: string) => ({ kind: 'node' as const, version: `test-${who}`, cores: 1 });

/** Real ED on the chain (physics-core's solver in this thread), all points or one chunk. */
async function edMap(author: string, chunk?: { index: number; count: number }): Promise<PhaseMap> {
  const out = await runSweep(edSweep, { executor: new InProcessExecutor(solvePoint), runtime: runtimeOf(author), author, ...(chunk ? { chunk } : {}) });
  return out.map;
}

/** TEST FIXTURE: a map of `gridSweep` whose points carry made-up energies (a closed form), labelled as such. */
function fixtureMap(author: string, from: number, to: number, energyShift = 0): PhaseMap {
  const map = createMap(gridSweep, runtimeOf(author), author);
  for (const item of planSweep(gridSweep).items.slice(from, to)) {
    const e = -3 + 0.25 * item.parameters.V - item.parameters.J + energyShift;
    const point: MapPoint = {
      parameters: item.parameters,
      level: 0,
      energy: e,
      observables: { energyPerSite: e / 6, densities: [0.5, 0.5, 0.5, 0.5, 0.5, 0.5] },
      convergence: { converged: true, iterations: 12, residual: 1e-9 },
      wallMs: 1,
      seed: pointSeed(3, item.key),
      computed: { at: '2025-01-01T00:00:00.000Z', runtime: runtimeOf(author), author },
      label: { id: 'fixture', confidence: 0, evidence: { fixture: true } },
    };
    map.points[item.key] = point;
  }
  map.provenance.finishedAt = '2025-01-01T00:00:01.000Z';
  return map;
}

const LIMITS: SyncConfig = { ...loadSyncConfig({}), maxPointsPerBatch: 3000, maxBatchBytes: 4 * 1024 * 1024 };

describe('map sync against the private MariaDB', () => {
  let db: TestDatabase;
  let app: TestApp['app'];
  let server: App;
  let owner: Session;
  let editor: Session;
  let viewer: Session;
  let projectId: string;

  beforeAll(async () => {
    db = await createTestDatabase();
    ({ app, http: server } = await startTestApp(db.config, {}, LIMITS));
    owner = await register(server, 'ada.crest@example.org', 'Ada Crest', 'lantern-quiet-4471');
    editor = await register(server, 'bo.rill@example.org', 'Bo Rill', 'pebble-orbit-9925');
    viewer = await register(server, 'cy.marsh@example.org', 'Cy Marsh', 'fennel-stair-3380');
    projectId = (await request(server).post('/api/projects').set('authorization', bearer(owner)).send({ name: 'Chain survey' }).expect(201)).body.id;
    for (const [s, role] of [[editor, 'editor'], [viewer, 'viewer']] as const) {
      await db.sequelize.query('INSERT INTO memberships (project_id, user_id, role) VALUES (?, ?, ?)', { replacements: [projectId, s.user.id, role] });
    }
  });

  afterAll(async () => {
    await app?.close();
    await db?.drop();
  });

  const rows = async <T>(sql: string, replacements: unknown[] = []) => (await db.sequelize.query(sql, { type: QueryTypes.SELECT, replacements })) as T[];
  const push = (who: Session, body: object) => request(server).post(`/api/projects/${projectId}/sync/push`).set('authorization', bearer(who)).send(body);
  const mapChange = (id: string, map: PhaseMap | unknown) => ({ kind: 'map', id, data: map });

  /** Row counts and checksums of every sync table: equal snapshots mean an unchanged database. */
  async function snapshot(): Promise<string> {
    const tables = ['project_sync_state', 'sync_batches', 'sync_records', 'maps', 'map_point_blocks'];
    const counts = await Promise.all(tables.map(async (t) => (await rows<{ n: number }>(`SELECT COUNT(*) AS n FROM ${t}`))[0]!.n));
    const sums = await rows<{ Table: string; Checksum: number }>(`CHECKSUM TABLE ${tables.join(', ')}`);
    return JSON.stringify({ counts: counts.map(Number), sums: sums.map((s) => [s.Table.split('.').pop(), String(s.Checksum)]) });
  }

  /** Point keys stored for a map (block rows hold [key, hash] pairs), in block order. */
  async function storedKeys(mapId: string): Promise<string[]> {
    const blocks = await rows<{ k: string }>('SELECT b.point_keys AS k FROM map_point_blocks b JOIN maps m ON m.pk = b.map_pk WHERE m.id = ? ORDER BY b.block_no', [mapId]);
    return blocks.flatMap((b) => (JSON.parse(b.k) as [string, string][]).map(([key]) => key));
  }

  /** Every change after 0, in pages of `limit`, folded into maps (by map id) and records. */
  async function pullAll(who: Session, limit: number): Promise<{ maps: Map<string, PhaseMap>; records: Map<string, { revision: number; data: unknown }>; pages: number }> {
    const maps = new Map<string, PhaseMap>();
    const records = new Map<string, { revision: number; data: unknown }>();
    let after = 0;
    let pages = 0;
    for (;;) {
      const res = await request(server).get(`/api/projects/${projectId}/sync/pull`).query({ after, limit }).set('authorization', bearer(who)).expect(200);
      pages++;
      for (const c of res.body.changes as { kind: string; id: string; revision?: number; data: Record<string, unknown> }[]) {
        if (c.kind === 'map') maps.set(c.id, { ...(c.data as unknown as PhaseMap), points: { ...(maps.get(c.id)?.points ?? {}) } });
        else if (c.kind === 'points') Object.assign((maps.get(c.id) as PhaseMap).points, c.data.points);
        else records.set(c.id, { revision: c.revision as number, data: c.data });
      }
      expect(res.body.cursor).toBeGreaterThanOrEqual(after);
      after = res.body.cursor;
      if (!res.body.hasMore) break;
    }
    return { maps, records, pages };
  }

  const sortedPoints = (m: PhaseMap) => Object.fromEntries(Object.keys(m.points).sort().map((k) => [k, m.points[k]]));

  it('two clients push overlapping ED maps at once: the server holds the physics-core merge of both, once', async () => {
    const a = await edMap('client-a');
    const b = await edMap('client-b', { index: 2, count: 2 });
    // Client B's solver is made to disagree at one point (a deliberate test alteration): the merge must flag it disputed.
    const altered = Object.keys(b.points)[0]!;
    b.points[altered] = { ...b.points[altered]!, energy: b.points[altered]!.energy + 1e-3 };
    const [ra, rb] = await Promise.all([
      push(editor, { batchId: randomUUID(), changes: [mapChange(randomUUID(), a)] }),
      push(owner, { batchId: randomUUID(), changes: [mapChange(randomUUID(), b)] }),
    ]);
    expect([ra.status, rb.status]).toEqual([200, 200]);
    const expected = mergeMaps([a, b]);
    expect(expected.points[altered]!.disputed).toHaveLength(1);

    // One map row (same identity under two client ids), each point key stored once.
    const stored = await rows<{ id: string; pointCount: number }>('SELECT id, point_count AS pointCount FROM maps WHERE project_id = ?', [projectId]);
    expect(stored).toHaveLength(1);
    const keys = await storedKeys(stored[0]!.id);
    expect(new Set(keys).size).toBe(keys.length);
    expect(keys.sort()).toEqual(Object.keys(expected.points).sort());
    expect(Number(stored[0]!.pointCount)).toBe(Object.keys(expected.points).length);
    const second = [ra.body, rb.body].find((r) => r.results[0].status !== 'created');
    expect(second.results[0].storedAs).toBe(stored[0]!.id);

    // Pages of 4: the 9 points are one block (a page holds whole blocks), the map's metadata another page.
    const pulled = await pullAll(viewer, 4);
    expect(pulled.pages).toBeGreaterThanOrEqual(2);
    const map = pulled.maps.get(stored[0]!.id)!;
    expect(canonicalJson(sortedPoints(map))).toBe(canonicalJson(expected.points));
    expect(canonicalJson(map.provenance)).toBe(canonicalJson(expected.provenance));
    expect(map.id).toBe(a.id);
  });

  it('replaying one push ten times leaves the database as the first push left it', async () => {
    const body = { batchId: randomUUID(), changes: [mapChange(randomUUID(), fixtureMap('replayer', 0, 400)), { kind: 'note', id: randomUUID(), data: { text: 'fixture grid pushed' } }] };
    const first = await push(editor, body).expect(200);
    expect(first.headers['idempotent-replay']).toBeUndefined();
    const after = await snapshot();
    for (let i = 0; i < 10; i++) {
      const again = await push(editor, body).expect(200);
      expect(again.body).toEqual(first.body);
      expect(again.headers['idempotent-replay']).toBe('true');
    }
    expect(await snapshot()).toBe(after);
    expect(first.body.results[0].points).toMatchObject({ received: 400, added: 400 });
  });

  it('a push whose database connection is killed mid-way leaves nothing behind; the retry succeeds', async () => {
    // A note the test holds locked, so the push stops after writing its map points and before the note.
    const noteId = randomUUID();
    await push(editor, { batchId: randomUUID(), changes: [{ kind: 'note', id: noteId, data: { text: 'v1' } }] }).expect(200);
    const before = await snapshot();
    const mapId = randomUUID();
    const body = { batchId: randomUUID(), changes: [mapChange(mapId, fixtureMap('interrupted', 400, 2400)), { kind: 'note', id: noteId, baseRevision: 1, data: { text: 'v2' } }] };
    const blocker = await db.sequelize.transaction();
    await db.sequelize.query('SELECT id FROM sync_records WHERE id = ? FOR UPDATE', { type: QueryTypes.SELECT, replacements: [noteId], transaction: blocker });
    const pending = push(editor, body).then((r) => r);
    let victim: number | undefined;
    for (let i = 0; i < 400 && victim === undefined; i++) {
      const waiting = await rows<{ id: number }>("SELECT id FROM information_schema.processlist WHERE db = ? AND info LIKE 'SELECT kind, revision%'", [db.config.name]);
      victim = waiting[0]?.id;
      if (victim === undefined) await new Promise((r) => setTimeout(r, 25));
    }
    expect(victim).toBeDefined();
    // The push has written its 2000 points (uncommitted) by now.
    await db.sequelize.query(`KILL CONNECTION ${Number(victim)}`);
    await blocker.rollback();
    const failed = await pending;
    // A lost database connection is a 503 that says to retry (not a generic 500).
    expect(failed.status).toBe(503);
    expect(failed.body).toMatchObject({ error: 'Service Unavailable', details: { reason: 'database-unavailable' } });
    expect(failed.body.message).toMatch(/^Database unavailable .*retry/);
    expect(failed.headers['retry-after']).toBe('5');
    expect(await snapshot()).toBe(before);
    expect(await rows('SELECT id FROM maps WHERE id = ?', [mapId])).toEqual([]);

    const retry = await push(editor, body).expect(200);
    // The fixture grid is already stored (same identity, pushed by the replay test): the points merge into it.
    expect(retry.body.results.map((r: { status: string }) => r.status)).toEqual(['merged', 'updated']);
    expect(retry.body.results[0].points).toMatchObject({ received: 2000, added: 2000 });
    expect(await storedKeys(retry.body.results[0].storedAs)).toHaveLength(2400);
  });

  it('a push aborted by the client while sending stores nothing; the retry succeeds', async () => {
    const before = await snapshot();
    const body = JSON.stringify({ batchId: randomUUID(), changes: [mapChange(randomUUID(), fixtureMap('aborter', 2400, 2600))] });
    const address = await new Promise<AddressInfo>((resolve) => {
      const s = app.getHttpServer() as http.Server;
      if (s.listening) resolve(s.address() as AddressInfo);
      else s.listen(0, '127.0.0.1', () => resolve(s.address() as AddressInfo));
    });
    await new Promise<void>((resolve) => {
      const req = http.request({ host: '127.0.0.1', port: address.port, method: 'POST', path: `/api/projects/${projectId}/sync/push`, headers: { authorization: bearer(editor), 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } });
      req.on('error', () => resolve());
      req.write(body.slice(0, Math.floor(body.length / 2)));
      setTimeout(() => {
        req.destroy();
        resolve();
      }, 100);
    });
    await new Promise((r) => setTimeout(r, 200));
    expect(await snapshot()).toBe(before);
    const retry = await push(editor, JSON.parse(body)).expect(200);
    expect(retry.body.results[0].points.added).toBe(200);
  });

  it('pulls the 2600-point grid map in pages of whole blocks: every point once, equal to the physics-core merge of what was pushed', async () => {
    const pulled = await pullAll(viewer, 300);
    expect(pulled.pages).toBeGreaterThanOrEqual(9);
    const [grid] = await rows<{ id: string; digest: string }>('SELECT id, points_digest AS digest FROM maps WHERE project_id = ? AND name = ?', [projectId, 'fixture grid']);
    const map = pulled.maps.get(grid!.id)!;
    // The three pushes above (replay, interrupted retry, aborted retry) cover disjoint slices of the grid.
    const expected = mergeMaps([fixtureMap('replayer', 0, 400), fixtureMap('interrupted', 400, 2400), fixtureMap('aborter', 2400, 2600)]);
    expect(Object.keys(map.points)).toHaveLength(2600);
    expect(canonicalJson(sortedPoints(map))).toBe(canonicalJson(expected.points));
    // The point-set digest, recomputed here from its definition: SHA-256 of sorted "key<TAB>sha256(canonical point)" lines.
    const sha = (t: string) => createHash('sha256').update(t, 'utf8').digest('hex');
    const lines = Object.keys(expected.points).sort().map((k) => `${k}\t${sha(canonicalJson(expected.points[k]))}\n`);
    expect(grid!.digest).toBe(sha(lines.join('')));
  });

  it('a stale annotation edit is a 409 carrying both versions; nothing is overwritten', async () => {
    const id = randomUUID();
    const mapId = randomUUID();
    const created = await push(editor, { batchId: randomUUID(), changes: [{ kind: 'annotation', id, data: { mapId, labelId: 'superfluid', name: 'SF', color: '#1d4ed8' } }] }).expect(200);
    expect(created.body.results[0]).toMatchObject({ status: 'created', revision: 1 });
    await push(owner, { batchId: randomUUID(), changes: [{ kind: 'annotation', id, baseRevision: 1, data: { mapId, labelId: 'superfluid', name: 'Superfluid', color: '#1d4ed8' } }] }).expect(200);
    const before = await snapshot();
    const stale = await push(editor, { batchId: randomUUID(), changes: [{ kind: 'note', id: randomUUID(), data: { text: 'goes with the rename' } }, { kind: 'annotation', id, baseRevision: 1, data: { mapId, labelId: 'superfluid', name: 'SF phase', color: '#ff0000' } }] }).expect(409);
    expect(stale.body.details.conflicts).toEqual([
      expect.objectContaining({ kind: 'annotation', id, baseRevision: 1, yours: { mapId, labelId: 'superfluid', name: 'SF phase', color: '#ff0000' }, theirs: expect.objectContaining({ revision: 2, data: { mapId, labelId: 'superfluid', name: 'Superfluid', color: '#1d4ed8' }, updatedBy: owner.user.id }) }),
    ]);
    expect(stale.body.message).toMatch(/stale revision; nothing in this batch was stored/);
    expect(await snapshot()).toBe(before);
    const pulled = await pullAll(viewer, 1000);
    expect(pulled.records.get(id)).toEqual({ revision: 2, data: { mapId, labelId: 'superfluid', name: 'Superfluid', color: '#1d4ed8' } });
  });

  it('refuses malformed maps with the JSON path and reason, storing nothing (even beside valid changes)', async () => {
    const good = fixtureMap('bad-input', 2600, 2610);
    const cases: [string, (m: PhaseMap) => unknown, RegExp][] = [
      ['wrong hash', (m) => ({ ...m, id: 'f'.repeat(64) }), /changes\[1\]\.data\.id: does not match the identity/],
      ['unknown format version', (m) => ({ ...m, spec: 'phasewright.map/7' }), /changes\[1\]\.data\.spec: this map was written by a newer Phasewright \(map\/7\)/],
      ['NaN energy', (m) => ({ ...m, points: { ...m.points, [Object.keys(m.points)[0]!]: { ...Object.values(m.points)[0]!, energy: NaN } } }), /\.energy: must be a finite number/],
      ['point outside the sweep', (m) => ({ ...m, points: { ...m.points, 'J=1,V=9': { ...Object.values(m.points)[0]!, parameters: { J: 1, V: 9 } } } }), /V = 9 lies outside the sweep \(axis 0: 0 … 4\)/],
      ['key that is not its parameters', (m) => ({ ...m, points: { 'J=1,V=2': Object.values(m.points)[0]! } }), /the key does not match the point's parameters/],
    ];
    const before = await snapshot();
    for (const [what, spoil, message] of cases) {
      const res = await push(editor, { batchId: randomUUID(), changes: [{ kind: 'note', id: randomUUID(), data: { text: what } }, mapChange(randomUUID(), spoil(good))] });
      expect({ what, status: res.status }).toEqual({ what, status: 400 });
      expect(res.body.message).toMatch(/^The push was refused; nothing was stored: /);
      expect(res.body.message).toMatch(message);
      expect(res.body.details[0].path).toMatch(/^changes\[1\]\.data/);
    }
    const badModel = await push(editor, { batchId: randomUUID(), changes: [{ kind: 'model', id: randomUUID(), data: { spec: { ...CHAIN_6, terms: [{ kind: 'hop', neighbors: 1, amplitude: '-J*' }] } } }] }).expect(400);
    expect(badModel.body.details[0].path).toBe('changes[0].data.spec.terms[0].amplitude');
    expect(await snapshot()).toBe(before);
  });

  it('bounds batches: too many points or bytes is a 413 that says the limit; nothing stored', async () => {
    const before = await snapshot();
    const big = await push(editor, { batchId: randomUUID(), changes: [mapChange(randomUUID(), fixtureMap('big', 0, 3001))] }).expect(413);
    expect(big.body.message).toBe('This batch carries 3001 points; the limit is 3000 points per batch (PW_SYNC_MAX_POINTS_PER_BATCH): split the points over several batches');
    const heavy = fixtureMap('heavy', 0, 10);
    heavy.provenance.warnings = [`padding ${'x'.repeat(5 * 1024 * 1024)}`];
    const bytes = await push(editor, { batchId: randomUUID(), changes: [mapChange(randomUUID(), heavy)] }).expect(413);
    expect(bytes.body.message).toMatch(/^This push is \d+ bytes; the limit is 4194304 bytes per batch/);
    expect(await snapshot()).toBe(before);
  });

  it('refuses pushes to an archived project', async () => {
    await request(server).post(`/api/projects/${projectId}/archive`).set('authorization', bearer(owner)).expect(200);
    const res = await push(editor, { batchId: randomUUID(), changes: [{ kind: 'note', id: randomUUID(), data: { text: 'late' } }] }).expect(409);
    expect(res.body.details).toEqual({ reason: 'archived' });
    await request(server).post(`/api/projects/${projectId}/unarchive`).set('authorization', bearer(owner)).expect(200);
  });

  it('lets only editors and owners push; viewers pull', async () => {
    const res = await push(viewer, { batchId: randomUUID(), changes: [{ kind: 'note', id: randomUUID(), data: { text: 'hi' } }] }).expect(403);
    expect(res.body.message).toMatch(/viewer/);
    await request(server).get(`/api/projects/${projectId}/sync/pull`).set('authorization', bearer(viewer)).expect(200);
    const bad = await request(server).get(`/api/projects/${projectId}/sync/pull`).query({ after: -1 }).set('authorization', bearer(viewer)).expect(400);
    expect(bad.body.details[0].path).toBe('after');
  });
  it('a map pushed empty (created before it ran) and then with its points keeps only the run that computed them', async () => {
    const cut: SweepSpec = { ...edSweep, name: 'chain, V cut (created, then run)', seed: 11 };
    const run = await runSweep(cut, { executor: new InProcessExecutor(solvePoint), runtime: runtimeOf('runner'), author: 'runner' });
    const placeholder = createMap(cut, runtimeOf('runner'), 'runner');
    const id = randomUUID();
    await push(editor, { batchId: randomUUID(), changes: [mapChange(id, placeholder)] }).expect(200);
    await push(editor, { batchId: randomUUID(), changes: [mapChange(id, run.map)] }).expect(200);
    const [row] = await rows<{ provenance: string; pointCount: number }>('SELECT provenance, point_count AS pointCount FROM maps WHERE id = ?', [id]);
    expect(Number(row!.pointCount)).toBe(9);
    const provenance = JSON.parse(row!.provenance) as PhaseMap['provenance'];
    expect(provenance.sources).toEqual(run.map.provenance.sources);
    expect(provenance.sources[0]!.finishedAt).toBeDefined();
    // A later push of points to a map that has some still merges the header whole: two runs, both kept.
    const again = await runSweep(cut, { executor: new InProcessExecutor(solvePoint), runtime: runtimeOf('second'), author: 'second' });
    await push(editor, { batchId: randomUUID(), changes: [mapChange(id, again.map)] }).expect(200);
    const [after] = await rows<{ provenance: string }>('SELECT provenance FROM maps WHERE id = ?', [id]);
    expect((JSON.parse(after!.provenance) as PhaseMap['provenance']).sources.map((x) => x.author)).toEqual(['runner', 'second']);
  });
});
