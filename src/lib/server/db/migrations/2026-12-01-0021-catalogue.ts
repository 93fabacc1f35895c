import { DataTypes, type QueryInterface } from 'sequelize';

/** Propulsion catalogue entries per workspace, in SI; names unique within a workspace. */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.createTable('catalogue_entries', {
    id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
    workspace_id: {
      type: DataTypes.UUID,
      allowNull: false,
      references: { model: 'workspaces', key: 'id' },
      onDelete: 'CASCADE'
    },
    name: { type: DataTypes.STRING(120), allowNull: false },
    propellants: { type: DataTypes.STRING(80), allowNull: false },
    isp_sl_s: { type: DataTypes.DOUBLE, allowNull: true },
    isp_vac_s: { type: DataTypes.DOUBLE, allowNull: false },
    thrust_vac_n: { type: DataTypes.DOUBLE, allowNull: false },
    mass_kg: { type: DataTypes.DOUBLE, allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    created_at: { type: DataTypes.DATE, allowNull: false },
    updated_at: { type: DataTypes.DATE, allowNull: false }
  });
  // The collation is case-insensitive, so "K-1" and "k-1" collide, as in the CSV check.
  await qi.addIndex('catalogue_entries', ['workspace_id', 'name'], {
    unique: true,
    name: 'catalogue_entries_workspace_name'
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.dropTable('catalogue_entries');
}
