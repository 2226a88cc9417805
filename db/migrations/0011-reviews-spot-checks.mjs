// Reviews of maps (request → comments → verdict attached to the map identity and point-set digest
// at the time) and stored spot-check reports.
export async function up({ queryInterface, Sequelize }) {
  const now = { type: Sequelize.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') };
  const project = { type: Sequelize.CHAR(36), allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' };
  const map = { type: Sequelize.BIGINT, allowNull: false, references: { model: 'maps', key: 'pk' }, onDelete: 'CASCADE' };
  const user = { type: Sequelize.CHAR(36), allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' };

  await queryInterface.createTable('reviews', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    project_id: project,
    map_pk: map,
    requested_by: user,
    reviewer_id: user,
    message: { type: Sequelize.TEXT, allowNull: false },
    status: { type: Sequelize.ENUM('requested', 'approved', 'changes-requested'), allowNull: false, defaultValue: 'requested' },
    verdict_note: { type: Sequelize.TEXT, allowNull: true },
    verdict_at: { type: Sequelize.DATE(3), allowNull: true },
    map_identity: { type: Sequelize.CHAR(64), allowNull: true },
    points_digest: { type: Sequelize.CHAR(64), allowNull: true },
    point_count: { type: Sequelize.INTEGER, allowNull: true },
    created_at: now,
    updated_at: now,
  });
  await queryInterface.addIndex('reviews', ['project_id', 'map_pk']);

  await queryInterface.createTable('review_comments', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    review_id: { type: Sequelize.CHAR(36), allowNull: false, references: { model: 'reviews', key: 'id' }, onDelete: 'CASCADE' },
    author_id: user,
    point_key: { type: 'VARCHAR(255) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin', allowNull: true },
    body: { type: Sequelize.TEXT, allowNull: false },
    created_at: now,
  });
  await queryInterface.addIndex('review_comments', ['review_id']);

  await queryInterface.createTable('spot_checks', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    project_id: project,
    map_pk: map,
    review_id: { type: Sequelize.CHAR(36), allowNull: true, references: { model: 'reviews', key: 'id' }, onDelete: 'SET NULL' },
    requested_by: user,
    sample: { type: Sequelize.INTEGER, allowNull: false },
    seed: { type: Sequelize.INTEGER.UNSIGNED, allowNull: false },
    pass: { type: Sequelize.BOOLEAN, allowNull: false },
    report: { type: Sequelize.TEXT('long'), allowNull: false },
    created_at: now,
  });
  await queryInterface.addIndex('spot_checks', ['project_id', 'map_pk']);
}

export async function down({ queryInterface }) {
  await queryInterface.dropTable('spot_checks');
  await queryInterface.dropTable('review_comments');
  await queryInterface.dropTable('reviews');
}
