import { DataTypes, type QueryInterface } from 'sequelize';

/** Users, workspaces, memberships (role per workspace) and sign-in sessions. */
export async function up({ context: qi }: { context: QueryInterface }) {
  const ts = {
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false }
  };
  await qi.createTable('users', {
    id: { type: DataTypes.UUID, primaryKey: true },
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    display_name: { type: DataTypes.STRING(120), allowNull: false },
    password_hash: { type: DataTypes.STRING(255), allowNull: true },
    units: { type: DataTypes.ENUM('si', 'us'), allowNull: false, defaultValue: 'si' },
    ...ts
  });
  await qi.createTable('workspaces', {
    id: { type: DataTypes.UUID, primaryKey: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    slug: { type: DataTypes.STRING(64), allowNull: false, unique: true },
    description: { type: DataTypes.TEXT, allowNull: false },
    ...ts
  });
  await qi.createTable('memberships', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    user_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'users', key: 'id' },
      onDelete: 'CASCADE'
    },
    workspace_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'workspaces', key: 'id' },
      onDelete: 'CASCADE'
    },
    role: { type: DataTypes.ENUM('viewer', 'engineer', 'admin'), allowNull: false },
    ...ts
  });
  await qi.addIndex('memberships', ['user_id', 'workspace_id'], {
    unique: true,
    name: 'memberships_user_workspace'
  });
  await qi.addIndex('memberships', ['workspace_id'], { name: 'memberships_workspace' });
  await qi.createTable('sessions', {
    id: { type: DataTypes.STRING(64), primaryKey: true },
    user_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'users', key: 'id' },
      onDelete: 'CASCADE'
    },
    expires_at: { type: DataTypes.DATE, allowNull: false }
  });
  await qi.addIndex('sessions', ['user_id'], { name: 'sessions_user' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('sessions');
  await qi.dropTable('memberships');
  await qi.dropTable('workspaces');
  await qi.dropTable('users');
}
