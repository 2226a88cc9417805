// Map sync: a per-project change sequence, recorded push batches (idempotent replays), human-edited
// records with revisions (models, sweeps, label annotations, notes), maps (one metadata row each)
// and their points (one row per point, keyed by map and point key, for bulk writes and paged pulls).
// Every row that a pull returns carries `seq`, the project's change number of its last write.
export async function up({ queryInterface, Sequelize }) {
  const now = { type: Sequelize.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') };
  const project = { type: Sequelize.CHAR(36), allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' };
  const user = { type: Sequelize.CHAR(36), allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' };
  // Point keys and ids compare byte for byte ("J=1" and "j=1" are different parameters).
  const binary = (n) => `VARCHAR(${n}) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin`;

  await queryInterface.createTable('project_sync_state', {
    project_id: { ...project, primaryKey: true },
    last_seq: { type: Sequelize.BIGINT, allowNull: false, defaultValue: 0 },
  });

  await queryInterface.createTable('sync_batches', {
    project_id: { ...project, primaryKey: true },
    batch_id: { type: Sequelize.CHAR(36), primaryKey: true },
    user_id: user,
    response: { type: Sequelize.TEXT('long'), allowNull: false },
    created_at: now,
  });

  await queryInterface.createTable('sync_records', {
    project_id: { ...project, primaryKey: true },
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    kind: { type: Sequelize.ENUM('model', 'sweep', 'annotation', 'note'), allowNull: false },
    revision: { type: Sequelize.INTEGER, allowNull: false },
    seq: { type: Sequelize.BIGINT, allowNull: false },
    data: { type: Sequelize.TEXT('long'), allowNull: false },
    updated_by: user,
    created_at: now,
    updated_at: now,
  });
  await queryInterface.addIndex('sync_records', ['project_id', 'seq'], { unique: true, name: 'sync_records_project_seq' });

  await queryInterface.createTable('maps', {
    pk: { type: Sequelize.BIGINT, primaryKey: true, autoIncrement: true },
    project_id: project,
    id: { type: Sequelize.CHAR(36), allowNull: false },
    identity: { type: Sequelize.CHAR(64), allowNull: false },
    method: { type: Sequelize.ENUM('ed', 'meanfield'), allowNull: false },
    name: { type: Sequelize.STRING(200), allowNull: true },
    sweep: { type: Sequelize.TEXT('long'), allowNull: false },
    provenance: { type: Sequelize.TEXT('long'), allowNull: false },
    point_count: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
    points_digest: { type: Sequelize.CHAR(64), allowNull: false },
    seq: { type: Sequelize.BIGINT, allowNull: false },
    created_by: user,
    updated_by: user,
    created_at: now,
    updated_at: now,
  });
  await queryInterface.addIndex('maps', ['project_id', 'id'], { unique: true, name: 'maps_project_id' });
  await queryInterface.addIndex('maps', ['project_id', 'identity'], { unique: true, name: 'maps_project_identity' });
  await queryInterface.addIndex('maps', ['project_id', 'seq'], { unique: true, name: 'maps_project_seq' });

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
}

export async function down({ queryInterface }) {
  await queryInterface.dropTable('map_points');
  await queryInterface.dropTable('maps');
  await queryInterface.dropTable('sync_records');
  await queryInterface.dropTable('sync_batches');
  await queryInterface.dropTable('project_sync_state');
}
