// Projects, who belongs to them with which role, and pending invitations (tokens stored hashed).
export async function up({ queryInterface, Sequelize }) {
  const now = { type: Sequelize.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') };
  const role = Sequelize.ENUM('owner', 'editor', 'reviewer', 'viewer');
  await queryInterface.createTable('projects', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    name: { type: Sequelize.STRING(120), allowNull: false },
    description: { type: Sequelize.STRING(2000), allowNull: false, defaultValue: '' },
    archived_at: { type: Sequelize.DATE(3), allowNull: true },
    created_by: { type: Sequelize.CHAR(36), allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: now,
    updated_at: now,
  });

  await queryInterface.createTable('memberships', {
    project_id: { type: Sequelize.CHAR(36), primaryKey: true, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    user_id: { type: Sequelize.CHAR(36), primaryKey: true, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    role: { type: role, allowNull: false },
    created_at: now,
    updated_at: now,
  });
  await queryInterface.addIndex('memberships', ['user_id']);

  await queryInterface.createTable('invitations', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    project_id: { type: Sequelize.CHAR(36), allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    email: { type: Sequelize.STRING(254), allowNull: false },
    role: { type: role, allowNull: false },
    token_hash: { type: Sequelize.CHAR(64), allowNull: false, unique: true },
    invited_by: { type: Sequelize.CHAR(36), allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    expires_at: { type: Sequelize.DATE(3), allowNull: false },
    accepted_at: { type: Sequelize.DATE(3), allowNull: true },
    accepted_by: { type: Sequelize.CHAR(36), allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    revoked_at: { type: Sequelize.DATE(3), allowNull: true },
    created_at: now,
  });
  await queryInterface.addIndex('invitations', ['project_id']);
}

export async function down({ queryInterface }) {
  await queryInterface.dropTable('invitations');
  await queryInterface.dropTable('memberships');
  await queryInterface.dropTable('projects');
}
