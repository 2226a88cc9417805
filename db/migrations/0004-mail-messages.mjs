// Messages received by the built-in fake SMTP server (development and tests), listed to site
// admins at GET /api/admin/mail so a demo user can open an invitation or reset link.
export async function up({ queryInterface, Sequelize }) {
  await queryInterface.createTable('mail_messages', {
    id: { type: Sequelize.INTEGER, autoIncrement: true, primaryKey: true },
    message_id: { type: Sequelize.STRING(255), allowNull: true },
    mail_from: { type: Sequelize.STRING(320), allowNull: false, defaultValue: '' },
    mail_to: { type: Sequelize.STRING(2000), allowNull: false, defaultValue: '' },
    subject: { type: Sequelize.STRING(998), allowNull: false, defaultValue: '' },
    text: { type: Sequelize.TEXT('medium'), allowNull: false },
    html: { type: Sequelize.TEXT('medium'), allowNull: false },
    links: { type: Sequelize.TEXT, allowNull: false },
    received_at: { type: Sequelize.DATE(3), allowNull: false, defaultValue: Sequelize.literal('CURRENT_TIMESTAMP(3)') },
  });
}

export async function down({ queryInterface }) {
  await queryInterface.dropTable('mail_messages');
}
