// Facts about the database itself: which schema generation it holds and when it was made.
// GET /api/health reads `schema` from here, so a health report of "up" proves the server reads
// a migrated Phasewright database, not just any server that answers.
export async function up({ queryInterface, Sequelize }) {
  await queryInterface.createTable('schema_info', {
    name: { type: Sequelize.STRING(64), primaryKey: true },
    value: { type: Sequelize.STRING(255), allowNull: false },
    updated_at: { type: Sequelize.DATE, allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP') },
  });
  await queryInterface.bulkInsert('schema_info', [
    { name: 'schema', value: 'phasewright/1' },
    { name: 'created', value: new Date().toISOString() },
  ]);
}

export async function down({ queryInterface }) {
  await queryInterface.dropTable('schema_info');
}
