import { DataTypes, type QueryInterface } from 'sequelize';

/**
 * The display units of a shared report ('si' | 'us'), chosen when the link is created, so a
 * signed-out reader sees the report as the engineer meant it. Links made before this column
 * existed open in SI, as they always did.
 */
export async function up({ context: qi }: { context: QueryInterface }) {
  await qi.addColumn('share_links', 'units', {
    type: DataTypes.ENUM('si', 'us'),
    allowNull: false,
    defaultValue: 'si'
  });
}

export async function down({ context: qi }: { context: QueryInterface }) {
  await qi.removeColumn('share_links', 'units');
}
