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

/**
 * Tolerates a table without the column: the test databases are shared by checkouts whose
 * migration lists differ, and a reset from a checkout that does not know this migration
 * recreates share_links without `units` while its ledger row stays behind.
 */
export async function down({ context: qi }: { context: QueryInterface }) {
  if ('units' in (await qi.describeTable('share_links'))) await qi.removeColumn('share_links', 'units');
}
