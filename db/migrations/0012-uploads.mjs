// Uploaded files of a project (measured data as CSV, custom lattice geometry as JSON), kept in the
// database with their uploader, time, checksum and what the server read from them.
export async function up({ queryInterface, Sequelize }) {
  await queryInterface.createTable('uploads', {
    id: { type: Sequelize.CHAR(36), primaryKey: true },
    project_id: { type: Sequelize.CHAR(36), allowNull: false, references: { model: 'projects', key: 'id' }, onDelete: 'CASCADE' },
    kind: { type: Sequelize.ENUM('measurements', 'lattice'), allowNull: false },
    file_name: { type: Sequelize.STRING(255), allowNull: false },
    content_type: { type: Sequelize.STRING(100), allowNull: false },
    size: { type: Sequelize.INTEGER, allowNull: false },
    sha256: { type: Sequelize.CHAR(64), allowNull: false },
    content: { type: Sequelize.BLOB('long'), allowNull: false },
    summary: { type: Sequelize.TEXT('long'), allowNull: false },
    map_id: { type: Sequelize.CHAR(36), allowNull: true },
    uploaded_by: { type: Sequelize.CHAR(36), allowNull: true, references: { model: 'users', key: 'id' }, onDelete: 'SET NULL' },
    created_at: { type: Sequelize.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') },
  });
  await queryInterface.addIndex('uploads', ['project_id', 'created_at']);
}

export async function down({ queryInterface }) {
  await queryInterface.dropTable('uploads');
}
