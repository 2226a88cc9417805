import { createHash, randomUUID } from 'node:crypto';
import { canonicalJson, type MapPoint, planSweep, pointSeed, type SweepSpec } from '@phasewright/physics-core';
import { QueryTypes } from 'sequelize';
import { createMigrator } from '../../db/migrate.mjs';
import { decodeBlock, POINTS_PER_BLOCK } from '../src/maps/point-blocks.js';
import { createTestDatabase, type TestDatabase } from './support/test-database.js';
import { CHAIN_6 } from './support/chain-model.js';

/** A 30 × 20 grid whose points are TEST FIXTURES (closed-form numbers, not solver output). */
const sweep: SweepSpec = {
  spec: 'phasewright.sweep/1',
  name: 'migration fixture',
  model: CHAIN_6,
  axes: [
    { parameter: 'V', kind: 'linear', from: 0, to: 4, points: 30 },
    { parameter: 'J', kind: 'linear', from: 0.5, to: 1.5, points: 20 },
  ],
  method: 'meanfield',
  seed: 5,
};
const runtime = { kind: 'node' as const, version: 'test', cores: 1 };
const sha = (t: string) => createHash('sha256').update(t, 'utf8').digest('hex');

function fixtureTexts(): { key: string; text: string; energy: number }[] {
  return planSweep(sweep).items.map((item) => {
    const energy = -3 + 0.25 * item.parameters.V - item.parameters.J;
    const point: MapPoint = {
      parameters: item.parameters,
      level: 0,
      energy,
      observables: { energyPerSite: energy / 6 },
      convergence: { converged: true, iterations: 12, residual: 1e-9 },
      wallMs: 1,
      seed: pointSeed(5, item.key),
      computed: { at: '2025-01-01T00:00:00.000Z', runtime, author: 'fixture' },
      label: { id: 'fixture', confidence: 0, evidence: { fixture: true } },
    };
    return { key: item.key, text: canonicalJson(point), energy };
  });
}

describe('migration 0013: per-point rows move into blocks and back', () => {
  let db: TestDatabase;
  const rows = async <T>(sql: string, replacements: unknown[] = []) => (await db.sequelize.query(sql, { type: QueryTypes.SELECT, replacements })) as T[];

  beforeAll(async () => {
    db = await createTestDatabase({ migrated: false });
  });
  afterAll(async () => {
    await db?.drop();
  });

  it('keeps every key, hash and canonical text; a block carries the largest change number of its points', async () => {
    const migrator = createMigrator(db.sequelize);
    await migrator.up({ to: '0012-uploads' });
    const projectId = randomUUID();
    await db.sequelize.query('INSERT INTO projects (id, name) VALUES (?, ?)', { replacements: [projectId, 'Migration'] });
    await db.sequelize.query('INSERT INTO project_sync_state (project_id, last_seq) VALUES (?, 700)', { replacements: [projectId] });
    const points = fixtureTexts();
    // Two maps: 600 points (3 blocks: 250, 250, 100) and 3 points (1 block); change numbers shuffled over the keys.
    const maps = [
      { id: randomUUID(), points },
      { id: randomUUID(), points: points.slice(0, 3) },
    ];
    let seq = 1;
    const seqOf = new Map<string, number>();
    for (const [m, map] of maps.entries()) {
      await db.sequelize.query(
        "INSERT INTO maps (project_id, id, identity, method, name, sweep, provenance, point_count, points_digest, seq) VALUES (?, ?, ?, 'meanfield', NULL, '{}', '{}', ?, ?, ?)",
        { replacements: [projectId, map.id, String(m).repeat(64), map.points.length, 'd'.repeat(64), seq++] },
      );
      const [{ pk }] = await rows<{ pk: number }>('SELECT pk FROM maps WHERE id = ?', [map.id]);
      for (const p of [...map.points].reverse()) {
        const s = seq++;
        seqOf.set(`${map.id} ${p.key}`, s);
        await db.sequelize.query('INSERT INTO map_points (map_pk, point_key, project_id, seq, hash, energy, label_id, disputed, data) VALUES (?, ?, ?, ?, ?, ?, ?, 0, ?)', {
          replacements: [pk, p.key, projectId, s, sha(p.text), p.energy, 'fixture', p.text],
        });
      }
    }

    expect((await migrator.up()).map((m) => m.name)).toEqual(['0013-map-point-blocks']);
    expect(await rows("SHOW TABLES LIKE 'map_points'")).toEqual([]);
    for (const map of maps) {
      const blocks = await rows<{ b: number; seq: number; n: number; k: string; d: Buffer }>(
        'SELECT b.block_no AS b, b.seq, b.point_count AS n, b.point_keys AS k, b.data AS d FROM map_point_blocks b JOIN maps m ON m.pk = b.map_pk WHERE m.id = ? ORDER BY b.block_no',
        [map.id],
      );
      expect(blocks.map((b) => Number(b.n))).toEqual(map.points.length === 600 ? [POINTS_PER_BLOCK, POINTS_PER_BLOCK, 100] : [3]);
      const entries = blocks.flatMap((b) => decodeBlock(Number(b.b), b.k, b.d).entries);
      const sorted = [...map.points].sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
      expect(entries).toEqual(sorted.map((p) => ({ key: p.key, hash: sha(p.text), text: p.text })));
      for (const b of blocks) {
        const keys = decodeBlock(Number(b.b), b.k).entries.map((e) => e.key);
        expect(Number(b.seq)).toBe(Math.max(...keys.map((k) => seqOf.get(`${map.id} ${k}`) as number)));
      }
    }

    // Down again: one row per point with its own new change number after the project's last one.
    await migrator.down();
    const back = await rows<{ k: string; h: string; d: string; e: number; seq: number }>('SELECT point_key AS k, hash AS h, data AS d, energy AS e, seq FROM map_points');
    expect(back).toHaveLength(603);
    for (const r of back) {
      expect(r.h).toBe(sha(r.d));
      expect(r.e).toBe((JSON.parse(r.d) as MapPoint).energy);
    }
    expect(new Set(back.map((r) => Number(r.seq))).size).toBe(603);
    expect(Math.min(...back.map((r) => Number(r.seq)))).toBe(701);
    const [{ last }] = await rows<{ last: number }>('SELECT last_seq AS last FROM project_sync_state WHERE project_id = ?', [projectId]);
    expect(Number(last)).toBe(700 + 603);
  });
});
