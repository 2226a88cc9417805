// Accounts and sign-in: users, rotating refresh tokens (stored as SHA-256 hashes, grouped in
// families so that reuse of a rotated token revokes the whole family) and password-reset tokens.
export async function up({ queryInterface, Sequelize }) {
  const now = { type: Sequelize.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') };
  await queryInterface.createTable('users', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    email: { type: Sequelize.STRING(254), allowNull: false, unique: true },
    display_name: { type: Sequelize.STRING(100), allowNull: false },
    // scrypt$<log2 N>$<r>$<p>$<salt base64>$<hash base64> (see sync-server/src/auth/password-hasher.ts)
    password_hash: { type: Sequelize.STRING(255), allowNull: false },
    site_role: { type: Sequelize.ENUM('admin', 'member'), allowNull: false, defaultValue: 'member' },
    // Bumped on password change/reset: access tokens carry it, so older ones stop working at once.
    token_version: { type: Sequelize.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: now,
    updated_at: now,
  });

  await queryInterface.createTable('refresh_tokens', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    user_id: { type: Sequelize.CHAR(36), allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    family_id: { type: Sequelize.CHAR(36), allowNull: false },
    token_hash: { type: Sequelize.CHAR(64), allowNull: false, unique: true },
    expires_at: { type: Sequelize.DATE(3), allowNull: false },
    used_at: { type: Sequelize.DATE(3), allowNull: true },
    revoked_at: { type: Sequelize.DATE(3), allowNull: true },
    created_at: now,
  });
  await queryInterface.addIndex('refresh_tokens', ['family_id']);
  await queryInterface.addIndex('refresh_tokens', ['user_id']);

  await queryInterface.createTable('password_resets', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    user_id: { type: Sequelize.CHAR(36), allowNull: false, references: { model: 'users', key: 'id' }, onDelete: 'CASCADE' },
    token_hash: { type: Sequelize.CHAR(64), allowNull: false, unique: true },
    expires_at: { type: Sequelize.DATE(3), allowNull: false },
    used_at: { type: Sequelize.DATE(3), allowNull: true },
    created_at: now,
  });
}

export async function down({ queryInterface }) {
  await queryInterface.dropTable('password_resets');
  await queryInterface.dropTable('refresh_tokens');
  await queryInterface.dropTable('users');
}
