import { DataTypes, type QueryInterface } from 'sequelize';

/** Personal API tokens (hashed). */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('api_tokens', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    user_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'users', key: 'id' },
      onDelete: 'CASCADE'
    },
    name: { type: DataTypes.STRING(80), allowNull: false },
    token_hash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
    prefix: { type: DataTypes.STRING(16), allowNull: false },
    last_used_at: { type: DataTypes.DATE, allowNull: true },
    expires_at: { type: DataTypes.DATE, allowNull: true },
    revoked_at: { type: DataTypes.DATE, allowNull: true },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false }
  });
  await qi.addIndex('api_tokens', ['user_id'], { name: 'api_tokens_user' });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('api_tokens');
}
