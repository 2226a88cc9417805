// Map points stored in blocks: one row per block of up to 250 points of one map instead of one row
// per point. A row write costs the database far more than its bytes do, so a 10,000-point push
// writes ~40 rows instead of 10,000. A block row holds, in the same order,
//   point_keys: JSON array of [point key, SHA-256 of the point's canonical JSON]
//   data:       the points' canonical JSON texts joined by "\n" (canonical JSON has no raw newline),
//               deflated (raw deflate, zlib level 1): ~10× fewer bytes to write and log
// and one change number `seq` (any point of the block changed → the block is rewritten with a new
// seq; a pull sends whole blocks). Existing points move over here, grouped by key order, each
// block taking the largest seq of its points (a client's cursor stays meaningful).
import { deflateRawSync, inflateRawSync } from 'node:zlib';

const BLOCK = 250;

export async function up({ queryInterface, Sequelize }) {
  await queryInterface.createTable('map_point_blocks', {
    map_pk: { type: Sequelize.BIGINT, primaryKey: true, references: { model: 'maps', key: 'pk' }, onDelete: 'CASCADE' },
    block_no: { type: Sequelize.INTEGER, primaryKey: true },
    project_id: { type: Sequelize.CHAR(36), allowNull: false },
    seq: { type: Sequelize.BIGINT, allowNull: false },
    point_count: { type: Sequelize.INTEGER, allowNull: false },
    point_keys: { type: Sequelize.TEXT('long'), allowNull: false },
    data: { type: Sequelize.BLOB('long'), allowNull: false },
  });
  await queryInterface.addIndex('map_point_blocks', ['project_id', 'seq'], { unique: true, name: 'map_point_blocks_project_seq' });

  const sequelize = queryInterface.sequelize;
  const select = { type: Sequelize.QueryTypes.SELECT };
  const maps = await sequelize.query('SELECT DISTINCT map_pk AS pk FROM map_points', select);
  for (const { pk } of maps) {
    const points = await sequelize.query('SELECT point_key AS k, project_id AS p, seq, hash AS h, data AS d FROM map_points WHERE map_pk = ? ORDER BY point_key', { ...select, replacements: [pk] });
    for (let b = 0; b * BLOCK < points.length; b++) {
      const part = points.slice(b * BLOCK, (b + 1) * BLOCK);
      const seq = part.reduce((m, r) => (BigInt(r.seq) > m ? BigInt(r.seq) : m), 0n);
      await sequelize.query('INSERT INTO map_point_blocks (map_pk, block_no, project_id, seq, point_count, point_keys, data) VALUES (?, ?, ?, ?, ?, ?, ?)', {
        replacements: [pk, b, part[0].p, String(seq), part.length, JSON.stringify(part.map((r) => [r.k, r.h])), deflateRawSync(part.map((r) => r.d).join('\n'), { level: 1 })],
      });
    }
  }
  await queryInterface.dropTable('map_points');
}

export async function down({ queryInterface, Sequelize }) {
  const binary = (n) => `VARCHAR(${n}) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin`;
  await queryInterface.createTable('map_points', {
    map_pk: { type: Sequelize.BIGINT, primaryKey: true, references: { model: 'maps', key: 'pk' }, onDelete: 'CASCADE' },
    point_key: { type: binary(255), primaryKey: true },
    project_id: { type: Sequelize.CHAR(36), allowNull: false },
    seq: { type: Sequelize.BIGINT, allowNull: false },
    hash: { type: Sequelize.CHAR(64), allowNull: false },
    energy: { type: Sequelize.DOUBLE, allowNull: false },
    label_id: { type: Sequelize.STRING(64), allowNull: true },
    disputed: { type: Sequelize.BOOLEAN, allowNull: false, defaultValue: false },
    data: { type: Sequelize.TEXT('long'), allowNull: false },
  });
  await queryInterface.addIndex('map_points', ['project_id', 'seq'], { unique: true, name: 'map_points_project_seq' });

  // One change number per point again: new numbers after each project's last one.
  const sequelize = queryInterface.sequelize;
  const select = { type: Sequelize.QueryTypes.SELECT };
  const blocks = await sequelize.query('SELECT map_pk AS pk, project_id AS p, point_keys AS k, data AS d FROM map_point_blocks ORDER BY project_id, seq', select);
  for (const b of blocks) {
    const keys = JSON.parse(b.k);
    const texts = inflateRawSync(b.d).toString('utf8').split('\n');
    await sequelize.query('INSERT INTO project_sync_state (project_id, last_seq) VALUES (?, 0) ON DUPLICATE KEY UPDATE last_seq = last_seq', { replacements: [b.p] });
    for (let i = 0; i < keys.length; i++) {
      const point = JSON.parse(texts[i]);
      await sequelize.query('UPDATE project_sync_state SET last_seq = last_seq + 1 WHERE project_id = ?', { replacements: [b.p] });
      await sequelize.query(
        'INSERT INTO map_points (map_pk, point_key, project_id, seq, hash, energy, label_id, disputed, data) SELECT ?, ?, ?, last_seq, ?, ?, ?, ?, ? FROM project_sync_state WHERE project_id = ?',
        { replacements: [b.pk, keys[i][0], b.p, keys[i][1], point.energy, point.label?.id ?? null, point.disputed?.length ? 1 : 0, texts[i], b.p] },
      );
    }
  }
  await queryInterface.dropTable('map_point_blocks');
}
