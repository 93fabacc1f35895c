import { DataTypes, type QueryInterface } from 'sequelize';

/** The local fake SMTP server's mailbox, read by admins on the outbox page. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('mail_messages', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    mail_from: { type: DataTypes.STRING(320), allowNull: false },
    rcpt_to: { type: DataTypes.STRING(2000), allowNull: false },
    subject: { type: DataTypes.STRING(500), allowNull: false },
    raw: { type: DataTypes.TEXT('medium'), allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false }
  });
  await qi.addIndex('mail_messages', ['created_at'], { name: 'mail_messages_created' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('mail_messages');
}
