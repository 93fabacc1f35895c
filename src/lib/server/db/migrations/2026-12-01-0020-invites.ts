import { DataTypes, type QueryInterface } from 'sequelize';

/** Workspace invitations (token stored hashed). */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('invites', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    workspace_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'workspaces', key: 'id' },
      onDelete: 'CASCADE'
    },
    email: { type: DataTypes.STRING(254), allowNull: false },
    role: { type: DataTypes.ENUM('viewer', 'engineer', 'admin'), allowNull: false },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    invited_by: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL'
    },
    expires_at: { type: DataTypes.DATE, allowNull: false },
    accepted_at: { type: DataTypes.DATE, allowNull: true },
    accepted_by: {
      type: DataTypes.UUID,
      allowNull: true,
      references: { model: 'users', key: 'id' },
      onDelete: 'SET NULL'
    },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false }
  });
  await qi.addIndex('invites', ['workspace_id', 'email'], { name: 'invites_workspace_email' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('invites');
}
